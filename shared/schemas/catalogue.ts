import { z } from 'zod';
import { normaliseGtin } from '../domain/identifiers/gs1/check-digit.ts';
import { isoDateTimeSchema, uuidSchema } from './common.ts';

/**
 * The unit's device catalogue (admin-only to change, readable by every role of the unit). Descriptions are
 * generic ("through-the-scope clip, 11 mm opening"), never a brand. Each item carries a GS1 GTIN, an HIBCC
 * labeler and product code, or both, so that a scanned package can be matched to it.
 */
export const catalogueItemTypes = ['clip', 'loop', 'over_the_scope_clip', 'suturing_device', 'injection_needle', 'knife', 'snare', 'net', 'other'] as const;
export const catalogueItemTypeSchema = z.enum(catalogueItemTypes);
export type CatalogueItemType = z.infer<typeof catalogueItemTypeSchema>;
export const catalogueItemTypeLabels: Record<CatalogueItemType, string> = {
  clip: 'Clip (through the scope)',
  loop: 'Detachable loop',
  over_the_scope_clip: 'Over-the-scope clip',
  suturing_device: 'Suturing device',
  injection_needle: 'Injection needle',
  knife: 'Knife',
  snare: 'Snare',
  net: 'Retrieval net',
  other: 'Other device',
};

/** A form's empty text box means "none". */
const blankToNull = (v: unknown) => (typeof v === 'string' && v.trim() === '' ? null : v);

const optionalText = (max: number) => z.preprocess(blankToNull, z.string().trim().max(max, `At most ${max} characters`).nullable()).optional();

/** A GTIN-8, -12, -13 or -14 with a good check digit, stored as 14 digits. */
export const gtinSchema = z.string().trim().transform((s, ctx) => {
  const r = normaliseGtin(s);
  if (!r.ok) { ctx.addIssue({ code: 'custom', message: r.error }); return z.NEVER; }
  return r.value;
});

/**
 * HIBC LIC labeler identification code: four characters, the first a letter, the rest letters or digits
 * (HIBC Supplier Labeling Standard, primary data structure; from memory). Upper case, as HIBC codes are.
 */
export const hibccLabelerSchema = z.string().trim().toUpperCase().regex(/^[A-Z][A-Z0-9]{3}$/, 'Labeler code is 4 characters: a letter, then letters or digits');
/** HIBC product or catalogue number: 1 to 18 letters or digits (same source; from memory). */
export const hibccProductSchema = z.string().trim().toUpperCase().regex(/^[A-Z0-9]{1,18}$/, 'Product code is 1 to 18 letters or digits');

const fields = {
  /** Generic description, no brand names. */
  description: z.string().trim().min(1, 'Description is required').max(200, 'At most 200 characters'),
  type: catalogueItemTypeSchema,
  /** Size as the package states it ("11 mm", "20 mm loop"). */
  sizeLabel: optionalText(40),
  gtin: z.preprocess(blankToNull, gtinSchema.nullable()).optional(),
  hibccLabeler: z.preprocess(blankToNull, hibccLabelerSchema.nullable()).optional(),
  hibccProduct: z.preprocess(blankToNull, hibccProductSchema.nullable()).optional(),
};

type IdentifierFields = { gtin?: string | null; hibccLabeler?: string | null; hibccProduct?: string | null };

/** HIBCC needs both halves; an item needs at least one identifier to be matched to a scan. */
function checkIdentifiers(v: IdentifierFields, ctx: z.RefinementCtx): void {
  const lab = v.hibccLabeler ?? null;
  const prod = v.hibccProduct ?? null;
  if (lab && !prod) ctx.addIssue({ code: 'custom', path: ['hibccProduct'], message: 'Give the HIBCC product code with the labeler code' });
  if (prod && !lab) ctx.addIssue({ code: 'custom', path: ['hibccLabeler'], message: 'Give the HIBCC labeler code with the product code' });
  if (!v.gtin && !lab && !prod) ctx.addIssue({ code: 'custom', path: ['gtin'], message: 'Give a GTIN or an HIBCC labeler and product code' });
}

/** POST /api/catalogue — add an item. */
export const createCatalogueItemSchema = z.strictObject(fields).superRefine(checkIdentifiers);
export type CreateCatalogueItemInput = z.input<typeof createCatalogueItemSchema>;

/** PUT /api/catalogue/:itemId — replace the item's fields (the edit form sends them all). */
export const replaceCatalogueItemSchema = createCatalogueItemSchema;

/** PATCH /api/catalogue/:itemId — take an item out of use or back; never deleted, since usages point at it. */
export const setCatalogueItemActiveSchema = z.strictObject({ active: z.boolean() });

/** GET /api/catalogue query: `includeInactive=true` lists the retired items too. */
export const listCatalogueQuerySchema = z.strictObject({
  includeInactive: z.enum(['true', 'false']).optional().transform((v) => v === 'true'),
});

export const catalogueItemSchema = z.object({
  id: uuidSchema,
  description: z.string(),
  type: catalogueItemTypeSchema,
  sizeLabel: z.string().nullable(),
  gtin: z.string().nullable(),
  hibccLabeler: z.string().nullable(),
  hibccProduct: z.string().nullable(),
  active: z.boolean(),
  createdAt: isoDateTimeSchema,
});
export type CatalogueItem = z.infer<typeof catalogueItemSchema>;
export const catalogueListSchema = z.object({ items: z.array(catalogueItemSchema) });
