// Types for s3.mjs (the tests import it in-process).
export interface S3Fake { port: number; endpoint: string; close(): Promise<void> }
export function startS3Fake(options: { port: number; dir: string; buckets?: string[]; host?: string }): Promise<S3Fake>;
