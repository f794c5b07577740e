import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vitest/config';

const alias = { '@': fileURLToPath(new URL('./src', import.meta.url)) };

// One project per environment: pure code in Node, client code in jsdom with fake IndexedDB,
// integration against the real PostgreSQL (DATABASE_URL, set by scripts/test.mjs).
export default defineConfig({
  resolve: { alias },
  test: {
    projects: [
      { resolve: { alias }, test: { name: 'unit', include: ['tests/unit/**/*.test.ts'], environment: 'node', setupFiles: ['tests/setup/console.ts'] } },
      { resolve: { alias }, test: { name: 'client', include: ['tests/client/**/*.test.{ts,tsx}'], environment: 'jsdom', setupFiles: ['tests/setup/console.ts', 'tests/setup/client.ts'] } },
      { resolve: { alias }, test: { name: 'integration', include: ['tests/integration/**/*.test.ts'], environment: 'node', setupFiles: ['tests/setup/console.ts'], testTimeout: 30_000, hookTimeout: 60_000 } },
    ],
  },
});
