/** What a scanned device identifier says, in one shape for both issuing agencies. */
export type DeviceIdentifier = {
  scheme: 'gs1' | 'hibcc';
  /** How it was written: a GS1 element string (raw or bracketed), a GS1 Digital Link URI, or an HIBC code. */
  form: 'element_string' | 'bracketed' | 'digital_link' | 'hibcc_primary' | 'hibcc_secondary' | 'hibcc_concatenated';
  /** GS1 GTIN normalised to 14 digits (check digit verified). */
  gtin: string | null;
  lot: string | null;
  serial: string | null;
  /** ISO calendar date, YYYY-MM-DD. */
  expiry: string | null;
  /** ISO calendar date, YYYY-MM-DD. */
  productionDate: string | null;
  /** HIBC Labeler Identification Code (4 characters). */
  labeler: string | null;
  /** HIBC product or catalogue number. */
  product: string | null;
  /** HIBC unit of measure digit (0 = the unit of use). */
  unitOfMeasure: number | null;
  /** HIBC secondary code read on its own: the link character that must match its primary's check character. */
  linkCharacter: string | null;
  /** HIBC quantity field, when the secondary carries one. */
  quantity: number | null;
  /** What was read but not used (other or unknown application identifiers, supplemental fields), in plain words. */
  notes: string[];
};

export type Result<T> = { ok: true; value: T } | { ok: false; error: string };

export const ok = <T>(value: T): Result<T> => ({ ok: true, value });
export const fail = <T = never>(error: string): Result<T> => ({ ok: false, error });

export function emptyIdentifier(scheme: DeviceIdentifier['scheme'], form: DeviceIdentifier['form']): DeviceIdentifier {
  return {
    scheme, form, gtin: null, lot: null, serial: null, expiry: null, productionDate: null,
    labeler: null, product: null, unitOfMeasure: null, linkCharacter: null, quantity: null, notes: [],
  };
}
