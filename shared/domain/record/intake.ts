import type { z } from 'zod';
import { payloadSchemas, type EventKind } from '../../schemas/events.ts';
import { IdIndex } from './id-index.ts';
import type { Problem } from './types.ts';

/** One distinct event of the log, checked against the vocabulary but not yet corrected. */
export type LogEntry = {
  id: string;
  kind: string;
  atMs: number;
  seq: number | null;
  author: string | null;
  device: string | null;
  /** The payload as delivered. */
  raw: unknown;
  /** The parsed payload when it is valid for its kind, else null (and null until checked). */
  payload: Record<string, unknown> | null;
  /** 'unchecked' until `check` has read the payload against the vocabulary. */
  status: 'unchecked' | 'ok' | 'unknown_kind' | 'invalid_payload';
  /** Why the payload was refused. */
  issue: string | null;
  /** Set by the corrections: the effective voids of this event, and the amendments applied to it. */
  voidedBy: string[] | null;
  amendedBy: string[] | null;
};

const hasOwn = (o: object, k: string) => Object.prototype.hasOwnProperty.call(o, k);

export function isEventKind(kind: string): kind is EventKind {
  return hasOwn(payloadSchemas, kind);
}

/** Zod's issues in one line, naming each field at fault. */
export function describeIssues(error: z.ZodError): string {
  return error.issues.slice(0, 3).map((i) => `${i.path.length ? i.path.join('.') : 'payload'}: ${i.message}`).join('; ');
}

export function validatePayload(kind: EventKind, payload: unknown): { ok: true; data: Record<string, unknown> } | { ok: false; issue: string } {
  const parsed = payloadSchemas[kind].safeParse(payload);
  return parsed.success ? { ok: true, data: parsed.data as Record<string, unknown> } : { ok: false, issue: describeIssues(parsed.error) };
}

const str = (v: unknown) => (typeof v === 'string' ? v : null);

// Per-event work stays free of inner closures: the TypeScript loader's name-keeping wraps each one made.
function toEntry(item: unknown): LogEntry | string {
  if (typeof item !== 'object' || item === null || Array.isArray(item)) return 'an event is not an object';
  const e = item as Record<string, unknown>;
  if (typeof e.id !== 'string' || e.id.length === 0 || e.id.length > 64) return 'an event has no usable id (a string of 1 to 64 characters)';
  if (typeof e.kind !== 'string') return `event ${e.id} has no kind`;
  if (typeof e.atMs !== 'number' || !Number.isFinite(e.atMs)) return `event ${e.id} has no finite corrected time (atMs)`;
  const seq = typeof e.seq === 'number' && Number.isFinite(e.seq) ? e.seq : null;
  const raw = e.payload === undefined ? {} : e.payload;
  return { id: e.id, kind: e.kind, atMs: e.atMs, seq, author: str(e.author), device: str(e.device), raw, payload: null, status: 'unchecked', issue: null, voidedBy: null, amendedBy: null };
}

/**
 * A third of a log is marks with no details (`{}`: a marking, an incision, a coagulation). Their check needs
 * no schema run: the kinds whose schema takes `{}` as it is are found once, and their empty payloads share
 * one frozen `{}`. A schema run allocates some hundreds of bytes, which on a long log the garbage collector
 * then copies while the record is built.
 */
const EMPTY_PAYLOAD: Record<string, unknown> = Object.freeze({});
const EMPTY_TAKEN: ReadonlySet<string> = new Set(
  (Object.keys(payloadSchemas) as EventKind[]).filter((kind) => {
    const parsed = payloadSchemas[kind].safeParse({});
    return parsed.success && Object.keys(parsed.data as object).length === 0;
  }),
);

/** A plain object (as JSON makes) with no key that zod's strict check reads (it reads them with for…in). */
function isEmptyObject(v: unknown): boolean {
  if (typeof v !== 'object' || v === null) return false;
  const proto = Object.getPrototypeOf(v) as unknown;
  if (proto !== Object.prototype && proto !== null) return false;
  for (const _ in v) return false;
  return true;
}

/**
 * Checks the entry against the vocabulary, once: its kind, and its payload by the kind's schema. Done
 * late, when the entry joins the timeline, so that the parsed payload is fresh in the cache for the passes
 * that read it next; the corrections check the few entries they need first.
 */
export function check(entry: LogEntry): void {
  if (entry.status !== 'unchecked') return;
  if (!isEventKind(entry.kind)) {
    entry.status = 'unknown_kind';
    entry.issue = `unknown kind "${entry.kind.slice(0, 40)}"`;
    return;
  }
  if (EMPTY_TAKEN.has(entry.kind) && isEmptyObject(entry.raw)) { entry.status = 'ok'; entry.payload = EMPTY_PAYLOAD; return; }
  const parsed = payloadSchemas[entry.kind].safeParse(entry.raw);
  if (parsed.success) { entry.status = 'ok'; entry.payload = parsed.data as Record<string, unknown>; }
  else { entry.status = 'invalid_payload'; entry.issue = describeIssues(parsed.error); }
}

