import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { afterPaint } from '@/features/capture/hooks/after-paint.ts';

// The frames are driven by hand: requestAnimationFrame only collects its callbacks, and `frame()` runs
// them as the browser does before it paints; the task queued from there runs after the paint.
let frames: FrameRequestCallback[] = [];
const frame = () => { const run = frames; frames = []; for (const f of run) f(performance.now()); };

beforeEach(() => {
  vi.useFakeTimers();
  frames = [];
  vi.stubGlobal('requestAnimationFrame', (f: FrameRequestCallback) => frames.push(f));
});
afterEach(() => {
  vi.useRealTimers();
  vi.unstubAllGlobals();
});

describe('afterPaint', () => {
  it('runs every callback asked for before a frame in one task after that frame, with one frame request', () => {
    const ran: string[] = [];
    afterPaint(() => ran.push('a'));
    afterPaint(() => ran.push('b'));
    expect(frames).toHaveLength(1);
    vi.runAllTimers();
    expect(ran).toEqual([]); // not before the frame
    frame();
    expect(ran).toEqual([]); // not inside it either
    vi.runAllTimers();
    expect(ran).toEqual(['a', 'b']);
  });

  it('makes a callback asked for once a frame has begun wait for the next frame', () => {
    const ran: string[] = [];
    afterPaint(() => ran.push('first'));
    frame();
    afterPaint(() => ran.push('second')); // say, a tap handled between the frame and its task
    vi.runAllTimers();
    expect(ran).toEqual(['first']);
    expect(frames).toHaveLength(1);
    frame();
    vi.runAllTimers();
    expect(ran).toEqual(['first', 'second']);
  });

  it('keeps a function asked for twice as two callbacks: cancelling one leaves the other', () => {
    let n = 0;
    const inc = () => { n++; };
    afterPaint(inc);
    const cancel = afterPaint(inc);
    const other = afterPaint(() => { n += 100; });
    cancel();
    other();
    frame();
    vi.runAllTimers();
    expect(n).toBe(1);
  });
});
