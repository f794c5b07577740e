// Types for ports.mjs, so TypeScript files (playwright.config.ts, e2e/) can import it.
export interface Ports { app: number; pg: number; smtp: number; mailWeb: number; s3: number; vite?: number }
export const devPorts: Required<Ports>;
export const testPorts: Ports;
export const S3_BUCKET: string;
export const S3_KEY: string;
export const devDatabase: string;
export const integrationDatabase: string;
export const e2eDatabase: string;
export interface DataDirs {
  data: string; pg: string; pgTest: string; mail: string; s3: string; testMail: string; testS3: string;
  authSecret: string; installStamp: string; buildStamp: string;
}
export function dataDirs(root: string): DataDirs;
export function databaseUrl(port: number, database: string): string;
export function serverEnv(options: {
  ports: Ports; database: string; secret: string; origin?: string; nodeEnv?: 'development' | 'test' | 'production';
}): Record<string, string>;
