import { afterEach, beforeEach, vi } from 'vitest';

// An unexpected console.error fails the test that caused it; a test that expects one spies on it itself.
let calls: unknown[][] = [];
beforeEach(() => {
  calls = [];
  vi.spyOn(console, 'error').mockImplementation((...args: unknown[]) => { calls.push(args); });
});
afterEach(() => {
  vi.mocked(console.error).mockRestore();
  if (calls.length) throw new Error(`console.error was called:\n${calls.map((c) => c.map(String).join(' ')).join('\n')}`);
});
