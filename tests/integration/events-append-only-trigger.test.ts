import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq, sql } from 'drizzle-orm';
import { v7 as uuidv7 } from 'uuid';
import { cases, events } from '#server/db/schema/index.ts';
import { createTestContext, type TestContext } from './helpers/app.ts';
import { buildCase, buildMember, buildUnit } from './factories.ts';

let t: TestContext;
let caseId: string;
let eventId: string;

const anEvent = (seq: number, id = uuidv7()) => ({
  id, caseId, seq, kind: 'remark', deviceTime: new Date('2025-03-14T09:00:00Z'), offsetMs: 12.5,
  offsetUncertaintyMs: 3, author: 'test-author', device: 'tablet-test', payload: { text: 'Invented remark' },
});

beforeAll(async () => {
  t = await createTestContext();
  const unit = await buildUnit(t);
  const [endoscopist, nurse] = await Promise.all([buildMember(t, unit, 'endoscopist'), buildMember(t, unit, 'nurse')]);
  caseId = (await buildCase(t, unit, { endoscopist, nurse })).id;
  eventId = uuidv7();
  await t.db.insert(events).values(anEvent(1, eventId));
});
afterAll(() => t.close());

describe('the events table is append-only in the database itself', () => {
  it('stores an appended event with the server receipt time', async () => {
    const [row] = await t.db.select().from(events).where(eq(events.id, eventId));
    expect(row).toMatchObject({ caseId, seq: 1, kind: 'remark', offsetMs: 12.5, payload: { text: 'Invented remark' } });
    expect(row!.receivedAt).toBeInstanceOf(Date);
  });

  it('refuses an UPDATE with a message that says why', async () => {
    await expect(t.db.update(events).set({ kind: 'bleed' }).where(eq(events.id, eventId)))
      .rejects.toMatchObject({ cause: expect.objectContaining({ message: 'events is append-only: UPDATE is refused' }) });
  });

  it('refuses a DELETE', async () => {
    await expect(t.db.delete(events).where(eq(events.id, eventId)))
      .rejects.toMatchObject({ cause: expect.objectContaining({ message: 'events is append-only: DELETE is refused' }) });
  });

  it('refuses a TRUNCATE, even with CASCADE', async () => {
    // Inside a transaction that never commits: should the trigger ever be missing, nothing is lost.
    const attempt = t.db.transaction(async (tx) => {
      await tx.execute(sql`truncate events cascade`);
      throw new Error('TRUNCATE went through');
    });
    await expect(attempt)
      .rejects.toMatchObject({ cause: expect.objectContaining({ message: 'events is append-only: TRUNCATE is refused' }) });
  });

  it('leaves the event as it was after the refusals', async () => {
    const [row] = await t.db.select({ kind: events.kind }).from(events).where(eq(events.id, eventId));
    expect(row?.kind).toBe('remark');
  });

  it('refuses a second event with the same sequence number in the case', async () => {
    await expect(t.db.insert(events).values(anEvent(1))).rejects.toMatchObject({ cause: expect.objectContaining({ code: '23505' }) });
  });

  it('refuses a second event with the same id (the tablet-made id is stored once)', async () => {
    await expect(t.db.insert(events).values(anEvent(2, eventId))).rejects.toMatchObject({ cause: expect.objectContaining({ code: '23505' }) });
  });

  it('still lets the case row change (only events are append-only)', async () => {
    await t.db.update(cases).set({ lastSeq: 1 }).where(eq(cases.id, caseId));
    const [row] = await t.db.select({ lastSeq: cases.lastSeq }).from(cases).where(eq(cases.id, caseId));
    expect(row?.lastSeq).toBe(1);
  });
});
