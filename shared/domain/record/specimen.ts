import { ellipseAreaMm2, mm2PerMinute } from '../geometry.ts';
import type { Phase, Specimen, SpecimenSummary, TimelineEvent } from './types.ts';

export function specimens(timeline: TimelineEvent[]): Specimen[] {
  const out: Specimen[] = [];
  for (const e of timeline) {
    if (e.kind !== 'specimen_retrieved') continue;
    const { longMm = null, shortMm = null } = e.payload;
    out.push({
      eventId: e.id, atMs: e.atMs, method: e.payload.method ?? null, pieces: e.payload.pieces ?? null, longMm, shortMm,
      areaMm2: longMm !== null && shortMm !== null ? ellipseAreaMm2(longMm, shortMm) : null,
    });
  }
  return out;
}

/** Total measured area and the resection speed: that area per minute of the (closed) resection phase. */
export function specimenSummary(list: Specimen[], phases: Phase[]): SpecimenSummary {
  const measured = list.filter((s) => s.areaMm2 !== null);
  const areaMm2 = measured.length > 0 ? measured.reduce((sum, s) => sum + s.areaMm2!, 0) : null;
  const resection = phases.find((p) => p.name === 'resection');
  return { count: list.length, areaMm2, resectionSpeedMm2PerMin: mm2PerMinute(areaMm2, resection?.minutes ?? null) };
}
