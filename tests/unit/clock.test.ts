import { describe, expect, it } from 'vitest';
import { CLOCK_FILTER_SIZE, estimate, leastDelay, measure, pushSample, type ClockMeasure } from '#shared/domain/clock.ts';

// Formulas: RFC 5905 (NTPv4) §8, offset θ = ½[(T2 − T1) + (T3 − T4)], delay δ = (T4 − T1) − (T3 − T2);
// clock filter of the last eight samples, least delay wins: RFC 5905 §10. Worked examples by hand below.

/** A sample built from a true offset and the two legs of the round trip (ms), to check the formulas. */
function sampleFrom({ t1, trueOffset, outLeg, serverHold, backLeg }: { t1: number; trueOffset: number; outLeg: number; serverHold: number; backLeg: number }) {
  const t2 = t1 + trueOffset + outLeg;
  const t3 = t2 + serverHold;
  const t4 = t3 - trueOffset + backLeg;
  return measure({ t1, t2, t3, t4 });
}

describe('the on-wire offset and delay (RFC 5905 §8)', () => {
  it('gives offset 50 ms and delay 20 ms for T1=0, T2=60, T3=80, T4=40', () => {
    // By hand: θ = ((60 − 0) + (80 − 40)) / 2 = (60 + 40) / 2 = 50; δ = (40 − 0) − (80 − 60) = 40 − 20 = 20.
    // Read as a story: the server runs 50 ms ahead, each leg takes 10 ms, the server holds the ping 20 ms.
    const m = measure({ t1: 0, t2: 60, t3: 80, t4: 40 });
    expect(m.offsetMs).toBe(50);
    expect(m.delayMs).toBe(20);
  });

  it('gives a negative offset when the tablet runs ahead of the server', () => {
    // By hand: T1=1000, T2=900 (server 110 ms behind, out leg 10), T3=905, T4=1025 (back leg 10).
    // θ = ((900 − 1000) + (905 − 1025)) / 2 = (−100 − 120) / 2 = −110; δ = (1025 − 1000) − (905 − 900) = 20.
    const m = measure({ t1: 1000, t2: 900, t3: 905, t4: 1025 });
    expect(m.offsetMs).toBe(-110);
    expect(m.delayMs).toBe(20);
  });

  it('keeps the true offset within θ ± δ/2 when the two legs differ', () => {
    // By hand: true offset 50, out leg 30, server hold 5, back leg 10 → T2=80, T3=85, T4=45.
    // θ = ((80 − 0) + (85 − 45)) / 2 = 60; δ = 45 − 5 = 40; 50 lies in [60 − 20, 60 + 20]. RFC 5905 §8:
    // the error of θ is half the difference of the legs, (30 − 10) / 2 = 10, never more than δ/2.
    const m = sampleFrom({ t1: 0, trueOffset: 50, outLeg: 30, serverHold: 5, backLeg: 10 });
    expect(m).toMatchObject({ t2: 80, t3: 85, t4: 45, offsetMs: 60, delayMs: 40 });
    expect(Math.abs(m.offsetMs - 50)).toBeLessThanOrEqual(m.delayMs / 2);
  });

  it('clamps a negative delay from millisecond rounding to zero (RFC 5905 clamps δ to the precision)', () => {
    // By hand: δ = (10 − 10) − (7 − 6) = −1, only possible through rounding of the four reads.
    expect(measure({ t1: 10, t2: 6, t3: 7, t4: 10 }).delayMs).toBe(0);
  });
});

describe('the clock filter (RFC 5905 §10: least delay of the last eight)', () => {
  const withDelay = (delayMs: number, offsetMs: number): ClockMeasure => ({ t1: 0, t2: 0, t3: 0, t4: 0, offsetMs, delayMs });

  it('picks the sample of least delay and gives half its delay as the uncertainty', () => {
    const samples = [withDelay(30, 12), withDelay(8, 4), withDelay(50, -7)];
    expect(estimate(samples)).toMatchObject({ offsetMs: 4, uncertaintyMs: 4 });
  });

  it('prefers the newer of two samples of equal delay', () => {
    expect(leastDelay([withDelay(8, 1), withDelay(8, 2)])?.offsetMs).toBe(2);
  });

  it('forgets samples older than the last eight, even a better one', () => {
    const old = withDelay(1, 999);
    const recent = Array.from({ length: CLOCK_FILTER_SIZE }, (_, i) => withDelay(20 + i, i));
    expect(CLOCK_FILTER_SIZE).toBe(8); // RFC 5905 §10: the filter's shift register has eight stages.
    expect(leastDelay([old, ...recent])?.offsetMs).toBe(0);
  });

  it('keeps a bounded history, dropping the oldest', () => {
    let history: ClockMeasure[] = [];
    for (let i = 0; i < 12; i++) history = pushSample(history, withDelay(i, i));
    expect(history.map((s) => s.offsetMs)).toEqual([4, 5, 6, 7, 8, 9, 10, 11]);
  });

  it('has no estimate before the first sample', () => {
    expect(estimate([])).toBeNull();
  });
});
