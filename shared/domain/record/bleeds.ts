import type { BleedEpisode, Problem, ScopeInterval, TimelineEvent } from './types.ts';

type HaemostasisEvent = Extract<TimelineEvent, { kind: 'haemostasis' }>;

/**
 * Bleed episodes, built one event at a time in timeline order (`add`, then `finish`). An episode runs from
 * a bleed to the haemostasis with `achieved: true` that controls it: the one whose `bleedId` names it, else
 * the one that comes while it is the most recent open episode. A haemostasis that names a bleed belongs to
 * that bleed: to one already controlled, it controls no other (reported); to one that comes a moment later
 * on the timeline (two tablets whose clocks differ), it is held until that bleed joins and then controls it
 * as it is recorded (reported too). Within an episode, each haemostasis event and each deployed clip with
 * purpose "haemostasis" is an attempt; those clips and the coagulation events are counted as used for it,
 * and the methods list names each haemostasis method used (a haemostasis clip counts as "clip"). Open
 * episodes are kept on a stack with lazy removal, so naming an older episode costs no search.
 */
export class BleedEpisodes {
  private readonly episodes: BleedEpisode[] = [];
  private readonly byBleedId = new Map<string, BleedEpisode>();
  private readonly open: BleedEpisode[] = [];
  /** Haemostasis events held for the bleed they name, which joins the timeline after them. */
  private readonly ahead = new Map<string, HaemostasisEvent[]>();
  /** Haemostasis events whose naming of a bleed could not be followed as it stands: reported by `finish`. */
  private readonly misnamed: { eventId: string; named: string; what: string; outcome: string }[] = [];
  /** The kind of the event with this id if it is on the timeline (valid, not voided), else null. */
  private kindOf: (id: string) => string | null = () => null;

  /** How to tell that a named bleed is still to come: given once the corrections are applied. */
  lookAhead(kindOf: (id: string) => string | null): void {
    this.kindOf = kindOf;
  }

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
      const held = this.ahead.get(e.id);
      if (held) {
        this.ahead.delete(e.id);
        for (const h of held) {
          if (ep.controlledMs === null) this.misnamed.push({ eventId: h.id, named: e.id, what: 'a bleed recorded after it (the tablets\' clocks may differ)', outcome: 'linked to it' });
          this.treat(ep, h);
        }
      }
    } else if (e.kind === 'haemostasis') {
      const named = e.payload.bleedId;
      if (named === undefined) {
        const ep = this.top();
        if (ep) this.treat(ep, e); // with no open bleed (prophylactic treatment): not an episode's attempt
        return;
      }
      const candidate = this.byBleedId.get(named);
      if (candidate) { this.treat(candidate, e); return; }
      if (this.kindOf(named) === 'bleed') {
        const held = this.ahead.get(named);
        if (held) held.push(e); else this.ahead.set(named, [e]);
        return;
      }
      const ep = this.top();
      this.misnamed.push({ eventId: e.id, named, what: 'no bleed on the record', outcome: ep ? 'linked to the most recent open bleed instead' : 'no bleed was open, so it is linked to none' });
      if (ep) this.treat(ep, e);
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

  /**
   * A haemostasis for this episode: an attempt, and its control when achieved. An episode already
   * controlled (a second tablet's tap for the same bleed, say) takes no more: that one is reported. A
   * haemostasis held for a bleed recorded after it controls it as the bleed is recorded.
   */
  private treat(ep: BleedEpisode, h: HaemostasisEvent): void {
    if (ep.controlledMs !== null) {
      this.misnamed.push({ eventId: h.id, named: ep.bleedId, what: 'a bleed already controlled', outcome: 'not linked to another bleed' });
      return;
    }
    ep.attempts++;
    if (h.payload.method && !ep.methods.includes(h.payload.method)) ep.methods.push(h.payload.method);
    if (h.payload.achieved) {
      ep.controlledMs = Math.max(h.atMs, ep.startMs);
      ep.controlledBy = h.id;
      ep.secondsToHaemostasis = (ep.controlledMs - ep.startMs) / 1000;
    }
  }

  /** The episodes, with "open at scope out" set; the haemostasis events that named a bleed amiss are reported. */
  finish(scopes: ScopeInterval[], problems: Problem[]): BleedEpisode[] {
    // Held for a bleed that never joined (the look-ahead and the timeline disagree: not expected).
    for (const [named, held] of this.ahead) for (const h of held) this.misnamed.push({ eventId: h.id, named, what: 'no bleed on the record', outcome: 'linked to none' });
    for (const { eventId, named, what, outcome } of this.misnamed) {
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
