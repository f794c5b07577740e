import { buildRecord, UNSPECIFIED_ITEM, type CaseRecord, type Phase, type RecordEventInput, type TimelineEvent } from '#shared/domain/record/index.ts';
import { isExpired } from '#shared/domain/identifiers/index.ts';
import type { CatalogueItemRow, DeviceUsageRow, SpecimenRow } from '#server/db/schema/index.ts';
import { procedureTypeLabels, sedationTypeLabels, type CaseStatus, type ParisType, type ProcedureType, type SedationType } from '#shared/schemas/cases.ts';
import type { CatalogueItemType } from '#shared/schemas/catalogue.ts';
import { RECORD_CAUTION, type RecordView, type SectionKey } from '#shared/schemas/record.ts';
import type { HandoffStatus } from '#shared/schemas/specimens.ts';
import { eventLabels, type EventKind } from '#shared/schemas/events.ts';
import { ellipseAreaMm2 } from '#shared/domain/geometry.ts';
import { detailOf, labelOf } from './describe.ts';
import { joinStores } from './joins.ts';
import { sectionsOf } from './sections.ts';

/** The case facts the record shows (a row of the cases query). */
export interface RecordCase {
  id: string; status: string; procedureType: string; scheduledAt: Date; closedAt: Date | null; roomName: string;
  indication: string; lesionSite: string; lesionSizeMm: number; lesionParis: string; sedation: string;
  hospitalNumber: string; familyName: string; givenName: string; birthDate: string; sex: string;
  endoscopistId: string; endoscopistName: string; nurseId: string; nurseName: string;
}

export interface RecordSources {
  caseRow: RecordCase;
  events: RecordEventInput[];
  usages: DeviceUsageRow[];
  specimens: SpecimenRow[];
  items: Map<string, CatalogueItemRow>;
  /** Display names of the people who recorded, by user id. */
  people: Map<string, string>;
  timeZone: string;
  now: Date;
}

/** "Clip, 11 mm"; a description that already says its size is left as it is. */
const withSize = (i: { description: string; sizeLabel: string | null }) => (i.sizeLabel && !i.description.includes(i.sizeLabel) ? `${i.description}, ${i.sizeLabel}` : i.description);
const itemIdOf = (e: TimelineEvent) => ('itemId' in e.payload && typeof e.payload.itemId === 'string' ? e.payload.itemId : null);
const iso = (ms: number) => new Date(ms).toISOString();
const dayIn = (at: Date, timeZone: string) => new Intl.DateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit' }).format(at);
const phaseTitles: Record<Phase['name'], string> = { total: 'Scope in to scope out', resection: 'Resection', closure: 'Closure', retrieval: 'Retrieval' };

