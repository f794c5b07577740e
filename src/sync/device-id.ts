import { v7 as uuidv7 } from 'uuid';
import type { SyncStorage } from './storage.ts';

/**
 * A stable id for this tablet (browser profile), made once and kept in IndexedDB: every event names the
 * device it was tapped on, which near-duplicate detection and the audit rely on. Clearing the site's
 * data makes a new one, which is right: the old outbox went with it.
 */
export async function loadDeviceId(storage: SyncStorage): Promise<string> {
  const known = await storage.getMeta<string>('deviceId');
  if (typeof known === 'string' && known.length > 0) return known;
  const id = `tablet-${uuidv7()}`;
  await storage.setMeta('deviceId', id);
  return id;
}
