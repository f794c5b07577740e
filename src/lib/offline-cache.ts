/**
 * The service worker keeps recent API answers (cases, members, the catalogue) in this Cache Storage
 * cache so screens read offline (vite.config.ts, runtimeCaching). They hold patient data, so sign-out
 * deletes them.
 */
export const API_CACHE_NAME = 'ledgerline-api';

export async function clearApiCache(): Promise<void> {
  if (typeof caches === 'undefined') return;
  await caches.delete(API_CACHE_NAME);
}
