// The local S3 fake: s3rver on loopback, objects kept in a project-local folder, the app's bucket
// created at start. s3rver checks the access key (S3RVER) but not signatures, so it is for local use
// only. Run it as `node scripts/fakes/s3.mjs --port 4569 --dir .data/s3`, or in-process with startS3Fake().
import { mkdirSync } from 'node:fs';
import { resolve } from 'node:path';
import { pathToFileURL } from 'node:url';
import S3rver from 's3rver';

/**
 * Start s3rver with the given buckets (they are created when missing). Port 0 picks a free port.
 * Returns { port, endpoint, close() }.
 */
export async function startS3Fake({ port, dir, buckets = ['ledgerline'], host = '127.0.0.1' }) {
  dir = resolve(dir);
  mkdirSync(dir, { recursive: true });
  const server = new S3rver({
    address: host,
    port,
    directory: dir,
    silent: true,
    // Path-style only: the SDK is configured with forcePathStyle, and the host is an IP address.
    vhostBuckets: false,
    configureBuckets: buckets.map((name) => ({ name })),
  });
  const address = await server.run();
  return {
    port: address.port,
    endpoint: `http://${host}:${address.port}`,
    async close() {
      server.httpServer.closeAllConnections?.();
      await server.close();
    },
  };
}

const flag = (name, fallback) => {
  const i = process.argv.indexOf(`--${name}`);
  return i > 0 && process.argv[i + 1] ? process.argv[i + 1] : fallback;
};

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) {
  const bucket = flag('bucket', 'ledgerline');
  const fake = await startS3Fake({ port: Number(flag('port', '4569')), dir: flag('dir', '.data/s3'), buckets: [bucket] });
  console.log(`s3 fake ready: ${fake.endpoint} (bucket ${bucket})`);
  const stop = async () => { await fake.close(); process.exit(0); };
  process.once('SIGINT', stop);
  process.once('SIGTERM', stop);
  // Started by scripts/start.mjs with an IPC channel: if that parent dies, so does the fake.
  process.once('disconnect', stop);
}
