// Lint: the recommended rules of ESLint and typescript-eslint, plus the boundaries between the three
// code areas, said in lint rather than only in prose: shared/ is isomorphic (no client, server, Node,
// database or DOM modules), src/ never imports server/, and no import cycles anywhere.
// tests/unit/lint-boundaries.test.ts checks each boundary rule.
import { fileURLToPath } from 'node:url';
import js from '@eslint/js';
import { defineConfig } from 'eslint/config';
import { createTypeScriptImportResolver } from 'eslint-import-resolver-typescript';
import { createNodeResolver, importX } from 'eslint-plugin-import-x';
import globals from 'globals';
import tseslint from 'typescript-eslint';

const root = fileURLToPath(new URL('.', import.meta.url));

const serverOnly = 'is server-only; shared/ runs in the browser too';
const browserOnly = 'is browser-only; shared/ runs on the server too';
/** Modules shared/ may not import, with the reason shown to whoever tries. */
const sharedForbidden = [
  ...['pg', 'drizzle-orm', 'express', 'socket.io', 'better-auth', 'nodemailer', 'pino', 'pino-http', 'helmet',
    'express-rate-limit', 'pdfkit', 'bwip-js', 'tsx'].map((name) => ({ name, message: `${name} ${serverOnly}.` })),
  ...['react', 'react-dom', 'idb-keyval', 'react-router', 'react-router-dom', '@tanstack/react-query', 'react-hook-form',
    'recharts', 'socket.io-client'].map((name) => ({ name, message: `${name} ${browserOnly}.` })),
];
const sharedForbiddenPatterns = [
  { group: ['drizzle-orm/*', 'pg-*', '@socket.io/*', '@aws-sdk/*', 'better-auth/*', 'express/*'], message: `This module ${serverOnly}.` },
  { group: ['react/*', 'react-dom/*', 'virtual:*', 'workbox-*', '@testing-library/*', 'fake-indexeddb', 'fake-indexeddb/*'], message: `This module ${browserOnly}.` },
  { group: ['@/*', '#server/*'], message: 'shared/ may not import client (src/) or server (server/) code.' },
  // Relative paths that climb out of shared/ into src/ or server/ (caught also after resolution, below).
  { regex: '^(\\.\\./)+(src|server)(/|$)', message: 'shared/ may not import client (src/) or server (server/) code.' },
];

export default defineConfig(
  { ignores: ['dist/', 'dev-dist/', 'node_modules/', '.data/', 'drizzle/', 'test-results/', 'playwright-report/', 'coverage/'] },
  js.configs.recommended,
  tseslint.configs.recommended,
  {
    plugins: { 'import-x': importX },
    languageOptions: { ecmaVersion: 2023, sourceType: 'module', globals: { ...globals.node } },
    settings: {
      // Which files the import rules follow and parse (the plugin's TypeScript preset, with our resolvers).
      'import-x/extensions': ['.ts', '.tsx', '.cts', '.mts', '.js', '.jsx', '.cjs', '.mjs'],
      'import-x/external-module-folders': ['node_modules', 'node_modules/@types'],
      'import-x/parsers': { '@typescript-eslint/parser': ['.ts', '.tsx', '.cts', '.mts'] },
      'import-x/resolver-next': [
        createTypeScriptImportResolver({ project: `${root}tsconfig.json`, alwaysTryTypes: true }),
        createNodeResolver(),
      ],
    },
    rules: {
      'import-x/no-cycle': ['error', { ignoreExternal: true }],
      'import-x/no-restricted-paths': ['error', {
        basePath: root,
        zones: [
          { target: './shared', from: ['./src', './server'], message: 'shared/ is isomorphic: it may not import client (src/) or server (server/) code.' },
          { target: './src', from: './server', message: 'The client never imports server code; put what both need in shared/.' },
        ],
      }],
      // Modest on style: unused names may start with _, caught errors may go unnamed or unused.
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_', caughtErrors: 'none' }],
      '@typescript-eslint/no-unused-expressions': ['error', { allowShortCircuit: true, allowTernary: true }],
      // Flags `let x = default; try { x = … } catch {}`, a plain and readable pattern.
      'no-useless-assignment': 'off',
      // Barcode parsing (GS1, HIBCC) matches the ASCII group separator, a control character, on purpose.
      'no-control-regex': 'off',
    },
  },
  {
    files: ['src/**', 'public/**/*.js'],
    languageOptions: { globals: { ...globals.browser } },
    rules: {
      'no-restricted-imports': ['error', {
        patterns: [{ group: ['#server/*'], message: 'The client never imports server code; put what both need in shared/.' },
          { regex: '^(\\.\\./)+server(/|$)', message: 'The client never imports server code; put what both need in shared/.' }],
      }],
    },
  },
  {
    // Benchmarks drive a browser: the functions they pass to page.evaluate() run in the page.
    files: ['scripts/bench/**'],
    languageOptions: { globals: { ...globals.node, ...globals.browser } },
  },
  {
    files: ['shared/**'],
    languageOptions: { globals: { ...globals.es2023 } },
    rules: {
      'import-x/no-nodejs-modules': 'error',
      'no-restricted-imports': ['error', { paths: sharedForbidden, patterns: sharedForbiddenPatterns }],
      'no-restricted-globals': ['error',
        ...['window', 'document', 'localStorage', 'sessionStorage', 'indexedDB', 'process', 'Buffer', '__dirname', 'require']
          .map((name) => ({ name, message: `${name} exists only in the browser or only in Node; shared/ runs in both.` }))],
    },
  },
);
