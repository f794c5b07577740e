import { GS } from '#shared/domain/identifiers/index.ts';

/**
 * A hand-held scanner set up as a keyboard ("keyboard wedge") types a whole code within tens of
 * milliseconds and ends it with Enter; a person types far slower (common practice: scanners send a
 * character every few ms, people at best every 50–100 ms). The group separator arrives as the control
 * character, or as Ctrl+] (the keyboard chord for ASCII 29).
 */
export type KeyLike = { key: string; ctrlKey?: boolean };

/** The character a key stands for in a code, 'end' for Enter, or null for keys that carry none. */
export function keyToChar(e: KeyLike): string | 'end' | null {
  if (e.key === 'Enter') return 'end';
  if (e.key === GS || (e.ctrlKey && (e.key === ']' || e.key === '5'))) return GS;
  if (e.ctrlKey) return null;
  return e.key.length === 1 ? e.key : null;
}

export class WedgeDetector {
  private buffer = '';
  private last = Number.NEGATIVE_INFINITY;

  constructor(private readonly maxGapMs = 40, private readonly minLength = 6) {}

  /** Feeds one key pressed at `atMs`; answers the code when a fast burst ends with Enter. */
  feed(e: KeyLike, atMs: number): string | null {
    const c = keyToChar(e);
    if (c === null) return null;
    const fast = atMs - this.last <= this.maxGapMs;
    if (c === 'end') {
      const code = fast && this.buffer.length >= this.minLength ? this.buffer : null;
      this.reset();
      return code;
    }
    if (!fast) this.buffer = '';
    this.buffer += c;
    this.last = atMs;
    return null;
  }

  reset(): void {
    this.buffer = '';
    this.last = Number.NEGATIVE_INFINITY;
  }
}
