import { and, asc, eq } from 'drizzle-orm';
import type { Tx } from '#server/db/client.ts';
import { member, organization, user } from '#server/db/schema/index.ts';

/** The unit a user joined first (their home unit), or null for a user of no unit. */
export async function firstMembership(db: Tx, userId: string) {
  const [row] = await db.select({ organizationId: member.organizationId, role: member.role }).from(member)
    .where(eq(member.userId, userId)).orderBy(asc(member.createdAt)).limit(1);
  return row ?? null;
}

/** The user's membership in one unit, with the unit (for the request's actor). */
export async function findMembership(db: Tx, userId: string, unitId: string) {
  const [row] = await db.select({
    role: member.role, unitId: organization.id, unitName: organization.name, hospital: organization.hospital, timeZone: organization.timeZone,
  }).from(member).innerJoin(organization, eq(organization.id, member.organizationId))
    .where(and(eq(member.userId, userId), eq(member.organizationId, unitId))).limit(1);
  return row ?? null;
}

/** Members of a unit, optionally of one role, by name. */
export async function listMembers(db: Tx, unitId: string, role?: string) {
  return db.select({ userId: user.id, name: user.name, email: user.email, role: member.role }).from(member)
    .innerJoin(user, eq(user.id, member.userId))
    .where(and(eq(member.organizationId, unitId), role ? eq(member.role, role) : undefined))
    .orderBy(asc(user.name));
}

/** Is this user a member of the unit with this role? */
export async function hasRole(db: Tx, unitId: string, userId: string, role: string): Promise<boolean> {
  const [row] = await db.select({ id: member.id }).from(member)
    .where(and(eq(member.organizationId, unitId), eq(member.userId, userId), eq(member.role, role))).limit(1);
  return Boolean(row);
}
