/**
 * Sorting a case's log by time in time linear in its length, for the usual spread of times (events a few
 * seconds apart over hours). A counting sort puts each item into one of n equal-width time buckets (two
 * passes over a dense key array), then each bucket, usually of zero to three items, is sorted by the full
 * comparison. A comparison sort (TimSort) instead reads every item about log2(n) times, and on long logs
 * each of those reads misses the cache. Clustered times only make some buckets bigger: they are sorted
 * with Array.prototype.sort, so the worst case stays O(n log n).
 */

/** Below this many items a comparison sort is as quick. */
const SMALL = 64;

/**
 * Sort `items` by `compare`, a total order that agrees with `keyOf` (a smaller key sorts first; equal keys
 * are ordered by `compare`). Keys must be finite numbers. Returns a new array.
 */
export function sortByKey<T>(items: readonly T[], keyOf: (item: T) => number, compare: (a: T, b: T) => number): T[] {
  const n = items.length;
  if (n < SMALL) return items.slice().sort(compare);
  const keys = new Float64Array(n);
  for (let i = 0; i < n; i++) keys[i] = keyOf(items[i]!);
  return sortByKeys(items, keys, compare);
}

/**
 * The same, with the keys given: `keys[i]` is the key of `items[i]` (read when the items were made, so
 * that sorting does not read every item again; on long logs that read is a cache miss per item).
 */
export function sortByKeys<T>(items: readonly T[], keys: Float64Array, compare: (a: T, b: T) => number): T[] {
  const n = items.length;
  if (n < SMALL) return items.slice().sort(compare);
  let min = Infinity;
  let max = -Infinity;
  for (let i = 0; i < n; i++) {
    const k = keys[i]!;
    if (k < min) min = k;
    if (k > max) max = k;
  }
  // One key for all, or a spread too wide for a double (keys near ±1e308): nothing to bucket by.
  if (!(max > min) || !Number.isFinite(max - min)) return items.slice().sort(compare);
  // Bucket b holds the keys in [min + b·w, min + (b+1)·w) with w = (max − min)/(n − 1); the floor of a
  // positive multiple is monotone, so a smaller key never lands in a later bucket.
  const scale = (n - 1) / (max - min);
  const bucket = new Uint32Array(n);
  const start = new Uint32Array(n + 1);
  for (let i = 0; i < n; i++) {
    const b = Math.min(n - 1, Math.floor((keys[i]! - min) * scale));
    bucket[i] = b;
    start[b + 1]!++;
  }
  for (let b = 0; b < n; b++) start[b + 1]! += start[b]!;
  const next = start.slice(0, n);
  const out = new Array<T>(n);
  for (let i = 0; i < n; i++) out[next[bucket[i]!]!++] = items[i]!;
  for (let b = 0; b < n; b++) {
    const lo = start[b]!;
    const hi = start[b + 1]!;
    if (hi - lo > 1) sortRange(out, lo, hi, compare);
  }
  return out;
}

/** Sort out[lo, hi) in place: insertion sort for the usual few items, else the built-in sort. */
function sortRange<T>(out: T[], lo: number, hi: number, compare: (a: T, b: T) => number): void {
  if (hi - lo > 16) {
    const part = out.slice(lo, hi).sort(compare);
    for (let i = 0; i < part.length; i++) out[lo + i] = part[i]!;
    return;
  }
  for (let i = lo + 1; i < hi; i++) {
    const x = out[i]!;
    let j = i - 1;
    while (j >= lo && compare(out[j]!, x) > 0) { out[j + 1] = out[j]!; j--; }
    out[j + 1] = x;
  }
}
