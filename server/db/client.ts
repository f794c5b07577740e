import { drizzle, type NodePgDatabase } from 'drizzle-orm/node-postgres';
import pg from 'pg';
import * as schema from './schema/index.ts';

export type Db = NodePgDatabase<typeof schema>;
/** A transaction handle or the database itself: queries take either. */
export type Tx = Parameters<Parameters<Db['transaction']>[0]>[0] | Db;

export interface Database {
  pool: pg.Pool;
  db: Db;
  close(): Promise<void>;
}

/** The pg pool and the drizzle instance over it (with the full schema, which better-auth's adapter reads). */
export function createDatabase(url: string, options: { max?: number } = {}): Database {
  const pool = new pg.Pool({ connectionString: url, max: options.max ?? 10 });
  // An idle client that loses its server (a restart) emits 'error'; without a listener Node would exit.
  pool.on('error', () => {});
  const db = drizzle(pool, { schema });
  return { pool, db, close: () => pool.end() };
}
