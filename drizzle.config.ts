import { defineConfig } from 'drizzle-kit';

// `npx drizzle-kit generate` writes SQL migrations to drizzle/ from server/db/schema/; hand-written SQL
// goes only through `npx drizzle-kit generate --custom --name <name>`.
export default defineConfig({
  dialect: 'postgresql',
  schema: './server/db/schema/index.ts',
  out: './drizzle',
  dbCredentials: { url: process.env.DATABASE_URL ?? 'postgres://postgres@127.0.0.1:54329/ledgerline' },
  strict: true,
  verbose: true,
});
