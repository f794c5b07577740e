import { estimate, measure, pushSample, type ClockEstimate, type ClockMeasure } from '#shared/domain/clock.ts';

/**
 * Samples the server clock with `clock.ping` (RFC 5905 on-wire exchange, shared/domain/clock.ts): a short
 * burst at each connect, then one sample every few minutes while connected. The estimate kept is the
 * least-delay sample of the last eight; it is saved so a reload offline still stamps a known offset.
 */
export type ClockSamplerOptions = {
  /** Send T1, resolve with the server's T2 and T3 (rejects when unanswered). */
  ping: (t1: number) => Promise<{ t2: number; t3: number }>;
  /** The tablet clock that also stamps deviceTime (ms since the epoch): offsets only apply to that clock. */
  now: () => number;
  onEstimate: (e: ClockEstimate) => void;
  burst?: number;
  intervalMs?: number;
};

export function createClockSampler({ ping, now, onEstimate, burst = 4, intervalMs = 5 * 60_000 }: ClockSamplerOptions) {
  let samples: ClockMeasure[] = [];
  let timer: ReturnType<typeof setInterval> | undefined;
  let running = false;

  async function sampleOnce(): Promise<boolean> {
    const t1 = now();
    try {
      const { t2, t3 } = await ping(t1);
      samples = pushSample(samples, measure({ t1, t2, t3, t4: now() }));
      const e = estimate(samples);
      if (e) onEstimate(e);
      return true;
    } catch {
      return false; // unanswered: no sample; the previous estimate stands
    }
  }

  async function runBurst(): Promise<void> {
    for (let i = 0; i < burst && running; i++) if (!(await sampleOnce())) break;
  }

  return {
    /** Start sampling (at connect): a burst now, then one sample per interval. */
    start(): Promise<void> {
      running = true;
      if (timer) clearInterval(timer);
      timer = setInterval(() => void sampleOnce(), intervalMs);
      return runBurst();
    },
    /** Stop (at disconnect); the samples are kept for the next connect. */
    stop(): void {
      running = false;
      if (timer) clearInterval(timer);
      timer = undefined;
    },
    sampleOnce,
    get samples(): readonly ClockMeasure[] { return samples; },
  };
}
