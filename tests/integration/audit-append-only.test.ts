import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq, sql } from 'drizzle-orm';
import { auditLog } from '#server/db/schema/index.ts';
import { createTestContext, type TestContext } from './helpers/app.ts';
import { buildUnit } from './factories.ts';

let t: TestContext;
let entryId: number;

beforeAll(async () => {
  t = await createTestContext();
  const unit = await buildUnit(t);
  const [row] = await t.db.insert(auditLog)
    .values({ unitId: unit.id, action: 'case.view', entityType: 'case', entityId: 'invented-case', detail: {} })
    .returning({ id: auditLog.id });
  entryId = Number(row!.id);
});
afterAll(() => t.close());

describe('the audit log is append-only in the database itself', () => {
  it('refuses an UPDATE of an entry', async () => {
    await expect(t.db.update(auditLog).set({ action: 'edited' }).where(eq(auditLog.id, entryId)))
      .rejects.toMatchObject({ cause: expect.objectContaining({ message: 'audit_log is append-only: UPDATE is refused' }) });
  });

  it('refuses a DELETE of an entry', async () => {
    await expect(t.db.delete(auditLog).where(eq(auditLog.id, entryId)))
      .rejects.toMatchObject({ cause: expect.objectContaining({ message: 'audit_log is append-only: DELETE is refused' }) });
  });

  it('refuses a TRUNCATE', async () => {
    const attempt = t.db.transaction(async (tx) => {
      await tx.execute(sql`truncate audit_log`);
      throw new Error('TRUNCATE went through');
    });
    await expect(attempt)
      .rejects.toMatchObject({ cause: expect.objectContaining({ message: 'audit_log is append-only: TRUNCATE is refused' }) });
  });

  it('keeps the entry as it was written', async () => {
    const [row] = await t.db.select({ action: auditLog.action }).from(auditLog).where(eq(auditLog.id, entryId));
    expect(row?.action).toBe('case.view');
  });
});
