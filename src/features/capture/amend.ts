import { payloadSchemas, type EventKind } from '#shared/schemas/events.ts';
import type { DetailField } from './details.ts';

/**
 * From the quick sheet's answers to the `fields` of an `amend` event. Only fields that changed and hold
 * a value are sent (an amendment adds or replaces, it never silently clears). The result is checked by
 * merging it into the event's current payload and parsing with the kind's schema, so an amendment that
 * would make the event invalid is refused here with the field's name, before it reaches the outbox.
 */
export type AmendResult = { ok: true; fields: Record<string, unknown> } | { ok: false; errors: Record<string, string> };

export function clean(value: unknown): unknown {
  if (typeof value === 'string') return value.trim() === '' ? undefined : value.trim();
  return value;
}

export function amendFields(kind: EventKind, fields: DetailField[], current: Record<string, unknown>, values: Record<string, unknown>): AmendResult {
  const changed: Record<string, unknown> = {};
  for (const f of fields) {
    const v = clean(values[f.name]);
    if (v !== undefined && v !== current[f.name]) changed[f.name] = v;
  }
  const errors = validate(kind, { ...current, ...changed }, fields);
  return errors ? { ok: false, errors } : { ok: true, fields: changed };
}

/** A payload for an event whose sheet comes before it (a remark needs its text). */
export function createPayload(kind: EventKind, fields: DetailField[], fixed: Record<string, unknown>, values: Record<string, unknown>) {
  const payload: Record<string, unknown> = { ...fixed };
  for (const f of fields) {
    const v = clean(values[f.name]);
    if (v !== undefined) payload[f.name] = v;
  }
  const errors = validate(kind, payload, fields);
  return errors ? { ok: false as const, errors } : { ok: true as const, payload };
}

function validate(kind: EventKind, payload: Record<string, unknown>, fields: DetailField[]): Record<string, string> | null {
  const parsed = payloadSchemas[kind].safeParse(payload);
  if (parsed.success) return null;
  const errors: Record<string, string> = {};
  for (const issue of parsed.error.issues) {
    const name = String(issue.path[0] ?? '');
    const label = fields.find((f) => f.name === name)?.label ?? name;
    errors[name] ??= payload[name] === undefined ? `${label} is required` : `${label}: ${issue.message}`;
  }
  return errors;
}
