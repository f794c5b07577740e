import pg from 'pg';
import { migrateDatabase } from '#server/db/migrate.ts';

/**
 * The integration database: DATABASE_URL (npm test sets it to the test cluster), else the test cluster's
 * `ledgerline_test`. Created when missing and migrated once per run: test files run in parallel workers,
 * so an advisory lock lets one migrate while the others wait, then find nothing left to apply.
 */
export const testDatabaseUrl = process.env.DATABASE_URL ?? 'postgres://postgres@127.0.0.1:54339/ledgerline_test';

const MIGRATION_LOCK = 7_462_001;
let ready: Promise<string> | null = null;

async function createIfMissing(url: string): Promise<void> {
  const target = new URL(url);
  const name = decodeURIComponent(target.pathname.slice(1));
  const admin = new URL(url);
  admin.pathname = '/postgres';
  const client = new pg.Client({ connectionString: admin.href });
  await client.connect();
  try {
    const { rowCount } = await client.query('select 1 from pg_database where datname = $1', [name]);
    if (!rowCount) {
      // 42P04 duplicate_database, 23505 unique_violation: another worker made it first.
      await client.query(`create database "${name.replace(/"/g, '""')}"`).catch((e: { code?: string }) => {
        if (e.code !== '42P04' && e.code !== '23505') throw e;
      });
    }
  } finally {
    await client.end();
  }
}

export async function migrateWithLock(url: string): Promise<void> {
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  try {
    await client.query('select pg_advisory_lock($1)', [MIGRATION_LOCK]);
    await migrateDatabase(url);
  } finally {
    await client.query('select pg_advisory_unlock($1)', [MIGRATION_LOCK]).catch(() => {});
    await client.end();
  }
}

/** The database URL, created and migrated (once per worker). */
export function migratedDatabase(url = testDatabaseUrl): Promise<string> {
  ready ??= (async () => { await createIfMissing(url); await migrateWithLock(url); return url; })();
  return ready;
}

/** A fresh, empty, migrated database beside the test one (for the seed); drop it with the returned function. */
export async function freshDatabase(suffix: string): Promise<{ url: string; drop(): Promise<void> }> {
  const url = new URL(testDatabaseUrl);
  const name = `${decodeURIComponent(url.pathname.slice(1))}_${suffix}_${Date.now().toString(36)}`;
  url.pathname = `/${name}`;
  await createIfMissing(url.href);
  await migrateDatabase(url.href);
  return {
    url: url.href,
    drop: async () => {
      const admin = new URL(testDatabaseUrl);
      admin.pathname = '/postgres';
      const client = new pg.Client({ connectionString: admin.href });
      await client.connect();
      try { await client.query(`drop database if exists "${name}" with (force)`); } finally { await client.end(); }
    },
  };
}
