import { fileURLToPath } from 'node:url';
import tailwindcss from '@tailwindcss/vite';
import react from '@vitejs/plugin-react';
import { defineConfig } from 'vite';
import { VitePWA } from 'vite-plugin-pwa';

/** Where the Express server listens in development (server/config.ts PORT default). */
const apiTarget = process.env.LEDGERLINE_API_URL ?? 'http://127.0.0.1:4410';

// Colours of the mark and the light theme (src/styles.css --color-ink and --color-paper).
const ink = '#16324f';
const paper = '#f7f3ea';

export default defineConfig({
  resolve: { alias: { '@': fileURLToPath(new URL('./src', import.meta.url)) } },
  build: { target: 'es2022' },
  server: {
    port: 5173,
    strictPort: true,
    proxy: {
      '/api': { target: apiTarget, changeOrigin: false },
      '/socket.io': { target: apiTarget, ws: true, changeOrigin: false },
    },
  },
  plugins: [
    react(),
    tailwindcss(),
    VitePWA({
      registerType: 'autoUpdate',
      injectRegister: 'auto',
      includeAssets: ['favicon.svg', 'apple-touch-icon.png'],
      manifest: {
        name: 'Ledgerline',
        short_name: 'Ledgerline',
        description: 'The timed record of a therapeutic endoscopy case, kept on the tablet in the room.',
        theme_color: ink,
        background_color: paper,
        display: 'standalone',
        orientation: 'any',
        start_url: '/',
        scope: '/',
        icons: [
          { src: '/pwa-192.png', sizes: '192x192', type: 'image/png', purpose: 'any' },
          { src: '/pwa-512.png', sizes: '512x512', type: 'image/png', purpose: 'any' },
          { src: '/pwa-maskable-512.png', sizes: '512x512', type: 'image/png', purpose: 'maskable' },
        ],
      },
      workbox: {
        // woff2 so the shipped fonts are there with no network.
        globPatterns: ['**/*.{js,css,html,svg,png,woff2}'],
        navigateFallback: 'index.html',
        navigateFallbackDenylist: [/^\/api\//, /^\/socket\.io\//],
        cleanupOutdatedCaches: true,
        runtimeCaching: [
          {
            // The last answer is kept so the open case, the day and the catalogue read offline after one visit.
            // Workbox serialises this function into sw.js: it may use nothing from this file's scope.
            // The cache name is cleared at sign-out (src/lib/offline-cache.ts).
            urlPattern: ({ url, sameOrigin }) => sameOrigin && /^\/api\/(me|rooms|members|cases|catalogue)(\/|$)/.test(url.pathname),
            handler: 'NetworkFirst',
            method: 'GET',
            options: {
              cacheName: 'ledgerline-api',
              networkTimeoutSeconds: 4,
              expiration: { maxEntries: 200, maxAgeSeconds: 7 * 24 * 60 * 60 },
              cacheableResponse: { statuses: [200] },
            },
          },
        ],
      },
    }),
  ],
});