/** The record view: `buildRecord` over the joined log, then names, words and the stores' own lists. */
export function buildRecordView(src: RecordSources): RecordView {
  const { caseRow: c, items, people, timeZone } = src;
  const record = buildRecord(joinStores(src.events, src.usages, src.specimens));
  // The timeline shows what was tapped: the same log without the joins (same ids, times and order).
  const tapped = new Map(buildRecord(src.events).timeline.map((e) => [e.id, e]));
  const personOf = (id: string | null) => (id ? { id, name: people.get(id) ?? 'unknown user' } : null);
  const itemName = (id: string) => {
    const item = items.get(id);
    return item ? withSize(item) : id === UNSPECIFIED_ITEM ? 'Devices with no item named' : id;
  };
  const byId = new Map(record.timeline.map((e) => [e.id, e]));
  const voidedIds = new Set(record.voided.map((v) => v.id));

  const entry = (joined: TimelineEvent) => {
    const e = tapped.get(joined.id) ?? joined;
    const fromScan = itemIdOf(joined) && !itemIdOf(e) ? `item: ${itemName(itemIdOf(joined)!)} (from its scan)` : '';
    return {
      id: e.id, at: iso(e.atMs), seq: e.seq, kind: e.kind, label: labelOf(e.kind, e.payload),
      detail: [detailOf(e, itemName), fromScan].filter(Boolean).join(', '),
      author: personOf(e.author), device: e.device, amended: e.amendedBy.length > 0,
    };
  };

  return {
    generatedAt: src.now.toISOString(),
    timeZone,
    case: {
      id: c.id, status: c.status as CaseStatus, procedureType: c.procedureType as ProcedureType,
      procedureLabel: procedureTypeLabels[c.procedureType as ProcedureType] ?? c.procedureType,
      scheduledAt: c.scheduledAt.toISOString(), closedAt: c.closedAt?.toISOString() ?? null, room: c.roomName, indication: c.indication,
      lesion: { site: c.lesionSite, sizeMm: c.lesionSizeMm, paris: c.lesionParis as ParisType },
      sedation: c.sedation as SedationType, sedationLabel: sedationTypeLabels[c.sedation as SedationType] ?? c.sedation,
    },
    patient: { hospitalNumber: c.hospitalNumber, familyName: c.familyName, givenName: c.givenName, birthDate: c.birthDate, sex: c.sex as RecordView['patient']['sex'] },
    team: { endoscopist: { id: c.endoscopistId, name: c.endoscopistName }, nurse: { id: c.nurseId, name: c.nurseName } },
    checks: { timeOut: checkView(record, 'timeOut', byId, personOf), signOut: checkView(record, 'signOut', byId, personOf) },
    phases: record.phases.map((p) => ({ name: p.name, title: phaseTitles[p.name], start: iso(p.startMs), end: p.endMs === null ? null : iso(p.endMs), minutes: p.minutes })),
    totalMinutes: record.totalMinutes,
    idleGaps: record.idleGaps.map((g) => ({ start: iso(g.startMs), end: iso(g.endMs), minutes: g.minutes })),
    sections: sectionsOf(record.timeline, record.phases, record.scopeIntervals).map((s) => ({ key: s.key as SectionKey, title: s.title, entries: s.events.map(entry) })),
    voided: record.voided.map((v) => ({ id: v.id, label: eventLabelOfVoided(v.kind), at: iso(v.atMs) })),
    bleeds: record.bleeds.map((b) => ({
      bleedId: b.bleedId, start: iso(b.startMs), severity: b.severity, vesselMm: b.vesselMm,
      controlledAt: b.controlledMs === null ? null : iso(b.controlledMs), secondsToHaemostasis: b.secondsToHaemostasis,
      attempts: b.attempts, clips: b.clips, coagulations: b.coagulations, methods: b.methods, openAtScopeOut: b.openAtScopeOut,
    })),
    counts: record.counts,
    resection: record.resection,
    devices: deviceRows(record, src, voidedIds, itemName),
    usages: usageRows(src, record, byId, itemName),
    specimens: specimenRows(record, src.specimens, byId),
    specimenSummary: record.specimen,
    authorship: authorship(src.events, personOf),
    notes: record.notes.map((n) => ({ kind: n.kind, text: n.text, caution: n.caution })),
    flags: record.flags.map((f) => ({ code: f.code, message: f.code === 'device_unaccounted' && f.ref ? f.message.replace(`device ${f.ref}`, itemName(f.ref)) : f.message })),
    problems: record.problems,
    caution: RECORD_CAUTION,
  };
}

// A voided event keeps only its kind: "Clip fired", not which way it went.
const eventLabelOfVoided = (kind: string) => eventLabels[kind as EventKind] ?? kind;

function checkView(record: CaseRecord, which: 'timeOut' | 'signOut', byId: Map<string, TimelineEvent>, personOf: (id: string | null) => { id: string; name: string } | null) {
  const check = record[which];
  const e = check.eventId ? byId.get(check.eventId) : undefined;
  const payload = e && (e.kind === 'time_out' || e.kind === 'sign_out') ? e.payload : null;
  return {
    status: check.status, at: check.atMs === null ? null : iso(check.atMs), by: personOf(e?.author ?? null), reason: check.reason,
    items: (payload?.items ?? []).map((i) => ({ key: i.key, label: i.label ?? i.key, answer: i.answer, note: i.note ?? null })),
  };
}

/**
 * The tap each usage belongs to: the usage names it (`eventId`), or the tap names the usage (`usageId`,
 * as tapped or added by an amendment).
 */
function usageLinks(src: RecordSources, timeline: TimelineEvent[]): (u: DeviceUsageRow) => string | null {
  const tapOfUsage = new Map<string, string>();
  const note = (eventId: string, payload: unknown) => {
    const usageId = payload && typeof payload === 'object' ? (payload as { usageId?: unknown }).usageId : undefined;
    if (typeof usageId === 'string' && !tapOfUsage.has(usageId)) tapOfUsage.set(usageId, eventId);
  };
  for (const e of timeline) note(e.id, e.payload);
  for (const e of src.events) note(e.id, e.payload);
  return (u) => u.eventId ?? tapOfUsage.get(u.id) ?? null;
}

function deviceRows(record: CaseRecord, src: RecordSources, voidedIds: Set<string>, itemName: (id: string) => string): RecordView['devices'] {
  const linkOf = usageLinks(src, record.timeline);
  // A scan attached to a voided tap stands for no device used.
  const voided = (u: DeviceUsageRow) => { const id = linkOf(u); return id !== null && voidedIds.has(id); };
  return record.devices.map((t) => {
    const item = src.items.get(t.itemId);
    const lots = new Map<string, { lot: string | null; expiry: string | null; count: number; expired: boolean }>();
    for (const u of src.usages) {
      if (u.itemId !== t.itemId || voided(u)) continue;
      const key = `${u.lot ?? ''}\u0000${u.expiry ?? ''}`;
      const row = lots.get(key) ?? { lot: u.lot, expiry: u.expiry, count: 0, expired: isExpired(u.expiry, dayIn(u.createdAt, src.timeZone)) };
      row.count++;
      lots.set(key, row);
    }
    return {
      itemId: t.itemId, description: itemName(t.itemId), type: (item?.type as CatalogueItemType | undefined) ?? null, sizeLabel: item?.sizeLabel ?? null,
      opened: t.opened, deployed: t.deployed, misfired: t.misfired, wasted: t.wasted, inPatient: t.inPatient, unaccounted: t.unaccounted, flagged: t.flagged,
      lots: [...lots.values()],
    };
  });
}

