// Percentiles of the bench: nearest-rank (the smallest sample with at least q of the samples at or
// below it), so every figure printed is a latency that was actually measured.

/** @param {number[]} samples @param {number} q in (0, 1] */
export function percentile(samples, q) {
  if (!samples.length) return NaN;
  const sorted = [...samples].sort((a, b) => a - b);
  return sorted[Math.min(sorted.length, Math.max(1, Math.ceil(q * sorted.length))) - 1];
}

const r2 = (x) => Math.round(x * 100) / 100;

/** { p50, p95 } in ms, rounded to 0.01 ms, with the sample count. */
export function summarize(samples) {
  return { p50: r2(percentile(samples, 0.5)), p95: r2(percentile(samples, 0.95)), n: samples.length };
}

export const sleep = (ms) => new Promise((r) => setTimeout(r, ms));
/** A pause between taps of 60–180 ms, so taps land at every phase of the frame. */
export const jitter = () => sleep(60 + Math.random() * 120);
