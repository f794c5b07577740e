// The one place that names the local ports, folders and databases of `npm start`, `npm run dev` and
// `npm test`. Everything listens on loopback only. playwright.config.ts and e2e/fixtures.ts read the
// test half from here too, so a port is changed in one place.
import { join } from 'node:path';

/** @typedef {{ app: number, pg: number, smtp: number, mailWeb: number, s3: number, vite?: number }} Ports */

/** Local run (`npm start`, `npm run dev`). */
export const devPorts = { app: 4410, pg: 54329, smtp: 2525, mailWeb: 2580, s3: 4569, vite: 5173 };
/** Test run (`npm test`): other ports, so a running `npm start` and a test run never meet. */
export const testPorts = { app: 4411, pg: 54339, smtp: 2526, mailWeb: 2581, s3: 4570 };

export const S3_BUCKET = 'ledgerline';
/** s3rver's built-in account (it checks the key, not the signature). */
export const S3_KEY = 'S3RVER';

export const devDatabase = 'ledgerline';
export const integrationDatabase = 'ledgerline_test';
export const e2eDatabase = 'ledgerline_e2e';

/** Folders under the git-ignored data folder `.data/`. */
export function dataDirs(root) {
  const data = join(root, '.data');
  return {
    data,
    pg: join(data, 'pg'),
    pgTest: join(data, 'pg-test'),
    mail: join(data, 'mail'),
    s3: join(data, 's3'),
    testMail: join(data, 'test-mail'),
    testS3: join(data, 'test-s3'),
    authSecret: join(data, 'auth-secret'),
    installStamp: join(data, 'install-stamp'),
    buildStamp: join(data, 'build-stamp'),
  };
}

export const databaseUrl = (port, database) => `postgres://postgres@127.0.0.1:${port}/${database}`;

/**
 * The server's environment (see server/config.ts) for a set of ports.
 * `origin` is what the browser uses: the server itself, or Vite's dev server in `npm run dev`.
 */
export function serverEnv({ ports, database, secret, origin = `http://localhost:${ports.app}`, nodeEnv = 'development' }) {
  return {
    NODE_ENV: nodeEnv,
    HOST: '127.0.0.1',
    PORT: String(ports.app),
    DATABASE_URL: databaseUrl(ports.pg, database),
    BETTER_AUTH_URL: origin,
    BETTER_AUTH_SECRET: secret,
    SMTP_HOST: '127.0.0.1',
    SMTP_PORT: String(ports.smtp),
    MAIL_WEB_URL: `http://127.0.0.1:${ports.mailWeb}`,
    S3_ENDPOINT: `http://127.0.0.1:${ports.s3}`,
    S3_BUCKET,
    S3_ACCESS_KEY_ID: S3_KEY,
    S3_SECRET_ACCESS_KEY: S3_KEY,
    CLIENT_DIST: 'dist',
  };
}