function usageRows(src: RecordSources, record: CaseRecord, byId: Map<string, TimelineEvent>, itemName: (id: string) => string): RecordView['usages'] {
  const linkOf = usageLinks(src, record.timeline);
  const voidedKinds = new Map(record.voided.map((v) => [v.id, v.kind]));
  return src.usages.map((u) => {
    const eventId = linkOf(u);
    const e = eventId ? byId.get(eventId) : undefined;
    return {
      id: u.id, itemId: u.itemId, description: u.itemId ? itemName(u.itemId) : 'not in the catalogue', scheme: u.scheme as RecordView['usages'][number]['scheme'],
      gtin: u.gtin, lot: u.lot, serial: u.serial, expiry: u.expiry, expired: isExpired(u.expiry, dayIn(u.createdAt, src.timeZone)),
      at: u.createdAt.toISOString(), eventId,
      eventLabel: e ? labelOf(e.kind, e.payload) : eventId && voidedKinds.has(eventId) ? eventLabelOfVoided(voidedKinds.get(eventId)!) : null,
      eventVoided: eventId !== null && voidedKinds.has(eventId),
    };
  });
}

/**
 * The listed specimens, each with its retrieval tap's time (and the tap's method, pieces or axes where the
 * list has none), then the retrievals tapped but not listed.
 */
function specimenRows(record: CaseRecord, listed: SpecimenRow[], byId: Map<string, TimelineEvent>): RecordView['specimens'] {
  const listedIds = new Set(listed.map((s) => s.id));
  const madeId = (s: CaseRecord['specimens'][number]) => {
    const e = byId.get(s.eventId);
    return e?.kind === 'specimen_retrieved' ? e.payload.specimenId : undefined;
  };
  // The first tap naming a listed specimen is shown in its row; every other tap keeps a row of its own.
  const tapOf = new Map<string, CaseRecord['specimens'][number]>();
  for (const s of record.specimens) {
    const id = madeId(s);
    if (id && listedIds.has(id) && !tapOf.has(id)) tapOf.set(id, s);
  }
  const linked = new Set(tapOf.values());
  const rows: RecordView['specimens'] = listed.map((s) => {
    const tapped = tapOf.get(s.id);
    const axes = s.longMm != null && s.shortMm != null ? { longMm: s.longMm, shortMm: s.shortMm } : { longMm: tapped?.longMm ?? s.longMm, shortMm: tapped?.shortMm ?? s.shortMm };
    return {
      id: s.id, tapSpecimenId: null, label: s.label, retrievedAt: tapped ? iso(tapped.atMs) : null,
      retrievalMethod: (s.retrievalMethod as RecordView['specimens'][number]['retrievalMethod']) ?? tapped?.method ?? null,
      pieces: s.pieces ?? tapped?.pieces ?? null, ...axes,
      areaMm2: axes.longMm != null && axes.shortMm != null ? ellipseAreaMm2(axes.longMm, axes.shortMm) : null,
      containerId: s.containerId, handoffStatus: s.handoffStatus as HandoffStatus,
    };
  });
  for (const s of record.specimens) {
    if (linked.has(s)) continue;
    const made = madeId(s);
    rows.push({
      id: null, tapSpecimenId: made && !listedIds.has(made) ? made : null, label: null, retrievedAt: iso(s.atMs), retrievalMethod: s.method,
      pieces: s.pieces, longMm: s.longMm, shortMm: s.shortMm, areaMm2: s.areaMm2, containerId: null, handoffStatus: null,
    });
  }
  return rows;
}

/** Who recorded what and when: every stored event, corrections included, by author. */
function authorship(events: RecordEventInput[], personOf: (id: string | null) => { id: string; name: string } | null): RecordView['authorship'] {
  const by = new Map<string, { events: number; first: number; last: number; devices: Set<string> }>();
  for (const e of events) {
    if (!e.author) continue;
    const a = by.get(e.author) ?? { events: 0, first: e.atMs, last: e.atMs, devices: new Set<string>() };
    a.events++;
    a.first = Math.min(a.first, e.atMs);
    a.last = Math.max(a.last, e.atMs);
    if (e.device) a.devices.add(e.device);
    by.set(e.author, a);
  }
  return [...by.entries()]
    .map(([id, a]) => ({ author: personOf(id)!, events: a.events, first: iso(a.first), last: iso(a.last), devices: [...a.devices].sort() }))
    .sort((x, y) => x.first.localeCompare(y.first));
}
