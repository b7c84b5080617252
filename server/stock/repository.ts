import { and, asc, eq, inArray, sql, type SQL } from 'drizzle-orm';
import type { WireSize } from '../../src/contracts/stock';
import type { Db, Tx } from '../db/client';
import { spoolReservations, spools, users } from '../db/schema';

export type SpoolRow = typeof spools.$inferSelect;
export type WireKey = { conductor: SpoolRow['conductor']; wire: WireSize; insulationGrade: number };

/** Reserved mass of a spool, kg (qualified by hand: inside the subquery a bare name would bind to the inner table). */
const reservedSql = sql<number>`(select coalesce(sum(r.mass), 0)::float8 from ${spoolReservations} r where r.spool_id = "spools"."id")`;

/** Spools of exactly this conductor, size and insulation grade (a metric diameter within 1 ppm). */
function sameWire(k: WireKey): SQL {
  const size =
    k.wire.standard === 'AWG'
      ? and(eq(spools.wireStandard, 'AWG'), eq(spools.awgGauge, k.wire.gauge))
      : and(eq(spools.wireStandard, 'metric'), sql`abs(${spools.diameter} - ${k.wire.diameter}) <= ${k.wire.diameter * 1e-6}`);
  return and(eq(spools.conductor, k.conductor), size, eq(spools.insulationGrade, k.insulationGrade))!;
}

/** Locks the spools of a wire (id order, so concurrent releases queue rather than deadlock). */
export async function lockSpools(tx: Tx, k: WireKey) {
  await tx.select({ id: spools.id }).from(spools).where(sameWire(k)).orderBy(asc(spools.id)).for('update');
}

/** Spools of a wire with their reserved mass, oldest lot first (received date, then id). */
export function spoolsOfWire(db: Db | Tx, k: WireKey) {
  return db
    .select({ spool: spools, reserved: reservedSql })
    .from(spools)
    .where(sameWire(k))
    .orderBy(asc(spools.receivedAt), asc(spools.id));
}

export function listSpools(db: Db | Tx, f: { conductor?: SpoolRow['conductor']; available?: boolean }) {
  return db
    .select({ spool: spools, reserved: reservedSql, receiverName: users.name })
    .from(spools)
    .leftJoin(users, eq(users.id, spools.receivedBy))
    .where(
      and(
        f.conductor ? eq(spools.conductor, f.conductor) : undefined,
        f.available === true ? sql`${spools.netMass} - ${reservedSql} > 0` : f.available === false ? sql`${spools.netMass} - ${reservedSql} <= 0` : undefined,
      ),
    )
    .orderBy(asc(spools.conductor), asc(spools.wireStandard), asc(spools.awgGauge), asc(spools.diameter), asc(spools.receivedAt), asc(spools.id));
}

export async function findSpool(db: Db | Tx, id: number) {
  const [row] = await db
    .select({ spool: spools, reserved: reservedSql, receiverName: users.name })
    .from(spools)
    .leftJoin(users, eq(users.id, spools.receivedBy))
    .where(eq(spools.id, id));
  return row;
}

export async function insertSpool(db: Db | Tx, values: typeof spools.$inferInsert) {
  const [row] = await db.insert(spools).values(values).returning();
  return row;
}

export async function insertReservations(tx: Tx, rows: (typeof spoolReservations.$inferInsert)[]) {
  if (rows.length) await tx.insert(spoolReservations).values(rows);
}

/** Gives back the wire set aside for these work orders. */
export async function deleteReservations(tx: Tx, workOrderIds: number[]) {
  if (workOrderIds.length) await tx.delete(spoolReservations).where(inArray(spoolReservations.workOrderId, workOrderIds));
}

/** Spools of this wire carrying a lot number (any case): the lot a winder wound a job from. */
export function spoolsOfWireWithLot(db: Db | Tx, k: WireKey, lot: string) {
  return db
    .select({ id: spools.id })
    .from(spools)
    .where(and(sameWire(k), sql`lower(${spools.lot}) = ${lot.toLowerCase()}`))
    .limit(1);
}
