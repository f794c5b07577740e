import { isExpired, parseIdentifier, type DeviceIdentifier } from '#shared/domain/identifiers/index.ts';
import type { CatalogueItem } from '#shared/schemas/catalogue.ts';
import { normaliseScanText } from '#shared/schemas/device-usages.ts';

/**
 * What a scan says before the nurse confirms it: read with the shared identifier parser (the server reads
 * it again itself), matched to the unit's catalogue, and the warnings a person must see first.
 */
export type ScanWarning = { code: 'expired' | 'not_in_catalogue' | 'inactive_item'; message: string };

export type ScanReading =
  | { ok: true; raw: string; identifier: DeviceIdentifier; item: CatalogueItem | null; warnings: ScanWarning[] }
  | { ok: false; raw: string; error: string; checkFailed: boolean };

/** The catalogue item a reading names: GTIN for GS1, labeler and product for HIBCC; active items first. */
export function matchItem(id: DeviceIdentifier, catalogue: CatalogueItem[]): CatalogueItem | null {
  const found = catalogue.filter((c) => (id.gtin ? c.gtin === id.gtin : Boolean(id.labeler && id.product && c.hibccLabeler === id.labeler && c.hibccProduct === id.product)));
  return found.find((c) => c.active) ?? found[0] ?? null;
}

export function readScan(text: string, catalogue: CatalogueItem[], today: Date = new Date()): ScanReading {
  const raw = normaliseScanText(text);
  const parsed = parseIdentifier(raw, { referenceDate: today });
  if (!parsed.ok) return { ok: false, raw, error: parsed.error, checkFailed: /check digit|mod-43 check/.test(parsed.error) };
  const identifier = parsed.value;
  const item = matchItem(identifier, catalogue);
  const warnings: ScanWarning[] = [];
  if (isExpired(identifier.expiry, today)) warnings.push({ code: 'expired', message: `Expired on ${identifier.expiry}. Check with the team before using it.` });
  if (!item) {
    const what = identifier.gtin ? `GTIN ${identifier.gtin}` : identifier.labeler ? `HIBC code ${identifier.labeler} ${identifier.product ?? ''}`.trim() : 'This code';
    warnings.push({ code: 'not_in_catalogue', message: `${what} is not in the unit's catalogue. It can still be recorded; an administrator can add it.` });
  } else if (!item.active) {
    warnings.push({ code: 'inactive_item', message: `"${item.description}" has been taken out of use in the catalogue.` });
  }
  return { ok: true, raw, identifier, item, warnings };
}

/** The group separator as a person sees it in the field: scanners that send the control character get it shown as text. */
export const GS_TEXT = '<GS>';
export const showSeparators = (text: string) => text.replace(/\u001d/g, GS_TEXT);

/** "Clip, 11 mm"; a description that already says its size is left as it is. */
export const itemName = (item: Pick<CatalogueItem, 'description' | 'sizeLabel'>) =>
  (item.sizeLabel && !item.description.includes(item.sizeLabel) ? `${item.description}, ${item.sizeLabel}` : item.description);
