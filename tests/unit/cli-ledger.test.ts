import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, describe, expect, it } from 'vitest';
import { v7 as uuidv7 } from 'uuid';

// Runs the CLI as `npm run -s ledger` does (node --import tsx --no-warnings server/cli/ledger.ts).
// Identifier values as in identifiers-gs1.test.ts and identifiers-hibcc.test.ts (sources named there).

const root = fileURLToPath(new URL('../..', import.meta.url));
const dir = mkdtempSync(join(tmpdir(), 'ledger-cli-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function ledger(...args: string[]) {
  const r = spawnSync(process.execPath, ['--import', 'tsx', '--no-warnings', 'server/cli/ledger.ts', ...args], { cwd: root, encoding: 'utf8', timeout: 30_000 });
  return { code: r.status, stdout: r.stdout, stderr: r.stderr };
}

function file(name: string, content: unknown) {
  const path = join(dir, name);
  writeFileSync(path, typeof content === 'string' ? content : JSON.stringify(content));
  return path;
}

// Each run starts Node and the TypeScript loader (a second or two on a busy machine), hence the timeouts.
describe('ledger udi', { timeout: 30_000 }, () => {
  it('prints one JSON object with every field, null where absent, for a GS1 DataMatrix scan', () => {
    const r = ledger('udi', ']d201095060001343521728123110ABC123\\x1d21SN7');
    expect(r.code).toBe(0);
    expect(JSON.parse(r.stdout)).toEqual({
      scheme: 'gs1', gtin: '09506000134352', lot: 'ABC123', serial: 'SN7', expiry: '2028-12-31', productionDate: null,
      labeler: null, product: null, unitOfMeasure: null,
    });
  });

  it('reads an HIBC code', () => {
    const r = ledger('udi', '+A123BJC5D6E71G');
    expect(JSON.parse(r.stdout)).toMatchObject({ scheme: 'hibcc', labeler: 'A123', product: 'BJC5D6E7', unitOfMeasure: 1, gtin: null });
  });

  it('says on stderr why an identifier fails its check, and exits 1', () => {
    const r = ledger('udi', '(01)09506000134353');
    expect(r.code).toBe(1);
    expect(r.stdout).toBe('');
    expect(r.stderr).toMatch(/check digit.*should be 2/);
  });

  it('exits 1 with the usage when the text is missing', () => {
    const r = ledger('udi');
    expect(r.code).toBe(1);
    expect(r.stderr).toMatch(/usage/);
  });
});

describe('ledger record', { timeout: 30_000 }, () => {
  const at = (m: number) => new Date(Date.UTC(2025, 2, 4, 8, 0) + m * 60_000).toISOString();
  const bleed = uuidv7();
  const clip = uuidv7();
  type FileEvent = { id: string; kind: string; at: string; seq?: number; payload?: Record<string, unknown> };
  const events: FileEvent[] = [
    { id: uuidv7(), kind: 'time_out', at: at(-2), payload: { items: [{ key: 'identity', answer: 'yes' }] } },
    { id: uuidv7(), kind: 'scope_in', at: at(0) },
    { id: uuidv7(), kind: 'device_opened', at: at(1), payload: { itemId: 'clip-9', quantity: 2 } },
    { id: uuidv7(), kind: 'marking', at: at(2) },
    { id: uuidv7(), kind: 'injection', at: at(3), seq: 5, payload: { volumeMl: 6 } },
    { id: bleed, kind: 'bleed', at: at(10), payload: { severity: 'spurting' } },
    { id: clip, kind: 'clip_fired', at: at(11), payload: { itemId: 'clip-9', outcome: 'deployed', purpose: 'haemostasis' } },
    { id: uuidv7(), kind: 'haemostasis', at: at(11.5), payload: { method: 'clip', achieved: true, bleedId: bleed } },
    { id: uuidv7(), kind: 'clip_fired', at: at(12), payload: { itemId: 'clip-9', outcome: 'misfired' } },
    { id: uuidv7(), kind: 'remark', at: at(13), payload: { text: 'tapped by mistake' } },
    { id: uuidv7(), kind: 'resection_complete', at: at(42), payload: { enBloc: true } },
    { id: uuidv7(), kind: 'specimen_retrieved', at: at(44), payload: { longMm: 40, shortMm: 30 } },
    { id: uuidv7(), kind: 'scope_out', at: at(50) },
  ];
  events.push({ id: uuidv7(), kind: 'void', at: at(14), payload: { targetId: events[9]!.id, reason: 'wrong button' } });

  it('prints the record as JSON: phases, bleeds, counts, devices, specimen and voids', () => {
    const r = ledger('record', file('case.json', events));
    expect(r.code).toBe(0);
    const out = JSON.parse(r.stdout);
    expect(out.totalMinutes).toBe(50);
    expect(out.phases).toEqual(expect.arrayContaining([
      { name: 'total', startAt: at(0), endAt: at(50), minutes: 50 },
      { name: 'resection', startAt: at(2), endAt: at(42), minutes: 40 },
      { name: 'retrieval', startAt: at(42), endAt: at(44), minutes: 2 },
    ]));
    expect(out.bleeds).toEqual([expect.objectContaining({ startAt: at(10), controlledAt: at(11.5), secondsToHaemostasis: 90, attempts: 2 })]);
    expect(out.counts).toMatchObject({ clipsDeployed: 1, clipsMisfired: 1, loopsPlaced: 0, bleeds: 1, bleedsOpen: 0, injectionMl: 6 });
    expect(out.devices).toEqual([{ itemId: 'clip-9', opened: 2, deployed: 1, misfired: 1, wasted: 0, inPatient: 1, unaccounted: 0 }]);
    // π/4 · 40 · 30 = 300π ≈ 942.48 mm² over a 40-minute resection ≈ 23.56 mm²/min (by hand).
    expect(out.specimen).toEqual({ areaMm2: 942.48, resectionSpeedMm2PerMin: 23.56 });
    expect(out.voided).toBe(1);
    expect(out.problems).toEqual([]);
  });

  it('takes stored events too, their time being device time plus offset', () => {
    const stored = events.map((e, i) => ({ ...e, at: undefined, deviceTime: new Date(Date.parse(e.at) - 1000).toISOString(), offsetMs: 1000, seq: i + 1, caseId: 'c1' }));
    const r = ledger('record', file('stored.json', stored.map(({ at: _unused, ...rest }) => rest)));
    expect(r.code).toBe(0);
    expect(JSON.parse(r.stdout)).toMatchObject({ totalMinutes: 50, voided: 1 });
  });

  it('reports bad events in the output rather than failing', () => {
    const r = ledger('record', file('odd.json', [...events, { id: uuidv7(), kind: 'teleport', at: at(5) }]));
    expect(r.code).toBe(0);
    expect(JSON.parse(r.stdout).problems).toEqual([expect.objectContaining({ code: 'unknown_kind' })]);
  });

  it.each([
    ['not JSON', '{ nope', /not valid JSON/],
    ['not a list', { events: [] }, /not a list of events.*expected array/],
    ['an event without its time', [{ id: 'a', kind: 'scope_in' }], /\[0\]\.at/],
    ['a time without a zone', [{ id: 'a', kind: 'scope_in', at: '2025-03-04 08:00' }], /\[0\]\.at/],
  ])('refuses a file that is %s, with a clear message and exit 1', (_what, content, message) => {
    const r = ledger('record', file(`bad-${Math.random().toString(36).slice(2)}.json`, content));
    expect(r.code).toBe(1);
    expect(r.stderr).toMatch(message);
  });

  it('refuses a file that is not there', () => {
    const r = ledger('record', join(dir, 'missing.json'));
    expect(r.code).toBe(1);
    expect(r.stderr).toMatch(/no such file/);
  });
});
