/**
 * Clock correction of a tablet against the server, by the NTP on-wire exchange (RFC 5905, Network Time
 * Protocol Version 4, §8 "On-Wire Protocol") and the idea of its clock filter (§10 "Clock Filter
 * Algorithm": of the last eight samples, the one of least delay gives the offset).
 *
 * One sample is four timestamps in ms: T1 tablet sends, T2 server receives, T3 server replies, T4 tablet
 * receives. T1 and T4 are read on the tablet's clock, T2 and T3 on the server's.
 */

export type ClockSample = { t1: number; t2: number; t3: number; t4: number };

/** A sample with its computed offset and round-trip delay. */
export type ClockMeasure = ClockSample & { offsetMs: number; delayMs: number };

/** The estimate the tablet stamps on its events: server clock minus tablet clock, and its error bound. */
export type ClockEstimate = { offsetMs: number; uncertaintyMs: number; sample: ClockMeasure };

/** RFC 5905 §10: the clock filter keeps the last eight samples. */
export const CLOCK_FILTER_SIZE = 8;

/**
 * RFC 5905 §8: offset θ = ½ [(T2 − T1) + (T3 − T4)], delay δ = (T4 − T1) − (T3 − T2).
 * A negative delay can only come from clock granularity (the server's and tablet's reads are each
 * rounded to a millisecond); RFC 5905 clamps δ to the system precision, here to 0.
 */
export function measure(s: ClockSample): ClockMeasure {
  const offsetMs = ((s.t2 - s.t1) + (s.t3 - s.t4)) / 2;
  const delayMs = Math.max(0, (s.t4 - s.t1) - (s.t3 - s.t2));
  return { ...s, offsetMs, delayMs };
}

/**
 * The clock filter's pick: of the last `size` samples (oldest first), the one of least delay, since its
 * offset has the smallest error bound. On equal delays the newer sample wins (it is fresher).
 */
export function leastDelay(samples: readonly ClockMeasure[], size = CLOCK_FILTER_SIZE): ClockMeasure | null {
  let best: ClockMeasure | null = null;
  for (const s of samples.slice(-size)) if (!best || s.delayMs <= best.delayMs) best = s;
  return best;
}

/**
 * The estimate from the filtered sample. The true offset lies within θ ± δ/2 when the two legs of the
 * round trip are of any lengths that add up to δ (RFC 5905 §8), so δ/2 is the uncertainty.
 */
export function estimate(samples: readonly ClockMeasure[], size = CLOCK_FILTER_SIZE): ClockEstimate | null {
  const best = leastDelay(samples, size);
  return best ? { offsetMs: best.offsetMs, uncertaintyMs: best.delayMs / 2, sample: best } : null;
}

/** A bounded history of samples: the newest `size` are kept, oldest first. */
export function pushSample(samples: readonly ClockMeasure[], next: ClockMeasure, size = CLOCK_FILTER_SIZE): ClockMeasure[] {
  return [...samples, next].slice(-size);
}
