// The targets of `npm run bench`, each against the floor measured in the same run.

/** @param {Record<string, any>} r the results */
export function targets(r) {
  const p95 = (k) => r[k].p95;
  return [
    { figure: 'tap_paint p95', value: p95('tap_paint'), limit: p95('frame_floor') + 4, rule: 'frame_floor p95 + 4' },
    { figure: 'tap_paint_cpu4x p95', value: p95('tap_paint_cpu4x'), limit: 1.3 * p95('frame_floor_cpu4x'), rule: '1.3 × frame_floor_cpu4x p95' },
    { figure: 'tap_durable p95', value: p95('tap_durable'), limit: p95('idb_floor') + 5, rule: 'idb_floor p95 + 5' },
    { figure: 'a_to_b p95', value: p95('a_to_b'), limit: p95('frame_floor') + 10 * p95('raw_rtt') + 5, rule: 'frame_floor p95 + 10 × raw_rtt p95 + 5' },
    { figure: 'flush_5000_ms', value: r.flush_5000_ms, limit: 2000, rule: '2000' },
    { figure: 'reducer_20k_ms', value: r.reducer_20k_ms, limit: 50, rule: '50' },
    { figure: 'reducer_growth_10x', value: r.reducer_growth_10x, limit: 12, rule: '12' },
  ].map((t) => ({ ...t, limit: Math.round(t.limit * 100) / 100, pass: Number.isFinite(t.value) && t.value <= t.limit }));
}
