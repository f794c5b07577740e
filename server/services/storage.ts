import {
  CreateBucketCommand, GetObjectCommand, HeadBucketCommand, PutObjectCommand, S3Client, S3ServiceException,
} from '@aws-sdk/client-s3';
import { getSignedUrl } from '@aws-sdk/s3-request-presigner';
import type { Config } from '../config.ts';

export interface Storage {
  /** Create the bucket when it does not exist yet (start-up of a fresh environment). */
  ensureBucket(): Promise<void>;
  put(key: string, body: Buffer | Uint8Array | string, contentType: string): Promise<void>;
  /** The object's bytes; throws when the key does not exist. */
  get(key: string): Promise<Buffer>;
  /** A time-limited GET link that needs no credentials. */
  presignGet(key: string, seconds: number): Promise<string>;
}

type StorageConfig = Pick<Config, 'S3_ENDPOINT' | 'S3_REGION' | 'S3_BUCKET' | 'S3_ACCESS_KEY_ID' | 'S3_SECRET_ACCESS_KEY'>;

/** Object storage through the AWS SDK v3 against any S3-compatible endpoint (locally, s3rver). */
export function createStorage(config: StorageConfig): Storage {
  const client = new S3Client({
    endpoint: config.S3_ENDPOINT,
    region: config.S3_REGION,
    credentials: { accessKeyId: config.S3_ACCESS_KEY_ID, secretAccessKey: config.S3_SECRET_ACCESS_KEY },
    // Path-style URLs (endpoint/bucket/key): S3-compatible servers on an IP address have no bucket subdomains.
    forcePathStyle: true,
    // Checksums only where the S3 API requires them: S3-compatible servers (s3rver among them) do not
    // all understand the SDK's default CRC32 headers and aws-chunked uploads.
    requestChecksumCalculation: 'WHEN_REQUIRED',
    responseChecksumValidation: 'WHEN_REQUIRED',
  });
  const Bucket = config.S3_BUCKET;
  return {
    async ensureBucket() {
      try {
        await client.send(new HeadBucketCommand({ Bucket }));
      } catch (err) {
        if (!(err instanceof S3ServiceException) || err.$metadata.httpStatusCode !== 404) throw err;
        await client.send(new CreateBucketCommand({ Bucket }));
      }
    },
    async put(key, body, contentType) {
      await client.send(new PutObjectCommand({ Bucket, Key: key, Body: body, ContentType: contentType }));
    },
    async get(key) {
      const res = await client.send(new GetObjectCommand({ Bucket, Key: key }));
      if (!res.Body) throw new Error(`Object ${key} has no body`);
      return Buffer.from(await res.Body.transformToByteArray());
    },
    presignGet(key, seconds) {
      return getSignedUrl(client, new GetObjectCommand({ Bucket, Key: key }), { expiresIn: seconds });
    },
  };
}
