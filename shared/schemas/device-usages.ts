import { z } from 'zod';
import { GS } from '../domain/identifiers/index.ts';
import { isoDateSchema, uuidSchema } from './common.ts';

/**
 * A device used in a case and what its label said. The server reads `rawScan` itself with the shared
 * identifier parser and stores what it read; a client's own reading is never sent, so never trusted.
 */

/**
 * Scanner text as people and keyboard-wedge scanners actually deliver it: the group separator (FNC1)
 * arrives as the control character, or, where a scanner or a person cannot send one, as the text
 * "<GS>", "\x1d" or "\u001d" (common practice in scanner configuration). All become the one character.
 */
export function normaliseScanText(text: string): string {
  return text
    .replace(/<GS>|\\x1[dD]|\\u001[dD]/g, GS)
    .replace(/^[\s]+|[\r\n]+$/g, '');
}

export const rawScanSchema = z.string().min(1, 'Nothing was scanned').max(2000, 'The scanned text is too long for a device label').transform(normaliseScanText);

/** How the usage was identified: read from a GS1 or HIBC code, or chosen by hand with the label typed. */
export const identifierSchemes = ['gs1', 'hibcc', 'manual'] as const;
export const identifierSchemeSchema = z.enum(identifierSchemes);

/**
 * POST /api/cases/:caseId/device-usages. Either `rawScan` (the scanned or typed code) or `manual` (an item
 * picked from the catalogue with its lot typed from the package). `id` is made by the tablet: a repeat
 * with the same id answers the stored usage, so a retry after a lost answer stores nothing twice.
 */
export const createDeviceUsageSchema = z.strictObject({
  id: uuidSchema.optional(),
  /** The event the device belongs to (clip_fired, loop_placed, …): the scan attaches after the tap. */
  eventId: uuidSchema.nullable().optional(),
  /** A catalogue item chosen by the nurse; with a scan it must match what the scan names, if anything. */
  itemId: uuidSchema.nullable().optional(),
  rawScan: rawScanSchema.optional(),
  manual: z.strictObject({
    lot: z.string().trim().min(1).max(20, 'A lot is at most 20 characters (GS1 AI 10)').nullable().optional(),
    serial: z.string().trim().min(1).max(20, 'A serial is at most 20 characters (GS1 AI 21)').nullable().optional(),
    expiry: isoDateSchema.nullable().optional(),
  }).optional(),
}).superRefine((v, ctx) => {
  if (!v.rawScan && !v.manual) ctx.addIssue({ code: 'custom', path: ['rawScan'], message: 'Give the scanned code, or the item and its lot typed by hand' });
  if (v.rawScan && v.manual) ctx.addIssue({ code: 'custom', path: ['manual'], message: 'Give either the scanned code or the typed label, not both' });
  if (v.manual && !v.itemId) ctx.addIssue({ code: 'custom', path: ['itemId'], message: 'Choose the catalogue item for a label typed by hand' });
});
export type CreateDeviceUsageInput = z.input<typeof createDeviceUsageSchema>;

/** What the server noticed about a usage; the tablet warned about the same before the nurse confirmed. */
export const usageWarnings = ['expired', 'not_in_catalogue', 'inactive_item'] as const;
export const usageWarningSchema = z.enum(usageWarnings);
export type UsageWarning = z.infer<typeof usageWarningSchema>;

export const deviceUsageSchema = z.object({
  id: uuidSchema,
  caseId: uuidSchema,
  eventId: uuidSchema.nullable(),
  itemId: uuidSchema.nullable(),
  scheme: identifierSchemeSchema,
  gtin: z.string().nullable(),
  lot: z.string().nullable(),
  serial: z.string().nullable(),
  expiry: isoDateSchema.nullable(),
  productionDate: isoDateSchema.nullable(),
  rawScan: z.string().nullable(),
  createdAt: z.string(),
  /** Warnings as of the day the usage was stored. */
  warnings: z.array(usageWarningSchema),
});
export type DeviceUsage = z.infer<typeof deviceUsageSchema>;
export const deviceUsageListSchema = z.object({ usages: z.array(deviceUsageSchema) });
