import { defineConfig } from '@playwright/test';
import { e2eDatabase, serverEnv, testPorts } from './scripts/lib/ports.mjs';

// Browser tests in Debian's Chromium (no downloaded browser) against a server of their own on 4411,
// with the e2e database (migrated and seeded by scripts/test.mjs) and the test fakes.
const baseURL = `http://localhost:${testPorts.app}`;
// scripts/test.mjs passes the project's generated secret; a run started by hand gets a test-only one.
const secret = process.env.BETTER_AUTH_SECRET ?? 'browser-tests-only-secret-never-used-in-production';

export default defineConfig({
  testDir: 'e2e',
  testMatch: '**/*.spec.ts',
  // Artefacts (traces, screenshots) in a folder of their own: Playwright empties it at each run,
  // and test-results/ also holds vitest's report.
  outputDir: 'test-results/playwright',
  fullyParallel: false,
  // One worker: the tests share one seeded database and two cores.
  workers: 1,
  retries: 0,
  forbidOnly: !!process.env.CI,
  timeout: 30_000,
  expect: { timeout: 7_000 },
  globalTimeout: 10 * 60_000,
  reporter: [['list'], ['json', { outputFile: 'test-results/playwright.json' }]],
  use: {
    baseURL,
    browserName: 'chromium',
    // A tablet in landscape, used by touch.
    viewport: { width: 1180, height: 820 },
    hasTouch: true,
    serviceWorkers: 'allow',
    trace: 'retain-on-failure',
    screenshot: 'only-on-failure',
    launchOptions: {
      executablePath: '/usr/bin/chromium',
      args: [
        '--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run',
        '--disable-background-networking', '--disable-component-update', '--disable-sync',
      ],
    },
  },
  webServer: {
    command: 'node --import tsx server/index.ts',
    url: `http://127.0.0.1:${testPorts.app}/`,
    env: { ...serverEnv({ ports: testPorts, database: e2eDatabase, secret, nodeEnv: 'test' }), LOG_LEVEL: 'warn' },
    reuseExistingServer: false,
    timeout: 90_000,
    stdout: 'ignore',
    stderr: 'pipe',
  },
});
