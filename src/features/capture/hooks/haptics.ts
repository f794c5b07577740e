/**
 * A short buzz to confirm a tap through gloves, where the device has a vibration motor (Vibration API).
 * Patterns in ms; kept short so they never read as an alarm.
 */
export const haptic = {
  tap: 12,
  undo: [8, 40, 8],
  refused: [30, 60, 30],
} as const;

export function vibrate(pattern: number | readonly number[]): void {
  if (typeof navigator === 'undefined' || typeof navigator.vibrate !== 'function') return;
  try {
    navigator.vibrate(pattern as number | number[]);
  } catch {
    // Some browsers throw before any user activation; a missing buzz is harmless.
  }
}
