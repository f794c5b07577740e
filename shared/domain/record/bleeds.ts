import type { BleedEpisode, Problem, ScopeInterval, TimelineEvent } from './types.ts';

/**
 * Bleed episodes, built one event at a time in timeline order (`add`, then `finish`). An episode runs from
 * a bleed to the haemostasis with `achieved: true` that controls it: the one whose `bleedId` names it, else
 * the one that comes while it is the most recent open episode. A haemostasis that names a bleed already
 * controlled belongs to that bleed and controls no other (reported). Within an episode, each haemostasis event
 * and each deployed clip with purpose "haemostasis" is an attempt; those clips and the coagulation events
 * are counted as used for it, and the methods list names each haemostasis method used (a haemostasis clip
 * counts as "clip"). Open episodes are kept on a stack with lazy removal, so naming an older episode
 * costs no search.
 */
export class BleedEpisodes {
  private readonly episodes: BleedEpisode[] = [];
  private readonly byBleedId = new Map<string, BleedEpisode>();
  private readonly open: BleedEpisode[] = [];
  /**
   * Haemostasis events whose named bleed they could not control: one not (yet) seen, or one already
   * controlled. Reported by `finish`, once every bleed is known.
   */
  private readonly misnamed: { eventId: string; named: string; linked: boolean; controlled: boolean }[] = [];

  private top(): BleedEpisode | null {
    const open = this.open;
    while (open.length > 0 && open[open.length - 1]!.controlledMs !== null) open.pop();
    return open[open.length - 1] ?? null;
  }

  add(e: TimelineEvent): void {
    if (e.kind === 'bleed') {
      const ep: BleedEpisode = {
        bleedId: e.id, startMs: e.atMs, severity: e.payload.severity ?? null, vesselMm: e.payload.vesselMm ?? null,
        controlledMs: null, controlledBy: null, secondsToHaemostasis: null, attempts: 0, clips: 0, coagulations: 0, methods: [], openAtScopeOut: false,
      };
      this.episodes.push(ep);
      this.byBleedId.set(e.id, ep);
      this.open.push(ep);
    } else if (e.kind === 'haemostasis') {
      let ep: BleedEpisode | null = null;
      const named = e.payload.bleedId;
      if (named !== undefined) {
        const candidate = this.byBleedId.get(named);
        // Named, and already controlled (a second tablet's tap for the same bleed, say): it belongs to that
        // bleed, so it controls no other one; reported for a person to look at.
        if (candidate && candidate.controlledMs !== null) { this.misnamed.push({ eventId: e.id, named, linked: false, controlled: true }); return; }
        if (candidate) ep = candidate;
        else {
          ep = this.top();
          this.misnamed.push({ eventId: e.id, named, linked: ep !== null, controlled: false });
        }
      } else ep = this.top();
      if (!ep) return; // haemostasis with no open bleed (prophylactic treatment): not an episode's attempt
      ep.attempts++;
      if (e.payload.method && !ep.methods.includes(e.payload.method)) ep.methods.push(e.payload.method);
      if (e.payload.achieved) {
        ep.controlledMs = e.atMs;
        ep.controlledBy = e.id;
        ep.secondsToHaemostasis = (e.atMs - ep.startMs) / 1000;
      }
    } else if (e.kind === 'clip_fired' && e.payload.outcome === 'deployed' && e.payload.purpose === 'haemostasis') {
      const ep = this.top();
      if (ep) {
        ep.attempts++;
        ep.clips++;
        if (!ep.methods.includes('clip')) ep.methods.push('clip');
      }
    } else if (e.kind === 'coagulation') {
      const ep = this.top();
      if (ep) ep.coagulations++;
    }
  }

  /** The episodes, with "open at scope out" set; a haemostasis that named an unknown bleed is reported. */
  finish(scopes: ScopeInterval[], problems: Problem[]): BleedEpisode[] {
    for (const { eventId, named, linked, controlled } of this.misnamed) {
      const what = controlled ? 'a bleed already controlled' : this.byBleedId.has(named) ? 'a bleed recorded after it' : 'no bleed on the record';
      const outcome = controlled ? 'not linked to another bleed' : linked ? 'linked to the most recent open bleed instead' : 'no bleed was open, so it is linked to none';
      problems.push({ code: 'unknown_bleed', eventId, message: `haemostasis ${eventId} names ${named}, ${what}; ${outcome}` });
    }
    // "Open at scope out": uncontrolled when the scope came out for the last time (not while it is still in).
    const last = scopes[scopes.length - 1];
    const finalOut = last && last.outMs !== null ? last.outMs : null;
    if (finalOut !== null) {
      for (const ep of this.episodes) {
        ep.openAtScopeOut = ep.startMs <= finalOut && (ep.controlledMs === null || ep.controlledMs > finalOut);
      }
    }
    return this.episodes;
  }
}
