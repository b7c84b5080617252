import { and, asc, eq, ne, sql } from 'drizzle-orm';
import type { Db, Tx } from '../db/client';
import { customers, sessions, users } from '../db/schema';

export type UserRow = typeof users.$inferSelect;

export function findUserByEmail(db: Db | Tx, email: string) {
  return db.query.users.findFirst({ where: sql`lower(${users.email}) = ${email.trim().toLowerCase()}` });
}

export function findUserById(db: Db | Tx, id: number) {
  return db.query.users.findFirst({ where: eq(users.id, id) });
}

export function listUsersWithCompany(db: Db) {
  return db
    .select({ user: users, customerName: customers.name })
    .from(users)
    .leftJoin(customers, eq(customers.id, users.customerId))
    .orderBy(asc(users.name));
}

/** Active admins, locked for the rest of the transaction (the last-admin rule reads this). */
export async function lockActiveAdmins(tx: Tx) {
  const rows = await tx.select({ id: users.id }).from(users).where(and(eq(users.role, 'admin'), eq(users.active, true))).for('update');
  return rows.map((r) => r.id);
}

/** Ends every session of a user (after deactivation or a password reset), but `keepSid` when given. */
export async function deleteSessionsOf(db: Db | Tx, userId: number, keepSid?: string) {
  const own = sql`(${sessions.sess}::jsonb -> 'passport' ->> 'user') = ${String(userId)}`;
  await db.delete(sessions).where(keepSid ? and(own, ne(sessions.sid, keepSid)) : own);
}

export function customerExists(db: Db | Tx, id: number) {
  return db.query.customers.findFirst({ where: eq(customers.id, id), columns: { id: true } });
}

export function listCustomerOptions(db: Db) {
  return db.select({ id: customers.id, name: customers.name }).from(customers).orderBy(asc(customers.name));
}
