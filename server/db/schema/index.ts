// Every table of the product, one file per aggregate. drizzle.config.ts and the drizzle instance read this.
export * from './auth.ts';
export * from './rooms.ts';
export * from './patients.ts';
export * from './cases.ts';
export * from './events.ts';
export * from './catalogue.ts';
export * from './device-usages.ts';
export * from './specimens.ts';
export * from './attachments.ts';
export * from './reports.ts';
export * from './review-annotations.ts';
export * from './audit.ts';
export * from './rate-limits.ts';
