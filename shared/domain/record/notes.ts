import { circumferenceMm, COMPUTED_NOTE_CAUTION, ramanujanPerimeterMm } from '../geometry.ts';
import type { ComputedNote, Specimen, SpecimenSummary, TimelineEvent } from './types.ts';

const mm = (x: number) => x.toFixed(1);

/**
 * Computed geometric notes for the record, each carrying the caution: the specimen area (ellipse), the
 * resection speed, and the defect perimeter (Ramanujan's first approximation, on the largest specimen's
 * axes, else a muscle defect's size as a circle) beside the circumference of each sized loop.
 */
export function computedNotes(timeline: TimelineEvent[], list: Specimen[], summary: SpecimenSummary): ComputedNote[] {
  const notes: ComputedNote[] = [];
  const note = (kind: ComputedNote['kind'], text: string, values: Record<string, number>) => notes.push({ kind, text, values, caution: COMPUTED_NOTE_CAUTION });
  if (summary.areaMm2 !== null) {
    note('specimen_area', `Specimen area ≈ ${mm(summary.areaMm2)} mm² (ellipse, π/4 × long × short axis).`, { areaMm2: summary.areaMm2 });
  }
  if (summary.resectionSpeedMm2PerMin !== null) {
    note('resection_speed', `Resection speed ≈ ${mm(summary.resectionSpeedMm2PerMin)} mm² per minute of the resection phase.`, { mm2PerMin: summary.resectionSpeedMm2PerMin });
  }
  const loops: { sizeMm: number }[] = [];
  let defectMm: number | null = null;
  for (const e of timeline) {
    if (e.kind === 'loop_placed' && e.payload.sizeMm !== undefined) loops.push({ sizeMm: e.payload.sizeMm });
    if (e.kind === 'muscle_defect' && e.payload.sizeMm !== undefined) defectMm = Math.max(defectMm ?? 0, e.payload.sizeMm);
  }
  const largest = list.reduce<Specimen | null>((best, s) => (s.areaMm2 !== null && (!best || s.areaMm2 > best.areaMm2!) ? s : best), null);
  const basis = largest ? { longMm: largest.longMm!, shortMm: largest.shortMm!, from: 'the specimen' } : defectMm !== null ? { longMm: defectMm, shortMm: defectMm, from: 'the muscle defect size, as a circle' } : null;
  if (basis && loops.length > 0) {
    const perimeter = ramanujanPerimeterMm(basis.longMm, basis.shortMm)!;
    const circles = loops.map((l) => `${mm(circumferenceMm(l.sizeMm)!)} mm for the ${mm(l.sizeMm)} mm loop`).join(', ');
    const values: Record<string, number> = { defectPerimeterMm: perimeter, defectLongMm: basis.longMm, defectShortMm: basis.shortMm };
    loops.forEach((l, i) => { values[`loop${i + 1}CircumferenceMm`] = circumferenceMm(l.sizeMm)!; });
    note('defect_perimeter', `Defect perimeter ≈ ${mm(perimeter)} mm (Ramanujan's approximation for an ellipse of ${mm(basis.longMm)} × ${mm(basis.shortMm)} mm, from ${basis.from}); loop circumference π × diameter: ${circles}.`, values);
  }
  return notes;
}
