import { eq } from 'drizzle-orm';
import { correctedTimeMs, newEventSchema } from '#shared/schemas/events.ts';
import type { Tx } from '../client.ts';
import { cases, events } from '../schema/index.ts';
import { demoTimelines, type TimelineContext } from './timelines.ts';

type Kind = keyof TimelineContext['caseIds'];
type ItemKey = keyof TimelineContext['items'];

/** The seed's tablet: one stable device id, as a tablet keeps in IndexedDB. */
export const DEMO_DEVICE_ID = 'demo-tablet-room-a';

export type PastCase = { timeline: Kind; caseId: string; startAt: Date; nurseId: string; endoscopistId: string };

/**
 * Each past case's events, numbered 1…n in the order given, received a moment after they happened;
 * the case then reads as closed at its last event, with lastSeq = n. Each case's team authors its own
 * timeline (server/db/seed/timelines.ts writes the events; the seed only numbers and stores them).
 */
export async function insertDemoTimelines(tx: Tx, past: PastCase[], items: Record<ItemKey, string>): Promise<number> {
  const byKind = <T>(f: (c: PastCase) => T) => Object.fromEntries(past.map((c) => [c.timeline, f(c)])) as Record<Kind, T>;
  let total = 0;
  for (const c of past) {
    const list = demoTimelines({
      caseIds: byKind((x) => x.caseId), startAt: byKind((x) => x.startAt),
      nurseId: c.nurseId, endoscopistId: c.endoscopistId, deviceId: DEMO_DEVICE_ID, items,
    })[c.timeline].map((e) => newEventSchema.parse(e)); // the demo obeys the same contract as a tablet
    if (!list.length) continue;
    await tx.insert(events).values(list.map((e, i) => ({
      id: e.id, caseId: c.caseId, seq: i + 1, kind: e.kind, deviceTime: new Date(e.deviceTime),
      offsetMs: e.offsetMs, offsetUncertaintyMs: e.offsetUncertaintyMs, author: e.author, device: e.device,
      payload: e.payload as Record<string, unknown>, receivedAt: new Date(correctedTimeMs(e) + 400),
    })));
    const lastAt = Math.max(...list.map(correctedTimeMs));
    await tx.update(cases).set({ lastSeq: list.length, status: 'closed', closedAt: new Date(lastAt + 5 * 60_000) }).where(eq(cases.id, c.caseId));
    total += list.length;
  }
  return total;
}
