import type { RecordEventInput } from '#shared/domain/record/index.ts';
import type { DeviceUsageRow, SpecimenRow } from '#server/db/schema/index.ts';

/**
 * What the stores beside the event log add to the reducer's input, before `buildRecord` runs. Two joins,
 * each filling only a field the tap left empty (what was tapped always stands):
 * - a device tap that named no catalogue item takes the item of the scan attached to it (the usage's
 *   `eventId`, or the tap's `usageId`), so the device table counts it under that item;
 * - a `specimen_retrieved` tap that names a listed specimen (`specimenId`) takes the list's method,
 *   pieces and axes, which the nurse often measures after the tap (the pinned specimen).
 * Amendments still apply on top, as they do to every event.
 */
const DEVICE_KINDS = new Set(['clip_fired', 'loop_placed', 'device_applied', 'device_opened', 'device_wasted']);

type Usage = Pick<DeviceUsageRow, 'id' | 'eventId' | 'itemId'>;
type Listed = Pick<SpecimenRow, 'id' | 'retrievalMethod' | 'pieces' | 'longMm' | 'shortMm'>;

const asObject = (p: unknown): Record<string, unknown> => (p && typeof p === 'object' && !Array.isArray(p) ? { ...(p as Record<string, unknown>) } : {});

export function joinStores(events: RecordEventInput[], usages: Usage[], specimens: Listed[]): RecordEventInput[] {
  const usageByEvent = new Map<string, Usage>();
  const usageById = new Map<string, Usage>();
  for (const u of usages) {
    usageById.set(u.id, u);
    if (u.eventId && u.itemId && !usageByEvent.has(u.eventId)) usageByEvent.set(u.eventId, u);
  }
  const listed = new Map(specimens.map((s) => [s.id, s]));
  return events.map((e) => {
    if (DEVICE_KINDS.has(e.kind)) {
      const p = asObject(e.payload);
      if (p.itemId !== undefined) return e;
      const u = usageByEvent.get(e.id) ?? (typeof p.usageId === 'string' ? usageById.get(p.usageId) : undefined);
      return u?.itemId ? { ...e, payload: { ...p, itemId: u.itemId } } : e;
    }
    if (e.kind === 'specimen_retrieved') {
      const p = asObject(e.payload);
      const s = typeof p.specimenId === 'string' ? listed.get(p.specimenId) : undefined;
      if (!s) return e;
      const fill: Record<string, unknown> = {};
      if (p.method === undefined && s.retrievalMethod) fill.method = s.retrievalMethod;
      if (p.pieces === undefined && s.pieces != null) fill.pieces = s.pieces;
      // The two axes go together: one from the tap and one from the list would describe no one ellipse.
      if (p.longMm === undefined && p.shortMm === undefined && s.longMm != null && s.shortMm != null) { fill.longMm = s.longMm; fill.shortMm = s.shortMm; }
      return Object.keys(fill).length ? { ...e, payload: { ...p, ...fill } } : e;
    }
    return e;
  });
}
