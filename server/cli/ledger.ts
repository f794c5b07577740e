/**
 * `npm run -s ledger -- udi '<scanned text>'`   prints what a device label says, as one JSON object;
 * `npm run -s ledger -- record <events.json>`   prints the record of a case's event log, as JSON.
 * A label that fails its check or can't be read, or a file that isn't an event list, is a message on
 * stderr and exit code 1.
 */
import { readFileSync } from 'node:fs';
import { pathToFileURL } from 'node:url';
import { z } from 'zod';
import { parseIdentifier } from '#shared/domain/identifiers/index.ts';
import { buildRecord, type CaseRecord, type RecordEventInput } from '#shared/domain/record/index.ts';

const USAGE = 'usage: ledger udi <scanned text> | ledger record <events.json>';

/**
 * A scan pasted on a command line can't carry the group separator itself, so the usual written forms of
 * FNC1 are read as it: \x1d, \u001d, \035, <GS> and {GS}.
 */
export function unescapeScan(text: string): string {
  return text.replace(/\\x1d|\\u001d|\\035|<GS>|\{GS\}/gi, '\u001d');
}

function udi(arg: string | undefined): number {
  if (arg === undefined) return fail(`${USAGE}\nudi needs the scanned text as one argument`);
  const result = parseIdentifier(unescapeScan(arg));
  if (!result.ok) return fail(`cannot read the identifier: ${result.error}`);
  const v = result.value;
  const out = {
    scheme: v.scheme, gtin: v.gtin, lot: v.lot, serial: v.serial, expiry: v.expiry, productionDate: v.productionDate,
    labeler: v.labeler, product: v.product, unitOfMeasure: v.unitOfMeasure,
  };
  process.stdout.write(`${JSON.stringify(out)}\n`);
  return 0;
}

/**
 * The file's events: a JSON array of { id, kind, at (ISO time with offset), seq?, payload?, author?,
 * device? }; other fields (caseId, receivedAt…) are allowed and unused.
 */
const fileEventSchema = z.object({
  id: z.string().min(1).max(64),
  kind: z.string().min(1).max(64),
  at: z.iso.datetime({ offset: true }),
  seq: z.number().int().positive().nullable().optional(),
  payload: z.unknown().optional(),
  author: z.string().max(64).nullable().optional(),
  device: z.string().max(64).nullable().optional(),
});
/** A stored or tablet event (deviceTime + offsetMs) is taken too: its `at` is its corrected time. */
const withTime = (e: unknown) => {
  if (typeof e !== 'object' || e === null || 'at' in e) return e;
  const { deviceTime, offsetMs } = e as { deviceTime?: unknown; offsetMs?: unknown };
  if (typeof deviceTime !== 'string' || typeof offsetMs !== 'number' || Number.isNaN(Date.parse(deviceTime))) return e;
  return { ...e, at: new Date(Date.parse(deviceTime) + offsetMs).toISOString() };
};
const fileSchema = z.array(z.preprocess(withTime, fileEventSchema.loose())).max(1_000_000);

function readEvents(path: string): RecordEventInput[] | string {
  let text: string;
  try {
    text = readFileSync(path, 'utf8');
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code;
    return `cannot read ${path}: ${code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'it is a folder' : (error as Error).message}`;
  }
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (error) {
    return `${path} is not valid JSON: ${(error as Error).message}`;
  }
  const parsed = fileSchema.safeParse(json);
  if (!parsed.success) {
    const issue = parsed.error.issues[0]!;
    const where = issue.path.length ? `at ${issue.path.map((p) => (typeof p === 'number' ? `[${p}]` : `.${String(p)}`)).join('')}` : 'at the top';
    return `${path} is not a list of events (id, kind, at, optional seq and payload): ${where}: ${issue.message}`;
  }
  return parsed.data.map((e) => ({ id: e.id, kind: e.kind, atMs: Date.parse(e.at), seq: e.seq ?? null, payload: e.payload ?? {}, author: e.author ?? null, device: e.device ?? null }));
}

const iso = (ms: number | null) => (ms === null ? null : new Date(ms).toISOString());
const r2 = (x: number | null) => (x === null ? null : Math.round(x * 100) / 100);

/** The record in the CLI's words: ISO times instead of epoch ms, figures to two decimals. */
export function recordSummary(rec: CaseRecord) {
  return {
    totalMinutes: r2(rec.totalMinutes),
    phases: rec.phases.map((p) => ({ name: p.name, startAt: iso(p.startMs), endAt: iso(p.endMs), minutes: r2(p.minutes) })),
    idleGaps: rec.idleGaps.map((g) => ({ startAt: iso(g.startMs), endAt: iso(g.endMs), minutes: r2(g.minutes) })),
    bleeds: rec.bleeds.map((b) => ({
      bleedId: b.bleedId, startAt: iso(b.startMs), controlledAt: iso(b.controlledMs), secondsToHaemostasis: r2(b.secondsToHaemostasis),
      attempts: b.attempts, clips: b.clips, coagulations: b.coagulations, openAtScopeOut: b.openAtScopeOut,
    })),
    counts: rec.counts,
    devices: rec.devices.map(({ itemId, opened, deployed, misfired, wasted, inPatient, unaccounted }) => ({ itemId, opened, deployed, misfired, wasted, inPatient, unaccounted })),
    specimen: { areaMm2: r2(rec.specimen.areaMm2), resectionSpeedMm2PerMin: r2(rec.specimen.resectionSpeedMm2PerMin) },
    timeOut: { status: rec.timeOut.status, reason: rec.timeOut.reason },
    voided: rec.voided.length,
    amendmentsApplied: rec.amendmentsApplied,
    notes: rec.notes.map((n) => ({ text: n.text, caution: n.caution })),
    flags: rec.flags.map((f) => ({ code: f.code, message: f.message })),
    problems: rec.problems,
  };
}

function record(path: string | undefined): number {
  if (path === undefined) return fail(`${USAGE}\nrecord needs the path of a JSON file`);
  const events = readEvents(path);
  if (typeof events === 'string') return fail(events);
  process.stdout.write(`${JSON.stringify(recordSummary(buildRecord(events)), null, 2)}\n`);
  return 0;
}

function fail(message: string): number {
  process.stderr.write(`ledger: ${message}\n`);
  return 1;
}

export function main(argv: string[]): number {
  const [command, ...rest] = argv;
  if (rest.length > 1) return fail(`${USAGE}\ngive one argument after "${command}" (quote the scanned text)`);
  if (command === 'udi') return udi(rest[0]);
  if (command === 'record') return record(rest[0]);
  return fail(USAGE);
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) process.exitCode = main(process.argv.slice(2));
