import { mkdirSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { ESLint } from 'eslint';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

// Runs the project's own eslint.config.js on code held in memory, as if it lived at the given path.
const root = fileURLToPath(new URL('../..', import.meta.url));
const eslint = new ESLint({ cwd: root });
const boundaryRules = new Set([
  'no-restricted-imports', 'no-restricted-globals', 'import-x/no-restricted-paths', 'import-x/no-nodejs-modules', 'import-x/no-cycle',
]);

async function lint(path: string, code: string) {
  const [result] = await eslint.lintText(code, { filePath: join(root, path) });
  return result?.messages ?? [];
}
const boundaryRulesHit = async (path: string, code: string) =>
  (await lint(path, code)).filter((m) => boundaryRules.has(m.ruleId ?? '')).map((m) => m.ruleId);

const inShared = 'shared/domain/lint-probe.ts';
const inClient = 'src/features/lint-probe.ts';

describe('the lint boundaries', { timeout: 60_000 }, () => {
  it.each([
    ['a node: built-in', "import { readFileSync } from 'node:fs';\nexport const r = readFileSync;"],
    ['a built-in without the node: prefix', "import path from 'path';\nexport const p = path;"],
    ['the PostgreSQL driver', "import pg from 'pg';\nexport const p = pg;"],
    ['drizzle-orm', "import { eq } from 'drizzle-orm';\nexport const e = eq;"],
    ['a drizzle-orm subpath', "import { pgTable } from 'drizzle-orm/pg-core';\nexport const t = pgTable;"],
    ['express', "import express from 'express';\nexport const e = express;"],
    ['the Socket.IO server', "import { Server } from 'socket.io';\nexport const s = Server;"],
    ['react', "import { useState } from 'react';\nexport const u = useState;"],
    ['react-dom', "import { createRoot } from 'react-dom/client';\nexport const c = createRoot;"],
    ['idb-keyval', "import { get } from 'idb-keyval';\nexport const g = get;"],
    ['a Vite virtual (browser) module', "import { registerSW } from 'virtual:pwa-register';\nexport const r = registerSW;"],
    ['server code by a relative path', "import { loadConfig } from '../../server/config.ts';\nexport const l = loadConfig;"],
    ['server code by its #server alias', "import { loadConfig } from '#server/config.ts';\nexport const l = loadConfig;"],
    ['client code by its @ alias', "import { thing } from '@/lib/api.ts';\nexport const t = thing;"],
    ['client code by a relative path', "import { thing } from '../../src/lib/api.ts';\nexport const t = thing;"],
    ['the DOM window global', 'export const width = window.innerWidth;'],
  ])('refuses %s in shared/', async (_what, code) => {
    expect(await boundaryRulesHit(inShared, code)).not.toEqual([]);
  });

  it('names the resolved boundary when shared/ reaches into server/ by a relative path', async () => {
    const rules = await boundaryRulesHit(inShared, "import { loadConfig } from '../../server/config.ts';\nexport const l = loadConfig;");
    expect(rules).toContain('import-x/no-restricted-paths');
  });

  it.each([
    ['a relative path', "import { loadConfig } from '../../server/config.ts';\nexport const l = loadConfig;"],
    ['the #server alias', "import { loadConfig } from '#server/config.ts';\nexport const l = loadConfig;"],
  ])('refuses server code in src/ by %s', async (_what, code) => {
    expect(await boundaryRulesHit(inClient, code)).not.toEqual([]);
  });

  it('lets shared/ import zod and its own modules', async () => {
    const code = "import { z } from 'zod';\nimport { uuidSchema } from '../schemas/common.ts';\nexport const id = z.object({ id: uuidSchema });";
    expect(await lint(inShared, code)).toEqual([]);
  });

  it('lets src/ import shared/ and the server import Node and the database', async () => {
    expect(await lint(inClient, "import { uuidSchema } from '#shared/schemas/common.ts';\nexport const u = uuidSchema;")).toEqual([]);
    expect(await lint('server/lint-probe.ts', "import pg from 'pg';\nimport { readFileSync } from 'node:fs';\nexport const x = [pg, readFileSync];")).toEqual([]);
  });

  describe('import cycles', () => {
    // Two real files that import each other: the cycle rule follows imports on disk.
    const dir = join(root, 'tests', 'unit', `lint-cycle-probe-${process.pid}`);
    beforeAll(() => {
      mkdirSync(dir, { recursive: true });
      writeFileSync(join(dir, 'a.ts'), "import { b } from './b.ts';\nexport const a = (): number => b() + 1;\n");
      writeFileSync(join(dir, 'b.ts'), "import { a } from './a.ts';\nexport const b = (): number => (a ? 1 : 0);\n");
    });
    afterAll(() => rmSync(dir, { recursive: true, force: true }));

    it('reports two modules that import each other', async () => {
      const [result] = await eslint.lintFiles([join(dir, 'a.ts')]);
      expect(result?.messages.map((m) => m.ruleId)).toContain('import-x/no-cycle');
    });
  });
});
