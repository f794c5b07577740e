import { differenceInYears, format, parseISO } from 'date-fns';
import type { CaseSummary } from '#shared/schemas/cases.ts';

/** "MARIN, Sofia": family name first and in capitals, as on wristbands (common practice). */
export function patientName(p: Pick<CaseSummary['patient'], 'familyName' | 'givenName'>): string {
  return `${p.familyName.toLocaleUpperCase('en-GB')}, ${p.givenName}`;
}

export function birthLine(birthDate: string, today = new Date()): string {
  const d = parseISO(birthDate);
  return `${format(d, 'd MMM yyyy')} (${differenceInYears(today, d)} y)`;
}

export const timeOf = (iso: string) => format(parseISO(iso), 'HH:mm');
export const dayTitle = (day: string) => format(parseISO(day), 'EEEE d MMMM yyyy');
export const shortProcedure = (t: CaseSummary['procedureType']) => (t === 'other' ? 'Other' : t.toUpperCase());
export const sexWords: Record<CaseSummary['patient']['sex'], string> = { female: 'Female', male: 'Male', other: 'Other', unknown: 'Sex not known' };
