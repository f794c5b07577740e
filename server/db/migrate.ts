import { fileURLToPath } from 'node:url';
import { migrate } from 'drizzle-orm/node-postgres/migrator';
import { loadConfig } from '../config.ts';
import { createDatabase } from './client.ts';

export const migrationsFolder = fileURLToPath(new URL('../../drizzle', import.meta.url));

/** Apply every migration in drizzle/ not yet applied (drizzle's journal table keeps track). */
export async function migrateDatabase(url: string): Promise<void> {
  const database = createDatabase(url, { max: 1 });
  try {
    await migrate(database.db, { migrationsFolder });
  } finally {
    await database.close();
  }
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  migrateDatabase(loadConfig().DATABASE_URL).then(
    () => console.log('Migrations applied'),
    (error: unknown) => { console.error(error); process.exitCode = 1; },
  );
}
