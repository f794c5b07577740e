import type { BleedEpisode, CheckRecord, DeviceTally, RecordFlag, ScopeInterval } from './types.ts';

/** Whether the scope was in at `atMs`: an interval began at or before it and had not ended by then. */
export function scopeInAt(scopes: readonly ScopeInterval[], atMs: number): boolean {
  return scopes.some((s) => s.inMs <= atMs && (s.outMs === null || s.outMs > atMs));
}

/** What the team should look at before signing: open bleeds, unreconciled devices, the time-out, a sign-out too early. */
export function recordFlags(bleeds: BleedEpisode[], devices: DeviceTally[], timeOut: CheckRecord, scopes: ScopeInterval[], signOut: CheckRecord): RecordFlag[] {
  const flags: RecordFlag[] = [];
  for (const b of bleeds) {
    if (b.openAtScopeOut) flags.push({ code: 'bleed_open_at_scope_out', message: 'a bleed had no haemostasis recorded when the scope came out', ref: b.bleedId });
  }
  for (const d of devices) {
    if (d.flagged) {
      const what = d.unaccounted > 0 ? `${d.unaccounted} opened but not recorded as used or wasted` : `${-d.unaccounted} more used or wasted than opened`;
      flags.push({ code: 'device_unaccounted', message: `device ${d.itemId}: ${what}`, ref: d.itemId });
    }
  }
  const firstIn = scopes[0]?.inMs ?? null;
  if (timeOut.status === 'skipped') flags.push({ code: 'time_out_skipped', message: `time-out skipped: ${timeOut.reason ?? 'no reason given'}`, ref: timeOut.eventId });
  else if (timeOut.status === 'missing' && firstIn !== null) flags.push({ code: 'time_out_missing', message: 'no time-out was recorded before the scope went in', ref: null });
  else if (timeOut.status === 'present' && firstIn !== null && timeOut.atMs! > firstIn) {
    flags.push({ code: 'time_out_after_scope_in', message: 'the time-out was recorded after the scope went in', ref: timeOut.eventId });
  }
  // Signed out with the scope in: the record closed before the scope came out, so no scope out (nor
  // anything but an amendment) can be taken any more, and the total time stays unknown.
  if (signOut.status !== 'missing' && signOut.atMs !== null && scopeInAt(scopes, signOut.atMs)) {
    flags.push({ code: 'sign_out_scope_in', message: 'the sign-out was recorded while the scope was in', ref: signOut.eventId });
  }
  return flags;
}
