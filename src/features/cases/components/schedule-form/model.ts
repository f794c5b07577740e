import { zodResolver } from '@hookform/resolvers/zod';
import { format } from 'date-fns';
import type { FieldError, FieldErrors, Resolver } from 'react-hook-form';
import { scheduleCaseSchema, type ScheduleCaseInput } from '#shared/schemas/cases.ts';

/** What the form holds while it is being filled in: choices may still be empty, the size unset. */
export type ScheduleFormValues = {
  patient: { hospitalNumber: string; familyName: string; givenName: string; birthDate: string; sex: string };
  procedureType: string;
  indication: string;
  lesion: { site: string; sizeMm: number | undefined; paris: string };
  roomId: string;
  scheduledAt: string;
  sedation: string;
  endoscopistId: string;
  nurseId: string;
};

/** Every field of the form by its path in scheduleCaseSchema (also the paths of the server's issues). */
export const scheduleFieldPaths = [
  'patient.hospitalNumber', 'patient.familyName', 'patient.givenName', 'patient.birthDate', 'patient.sex',
  'procedureType', 'indication', 'lesion.site', 'lesion.sizeMm', 'lesion.paris',
  'roomId', 'scheduledAt', 'sedation', 'endoscopistId', 'nurseId',
] as const;

/**
 * Words for a field left empty, where the schema leaves that case to zod's generic message (an enum
 * or a number given nothing); every other message is the schema's own, shown as written.
 */
const missing: Partial<Record<(typeof scheduleFieldPaths)[number], string>> = {
  'patient.birthDate': 'Enter the date of birth',
  'patient.sex': 'Choose the sex recorded on the wristband',
  procedureType: 'Choose the procedure',
  'lesion.sizeMm': 'Enter the size in whole millimetres',
  'lesion.paris': 'Choose the Paris type, or “not applicable”',
  roomId: 'Choose the room',
  scheduledAt: 'Enter the planned date and time',
  sedation: 'Choose the sedation',
};

const valueAt = (values: unknown, path: string): unknown =>
  path.split('.').reduce<unknown>((v, k) => (v && typeof v === 'object' ? (v as Record<string, unknown>)[k] : undefined), values);
const isEmpty = (v: unknown) => v === undefined || v === null || v === '' || (typeof v === 'number' && Number.isNaN(v));

function reword(errors: FieldErrors, values: unknown): void {
  for (const [path, words] of Object.entries(missing)) {
    const err = valueAt(errors, path) as FieldError | undefined;
    if (err?.message && isEmpty(valueAt(values, path))) err.message = words;
  }
}

const zod = zodResolver(scheduleCaseSchema);

/** The shared schema's resolver, with plain words for fields left empty. */
export const scheduleResolver: Resolver<ScheduleFormValues, unknown, ScheduleCaseInput> = async (values, context, options) => {
  const result = await zod(values as never, context, options as never);
  reword(result.errors as FieldErrors, values);
  return result as Awaited<ReturnType<Resolver<ScheduleFormValues, unknown, ScheduleCaseInput>>>;
};

/** `<input type="datetime-local">` value (local wall time) ↔ ISO instant for the wire. */
export function toLocalInput(iso: string): string {
  const d = new Date(iso);
  return Number.isNaN(d.getTime()) ? '' : format(d, "yyyy-MM-dd'T'HH:mm");
}
export function fromLocalInput(local: string): string {
  if (!local) return '';
  // A date-time without an offset is read as local time (ECMA-262, Date Time String Format).
  const d = new Date(local);
  return Number.isNaN(d.getTime()) ? '' : d.toISOString();
}

/** A blank form; the planned time is the given day at the next whole hour (today) or at 08:00. */
export function blankSchedule(day: string | null, now = new Date()): ScheduleFormValues {
  const today = format(now, 'yyyy-MM-dd');
  let at: Date;
  if (!day || day === today) {
    at = new Date(now);
    at.setMinutes(0, 0, 0);
    at.setHours(at.getHours() + 1);
  } else {
    at = new Date(`${day}T08:00`);
  }
  return {
    patient: { hospitalNumber: '', familyName: '', givenName: '', birthDate: '', sex: '' },
    procedureType: '',
    indication: '',
    lesion: { site: '', sizeMm: undefined, paris: '' },
    roomId: '',
    scheduledAt: Number.isNaN(at.getTime()) ? '' : at.toISOString(),
    sedation: '',
    endoscopistId: '',
    nurseId: '',
  };
}
