import { and, desc, eq, gt, sql } from 'drizzle-orm';
import type { Tx } from '#server/db/client.ts';
import { invitation, organization, user } from '#server/db/schema/index.ts';

/** A pending, unexpired invitation for this e-mail (any unit), or null. */
export async function findPendingInvitationByEmail(db: Tx, email: string) {
  const [row] = await db.select({ id: invitation.id }).from(invitation)
    .where(and(eq(sql`lower(${invitation.email})`, email.toLowerCase()), eq(invitation.status, 'pending'), gt(invitation.expiresAt, new Date())))
    .orderBy(desc(invitation.createdAt)).limit(1);
  return row ?? null;
}

/** An invitation with its unit's name and hospital, for the accept page. */
export async function findInvitationWithUnit(db: Tx, id: string) {
  const [row] = await db.select({
    id: invitation.id, email: invitation.email, role: invitation.role, status: invitation.status,
    expiresAt: invitation.expiresAt, unitId: organization.id, unitName: organization.name, hospital: organization.hospital,
  }).from(invitation).innerJoin(organization, eq(organization.id, invitation.organizationId))
    .where(eq(invitation.id, id)).limit(1);
  return row ?? null;
}

/** A unit's invitations, newest first. */
export async function listUnitInvitations(db: Tx, unitId: string) {
  return db.select({ id: invitation.id, email: invitation.email, role: invitation.role, status: invitation.status, expiresAt: invitation.expiresAt })
    .from(invitation).where(eq(invitation.organizationId, unitId)).orderBy(desc(invitation.createdAt));
}

export async function userExistsWithEmail(db: Tx, email: string): Promise<boolean> {
  const [row] = await db.select({ id: user.id }).from(user).where(eq(sql`lower(${user.email})`, email.toLowerCase())).limit(1);
  return Boolean(row);
}

export async function markEmailVerified(db: Tx, userId: string): Promise<void> {
  await db.update(user).set({ emailVerified: true }).where(eq(user.id, userId));
}

/** Remove an account (its sessions and sign-in accounts go with it: ON DELETE CASCADE). */
export async function deleteUser(db: Tx, userId: string): Promise<void> {
  await db.delete(user).where(eq(user.id, userId));
}
