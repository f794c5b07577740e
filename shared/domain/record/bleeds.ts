import type { BleedEpisode, Problem, ScopeInterval, TimelineEvent } from './types.ts';

/**
 * Bleed episodes, in one pass over the timeline. An episode runs from a bleed to the haemostasis with
 * `achieved: true` that controls it: the one whose `bleedId` names it, else the one that comes while it is
 * the most recent open episode. Within an episode, each haemostasis event and each deployed clip with
 * purpose "haemostasis" is an attempt; those clips and the coagulation events are counted as used for
 * it, and the methods list names each haemostasis method used (a haemostasis clip counts as "clip").
 * Open episodes are kept on a stack with lazy removal, so naming an older episode costs no search.
 */
export function bleedEpisodes(timeline: TimelineEvent[], scopes: ScopeInterval[], problems: Problem[]): BleedEpisode[] {
  const episodes: BleedEpisode[] = [];
  const byBleedId = new Map<string, BleedEpisode>();
  const bleedAt = new Map<string, number>();
  for (const e of timeline) if (e.kind === 'bleed') bleedAt.set(e.id, e.atMs);
  const open: BleedEpisode[] = [];
  const top = (): BleedEpisode | null => {
    while (open.length > 0 && open[open.length - 1]!.controlledMs !== null) open.pop();
    return open[open.length - 1] ?? null;
  };

  for (const e of timeline) {
    if (e.kind === 'bleed') {
      const ep: BleedEpisode = {
        bleedId: e.id, startMs: e.atMs, severity: e.payload.severity ?? null, vesselMm: e.payload.vesselMm ?? null,
        controlledMs: null, controlledBy: null, secondsToHaemostasis: null, attempts: 0, clips: 0, coagulations: 0, methods: [], openAtScopeOut: false,
      };
      episodes.push(ep);
      byBleedId.set(e.id, ep);
      open.push(ep);
    } else if (e.kind === 'haemostasis') {
      let ep: BleedEpisode | null = null;
      const named = e.payload.bleedId;
      if (named !== undefined) {
        const candidate = byBleedId.get(named);
        if (candidate && candidate.controlledMs === null) ep = candidate;
        else if (!candidate) {
          const why = bleedAt.has(named) ? 'a bleed recorded after it' : 'no bleed on the record';
          problems.push({ code: 'unknown_bleed', eventId: e.id, message: `haemostasis ${e.id} names ${named}, ${why}; linked to the most recent open bleed instead` });
        }
      }
      ep ??= top();
      if (!ep) continue; // haemostasis with no open bleed (prophylactic treatment): not an episode's attempt
      ep.attempts++;
      if (e.payload.method && !ep.methods.includes(e.payload.method)) ep.methods.push(e.payload.method);
      if (e.payload.achieved) {
        ep.controlledMs = e.atMs;
        ep.controlledBy = e.id;
        ep.secondsToHaemostasis = (e.atMs - ep.startMs) / 1000;
      }
    } else if (e.kind === 'clip_fired' && e.payload.outcome === 'deployed' && e.payload.purpose === 'haemostasis') {
      const ep = top();
      if (ep) {
        ep.attempts++;
        ep.clips++;
        if (!ep.methods.includes('clip')) ep.methods.push('clip');
      }
    } else if (e.kind === 'coagulation') {
      const ep = top();
      if (ep) ep.coagulations++;
    }
  }

  // "Open at scope out": uncontrolled when the scope came out for the last time (not while it is still in).
  const last = scopes[scopes.length - 1];
  const finalOut = last && last.outMs !== null ? last.outMs : null;
  if (finalOut !== null) {
    for (const ep of episodes) {
      ep.openAtScopeOut = ep.startMs <= finalOut && (ep.controlledMs === null || ep.controlledMs > finalOut);
    }
  }
  return episodes;
}