// Everything a delivery says of its event (but its seq, which the server adds): two deliveries that differ
// in any of it conflict, and which one stands must not depend on the order they came in.
const keyOf = (e: LogEntry) => `${e.kind}\u0000${e.atMs}\u0000${e.author}\u0000${e.device}\u0000${stableJson(e.raw)}`;

/** Which of two deliveries of one id stands: the stored one (lowest seq), then the earlier, then by content. */
function preferred(a: LogEntry, b: LogEntry): LogEntry {
  const sa = a.seq ?? Infinity;
  const sb = b.seq ?? Infinity;
  if (sa !== sb) return sa < sb ? a : b;
  if (a.atMs !== b.atMs) return a.atMs < b.atMs ? a : b;
  return keyOf(a) <= keyOf(b) ? a : b;
}

export type Intake = {
  entries: LogEntry[];
  /** `times[i]` is the corrected time of `entries[i]`, kept as the log is read: the sort's keys. */
  times: Float64Array;
  byId: IdIndex<LogEntry>;
  /** The valid voids and amendments, in log order: the corrections read only these, not the whole log. */
  voids: LogEntry[];
  amends: LogEntry[];
};

/**
 * Reads the delivered events: each id once (at-least-once delivery repeats events; a repeat counts once).
 * A repeat that differs in content is kept by a fixed rule and reported, so the result does not depend on
 * delivery order. The few voids and amendments are checked and listed apart (in log order), so that no
 * later step has to look through the whole log for them: on long logs each pass over every entry costs a
 * cache miss per event. The other entries are checked as they join the timeline (`check`).
 */
export function intake(events: unknown, problems: Problem[]): Intake {
  if (!Array.isArray(events)) {
    const out: Intake = { entries: [], times: new Float64Array(0), byId: new IdIndex(), voids: [], amends: [] };
    problems.push({ code: 'malformed_event', eventId: null, message: 'the event log is not a list' });
    return out;
  }
  // Each id's entry, in the order of its first delivery (a preferred repeat takes its place).
  const byId = new IdIndex<LogEntry>(events.length);
  const times = new Float64Array(events.length);
  const out: Intake = { entries: [], times, byId, voids: [], amends: [] };
  const corrections: LogEntry[] = [];
  const conflicted = new Set<string>();
  for (const item of events) {
    const entry = toEntry(item);
    if (typeof entry === 'string') { problems.push({ code: 'malformed_event', eventId: null, message: entry }); continue; }
    const before = byId.add(entry);
    if (!before) times[byId.size - 1] = entry.atMs;
    else {
      if (keyOf(before) !== keyOf(entry)) conflicted.add(entry.id);
      if (preferred(before, entry) !== entry) continue;
      times[byId.replace(entry)] = entry.atMs;
    }
    if (entry.kind === 'void' || entry.kind === 'amend') corrections.push(entry);
  }
  for (const id of conflicted) {
    problems.push({ code: 'duplicate_conflict', eventId: id, message: `event ${id} was delivered more than once with different content; the stored copy is used` });
  }
  out.entries = byId.items;
  for (const entry of corrections) {
    if (byId.get(entry.id) !== entry) continue; // a repeat preferred over it took its place
    check(entry);
    if (entry.status === 'ok') (entry.kind === 'void' ? out.voids : out.amends).push(entry);
  }
  out.voids.sort(compareLog);
  out.amends.sort(compareLog);
  return out;
}

/** Log order: corrected time, then the server's sequence (events not yet stored after stored ones), then id. */
export function compareLog(a: LogEntry, b: LogEntry): number {
  if (a.atMs !== b.atMs) return a.atMs - b.atMs;
  const sa = a.seq ?? Infinity;
  const sb = b.seq ?? Infinity;
  if (sa !== sb) return sa < sb ? -1 : 1;
  return a.id < b.id ? -1 : a.id > b.id ? 1 : 0;
}

/**
 * JSON with object keys sorted, so that two deliveries of one payload compare equal whatever their key
 * order. Depth-limited and total (no throw on values JSON cannot hold), as it only compares.
 */
function stableJson(v: unknown, depth = 0): string {
  if (depth > 32) return '…';
  if (typeof v === 'bigint') return `${v}n`;
  if (typeof v !== 'object' || v === null) return JSON.stringify(v) ?? String(v);
  if (Array.isArray(v)) return `[${v.map((x) => stableJson(x, depth + 1)).join(',')}]`;
  const o = v as Record<string, unknown>;
  return `{${Object.keys(o).sort().map((k) => `${JSON.stringify(k)}:${stableJson(o[k], depth + 1)}`).join(',')}}`;
}
