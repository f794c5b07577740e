import type { ParisType } from '#shared/schemas/cases.ts';

/**
 * Plain words beside each Paris type (Paris Workshop, Gastrointest Endosc 2003;58:S3–S43: 0-I
 * protruded, 0-II flat — a raised, b level, c depressed —, 0-III excavated). Our own wording.
 */
export const parisHints: Record<ParisType, string> = {
  '0-Ip': 'on a stalk',
  '0-Isp': 'raised, with a short broad neck',
  '0-Is': 'raised, broad-based, no stalk',
  '0-IIa': 'slightly raised, flat top',
  '0-IIb': 'level with the lining',
  '0-IIc': 'slightly sunken',
  '0-III': 'a hollow (ulcer)',
  '0-IIa+IIc': 'slightly raised, with a sunken centre',
  '0-IIc+IIa': 'slightly sunken, with a raised rim',
  '0-IIa+Is': 'mostly flat-raised, with a raised nodule',
  '0-Is+IIa': 'mostly raised, with a flat-raised skirt',
  '0-IIc+III': 'sunken, with a hollow',
  '0-III+IIc': 'a hollow, with a sunken edge',
  not_applicable: 'not a superficial lesion (e.g. a submucosal tumour)',
};

export function parisLabel(p: ParisType): string {
  return p === 'not_applicable' ? 'Not applicable' : `${p} — ${parisHints[p]}`;
}
