import { and, asc, eq } from 'drizzle-orm';
import type { Tx } from '#server/db/client.ts';
import { rooms } from '#server/db/schema/index.ts';

/** The unit's rooms in use, by name. */
export async function listRooms(db: Tx, unitId: string) {
  return db.select({ id: rooms.id, name: rooms.name, unitId: rooms.unitId }).from(rooms)
    .where(and(eq(rooms.unitId, unitId), eq(rooms.active, true))).orderBy(asc(rooms.name));
}

/** A room of this unit in use, or null (another unit's room is not found). */
export async function findRoom(db: Tx, unitId: string, roomId: string) {
  const [row] = await db.select({ id: rooms.id, name: rooms.name, unitId: rooms.unitId }).from(rooms)
    .where(and(eq(rooms.id, roomId), eq(rooms.unitId, unitId), eq(rooms.active, true))).limit(1);
  return row ?? null;
}

export async function insertRooms(db: Tx, unitId: string, names: string[]) {
  return db.insert(rooms).values(names.map((name) => ({ unitId, name }))).returning({ id: rooms.id, name: rooms.name, unitId: rooms.unitId });
}
