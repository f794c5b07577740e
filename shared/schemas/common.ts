import { z } from 'zod';

/** Roles a member holds in one unit (PRODUCT.md, Roles). */
export const roles = ['nurse', 'endoscopist', 'supervisor', 'admin'] as const;
export const roleSchema = z.enum(roles);
export type Role = z.infer<typeof roleSchema>;

/**
 * RFC 9562 UUID, any version; UUIDv7 where the id is made on the tablet. Read in either case and kept in
 * lower case (RFC 9562 §4: case-insensitive on input, lower case on output), so that one id is one
 * string everywhere: in maps, in room names, beside what PostgreSQL's uuid type gives back.
 */
export const uuidSchema = z.uuid().toLowerCase();
/** RFC 9562 §5.7: version nibble 7, variant bits 10. */
export const uuidV7Schema = z
  .string()
  .regex(/^[0-9a-f]{8}-[0-9a-f]{4}-7[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/i, 'must be a UUIDv7')
  .toLowerCase();

/**
 * ISO 8601 date-time with an offset or Z, as sent on the wire, in the years 1 to 9999: ISO 8601 has a
 * year 0000 (1 BC), which PostgreSQL's calendar does not, and an offset can move a time into it.
 */
export const isoDateTimeSchema = z.iso.datetime({ offset: true }).refine((s) => {
  const ms = Date.parse(s);
  if (Number.isNaN(ms)) return true; // not a date-time at all: the format's own issue says so
  const year = new Date(ms).getUTCFullYear();
  return year >= 1 && year <= 9999;
}, 'Must fall in the years 1 to 9999');
/** ISO 8601 calendar date (YYYY-MM-DD), from the year 1 (there is no year 0 in PostgreSQL's calendar). */
export const isoDateSchema = z.iso.date().refine((s) => !/^\d{4}-/.test(s) || Number(s.slice(0, 4)) >= 1, 'Must fall in the years 1 to 9999');

/** The JSON body of every error answer: a message and, for a bad request, the fields at fault. */
export const apiErrorSchema = z.object({
  error: z.string(),
  issues: z.array(z.object({ path: z.string(), message: z.string() })).optional(),
});
export type ApiError = z.infer<typeof apiErrorSchema>;
