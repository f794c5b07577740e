import { afterEach, describe, expect, it, vi } from 'vitest';
import { onSignOut, runSignOutHooks } from '@/lib/sign-out-hooks.ts';

const unregister: (() => void)[] = [];
afterEach(() => { for (const u of unregister.splice(0)) u(); });

describe('what a sign-out undoes elsewhere in the app', () => {
  it('runs every hook once per sign-out, until it is unregistered', () => {
    const a = vi.fn();
    const b = vi.fn();
    unregister.push(onSignOut(a));
    const offB = onSignOut(b);
    runSignOutHooks();
    offB();
    runSignOutHooks();
    expect(a).toHaveBeenCalledTimes(2);
    expect(b).toHaveBeenCalledTimes(1);
  });

  it('goes on past a hook that throws, so the rest of the sign-out (clearing patient data) still runs', () => {
    const warn = vi.spyOn(console, 'warn').mockImplementation(() => undefined);
    const after = vi.fn();
    unregister.push(onSignOut(() => { throw new Error('socket already gone'); }), onSignOut(after));
    expect(() => runSignOutHooks()).not.toThrow();
    expect(after).toHaveBeenCalledOnce();
    expect(warn).toHaveBeenCalledWith('A sign-out hook failed', expect.any(Error));
    warn.mockRestore();
  });
});
