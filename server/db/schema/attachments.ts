import { bigint, index, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { user } from './auth.ts';
import { cases } from './cases.ts';
import { events } from './events.ts';

/** A file kept in object storage (image, voice memo, pathology report), tied to a case and maybe a moment. */
export const attachments = pgTable('attachments', {
  id: uuid('id').primaryKey().defaultRandom(),
  caseId: uuid('case_id').notNull().references(() => cases.id),
  eventId: uuid('event_id').references(() => events.id),
  storageKey: text('storage_key').notNull(),
  contentType: text('content_type').notNull(),
  bytes: bigint('bytes', { mode: 'number' }).notNull(),
  uploadedBy: uuid('uploaded_by').notNull().references(() => user.id),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
}, (t) => [
  uniqueIndex('attachments_storage_key_key').on(t.storageKey),
  index('attachments_case_idx').on(t.caseId),
]);

export type AttachmentRow = typeof attachments.$inferSelect;
