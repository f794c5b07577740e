import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startS3Fake, type S3Fake } from '../../scripts/fakes/s3.mjs';
import { createStorage, type Storage } from '../../server/services/storage.ts';

let fake: S3Fake;
let dir: string;
let storage: Storage;

beforeAll(async () => {
  dir = mkdtempSync(join(tmpdir(), 'ledgerline-s3-'));
  // The fake starts without the bucket, so ensureBucket has to create it.
  fake = await startS3Fake({ port: 0, dir, buckets: [] });
  storage = createStorage({
    S3_ENDPOINT: fake.endpoint, S3_REGION: 'us-east-1', S3_BUCKET: 'ledgerline-storage-test',
    // s3rver's built-in account (its documentation).
    S3_ACCESS_KEY_ID: 'S3RVER', S3_SECRET_ACCESS_KEY: 'S3RVER',
  });
});
afterAll(async () => {
  await fake?.close();
  rmSync(dir, { recursive: true, force: true });
});

describe('object storage against the local S3 fake', () => {
  it('creates the bucket once and accepts a second ensureBucket', async () => {
    await storage.ensureBucket();
    await expect(storage.ensureBucket()).resolves.toBeUndefined();
  });

  it('reads back the exact bytes it stored', async () => {
    // Every byte value once, so no encoding step can pass unnoticed.
    const bytes = Buffer.from(Array.from({ length: 256 }, (_, i) => i));
    await storage.put('cases/c1/moments/m1.bin', bytes, 'application/octet-stream');
    expect((await storage.get('cases/c1/moments/m1.bin')).equals(bytes)).toBe(true);
  });

  it('stores text and serves it through a presigned link with its content type', async () => {
    await storage.put('cases/c1/notes/pathology.txt', 'Margins clear.', 'text/plain');
    const url = await storage.presignGet('cases/c1/notes/pathology.txt', 60);
    expect(url).toContain('X-Amz-Expires=60');
    const res = await fetch(url);
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toBe('text/plain');
    expect(await res.text()).toBe('Margins clear.');
  });

  it('refuses to read a key that does not exist', async () => {
    await expect(storage.get('cases/none/missing.bin')).rejects.toThrow();
  });
});
