import type { Phase, ScopeInterval, TimelineEvent } from '#shared/domain/record/index.ts';

export type SectionKeyOf = 'before_scope' | 'resection' | 'closure' | 'retrieval' | 'scope_in' | 'after_scope';
export type Section = { key: SectionKeyOf; title: string; events: TimelineEvent[] };

const titles: Record<SectionKeyOf, string> = {
  before_scope: 'Before the scope went in', resection: 'Resection', closure: 'Closure', retrieval: 'Retrieval',
  scope_in: 'During the procedure', after_scope: 'After the scope came out',
};

/**
 * The timeline by phase: each event goes to the phase it ends or starts, else to the latest-started
 * phase that contains it (phases may overlap), else to before, during or after the scope; consecutive
 * events of one place make one section, so a phase interrupted by another appears twice, in time order.
 */
export function sectionsOf(timeline: TimelineEvent[], phases: Phase[], scopes: ScopeInterval[]): Section[] {
  const inner = phases.filter((p) => p.name !== 'total');
  const firstIn = scopes[0]?.inMs ?? null;
  const last = scopes.at(-1);
  const lastOut = last && last.outMs !== null ? last.outMs : null;
  const keyOf = (e: TimelineEvent): SectionKeyOf => {
    const ends = inner.find((p) => p.endEventId === e.id);
    if (ends) return ends.name as SectionKeyOf;
    const starts = inner.find((p) => p.startEventId === e.id);
    if (starts) return starts.name as SectionKeyOf;
    const containing = inner.filter((p) => p.startMs <= e.atMs && (p.endMs === null || e.atMs <= p.endMs));
    if (containing.length) return containing.reduce((a, b) => (b.startMs > a.startMs ? b : a)).name as SectionKeyOf;
    if (firstIn === null || e.atMs < firstIn || (e.atMs === firstIn && e.kind !== 'scope_in')) return firstIn === null ? 'scope_in' : 'before_scope';
    if (lastOut !== null && (e.atMs > lastOut || (e.atMs === lastOut && e.kind !== 'scope_out'))) return 'after_scope';
    return 'scope_in';
  };
  const out: Section[] = [];
  for (const e of timeline) {
    const key = keyOf(e);
    const current = out.at(-1);
    if (current && current.key === key) current.events.push(e);
    else out.push({ key, title: titles[key], events: [e] });
  }
  return out;
}
