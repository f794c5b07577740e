/**
 * Benchmark of the record reducer (buildRecord): the time for 20,000 events, and the growth from 10,000 to
 * 100,000 events (10× the events; near-linear growth means a ratio close to 10). Each figure is the median
 * of several runs after warm-up runs. Run directly: `node --import tsx scripts/bench/reducer.ts`.
 */
import { pathToFileURL } from 'node:url';
import { v7 as uuidv7 } from 'uuid';
import { buildRecord, type RecordEventInput } from '../../shared/domain/record/index.ts';

/** A small deterministic generator (mulberry32), so every run benchmarks the same logs. */
function random(seed: number) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/**
 * A long log with the mix of a real case: milestones and checks, resection steps with injections, bleeds
 * with coagulation and haemostasis, clips (a few misfired), loops, devices opened and wasted, images and
 * remarks, about 2 % voids and 1 % amendments, delivered out of order with about 1 % repeats.
 */
export function generateLog(n: number, seed = 1): RecordEventInput[] {
  const rnd = random(seed);
  const pick = <T>(xs: readonly T[]) => xs[Math.floor(rnd() * xs.length)]!;
  const items = ['clip-a', 'clip-b', 'loop-a', 'otsc-a', 'needle-a'];
  const start = Date.UTC(2025, 4, 12, 8, 0, 0);
  let t = start;
  let seq = 0;
  const log: RecordEventInput[] = [];
  const ids: string[] = [];
  const add = (kind: string, payload: Record<string, unknown>) => {
    t += 1000 + Math.floor(rnd() * 20_000);
    const id = uuidv7({ msecs: t });
    log.push({ id, kind, atMs: t, seq: ++seq, payload, author: 'nurse-1', device: 'tablet-1' });
    ids.push(id);
    return id;
  };
  add('patient_in', {}); add('time_out', { items: [{ key: 'identity', answer: 'yes' }] }); add('sedation_start', { type: 'deep' }); add('scope_in', {});
  let openBleed: string | null = null;
  const injections: string[] = [];
  while (log.length < n - 2) {
    const r = rnd();
    if (r < 0.12) injections.push(add('injection', { agent: 'saline', volumeMl: 1 + Math.floor(rnd() * 5) }));
    else if (r < 0.24) add('dissection', {});
    else if (r < 0.30) add('marking', {});
    else if (r < 0.34) add('incision', {});
    else if (r < 0.40) { openBleed = add('bleed', { severity: pick(['ooze', 'spurting'] as const) }); }
    else if (r < 0.46) add('coagulation', {});
    else if (r < 0.52) {
      const achieved = rnd() < 0.7;
      add('haemostasis', { method: pick(['coagulation_forceps', 'clip'] as const), achieved, ...(openBleed && achieved ? { bleedId: openBleed } : {}) });
      if (achieved) openBleed = null;
    } else if (r < 0.62) add('clip_fired', { itemId: pick(items.slice(0, 2)), outcome: rnd() < 0.05 ? 'misfired' : 'deployed', purpose: pick(['haemostasis', 'closure', 'anchor'] as const) });
    else if (r < 0.66) add('loop_placed', { itemId: 'loop-a', sizeMm: 20 });
    else if (r < 0.72) add('device_opened', { itemId: pick(items), quantity: 1 + Math.floor(rnd() * 2) });
    else if (r < 0.74) add('device_wasted', { itemId: pick(items), reason: 'dropped' });
    else if (r < 0.80) add('image', { caption: 'view' });
    else if (r < 0.86) add('remark', { text: 'note' });
    else if (r < 0.90) add('esu_setting', { modeLabel: 'cut', effect: 3, watts: 40 });
    else if (r < 0.92) add('specimen_retrieved', { method: 'net', longMm: 20 + Math.floor(rnd() * 20), shortMm: 15 + Math.floor(rnd() * 10) });
    else if (r < 0.94) add('void', { targetId: pick(ids), reason: 'tapped in error' });
    else if (r < 0.95 && injections.length > 0) add('amend', { targetId: pick(injections), fields: { volumeMl: 1 + Math.floor(rnd() * 8) } });
    else if (r < 0.97) add('resection_complete', { enBloc: true });
    else add('medication', { drug: 'midazolam', dose: 1, unit: 'mg', route: 'iv' });
  }
  add('scope_out', {}); add('sign_out', { items: [{ key: 'counts', answer: 'yes' }] });
  // Delivery: out of order (each event moved up to ~50 places), with about 1 % delivered twice.
  const delivered = log.map((e, i) => ({ e, key: i + rnd() * 50 }));
  for (let i = 0; i < log.length / 100; i++) delivered.push({ e: { ...log[Math.floor(rnd() * log.length)]! }, key: rnd() * log.length });
  // Through JSON, as a log arrives from the database, the socket or IndexedDB: flat strings, fresh objects
  // (strings built by concatenation, as uuid makes ids, are slower as Map keys and no real log has them).
  return JSON.parse(JSON.stringify(delivered.sort((a, b) => a.key - b.key).map((d) => d.e))) as RecordEventInput[];
}

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m]! : (s[m - 1]! + s[m]!) / 2;
}

function timeOnce(log: RecordEventInput[]): number {
  const t0 = performance.now();
  buildRecord(log);
  return performance.now() - t0;
}

/**
 * Median times after warm-up runs. The 10,000- and 100,000-event runs alternate, so that a change of load
 * on the machine falls on both sides of the growth ratio alike.
 */
export function benchReducer(): { reducer_20k_ms: number; reducer_growth_10x: number } {
  const log20k = generateLog(20_000, 20);
  const log10k = generateLog(10_000, 10);
  const log100k = generateLog(100_000, 100);
  for (let i = 0; i < 5; i++) { timeOnce(log20k); timeOnce(log10k); }
  for (let i = 0; i < 2; i++) timeOnce(log100k);
  const t20k: number[] = [];
  for (let i = 0; i < 15; i++) t20k.push(timeOnce(log20k));
  const t10k: number[] = [];
  const t100k: number[] = [];
  for (let i = 0; i < 11; i++) {
    t10k.push(timeOnce(log10k), timeOnce(log10k));
    t100k.push(timeOnce(log100k));
  }
  return { reducer_20k_ms: round(median(t20k)), reducer_growth_10x: round(median(t100k) / median(t10k)) };
}

const round = (x: number) => Math.round(x * 100) / 100;

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) {
  const r = benchReducer();
  console.table([
    { figure: 'reducer_20k_ms', value: r.reducer_20k_ms, target: '≤ 50 ms' },
    { figure: 'reducer_growth_10x', value: r.reducer_growth_10x, target: '≈ 10 (near-linear)' },
  ]);
}
