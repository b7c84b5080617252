import { and, asc, eq, inArray, notInArray, sql } from 'drizzle-orm';
import type { Db, Tx } from '../db/client';
import { customerContacts, customers, orders } from '../db/schema';

export type CustomerRow = typeof customers.$inferSelect;
export type ContactRow = typeof customerContacts.$inferSelect;
type NewContact = typeof customerContacts.$inferInsert;

// Qualified by hand: inside a subquery drizzle's bare column name would bind to the inner table.
const CUSTOMER_ID = sql.raw('"customers"."id"');
const OPEN_STATUSES = sql`('entered','acknowledged','in_production','partly_shipped')`;

/** Companies with counts, optionally matching a search over name, contacts and billing town. */
export function listCustomers(db: Db | Tx, q?: string) {
  const like = q ? `%${q.replace(/[\\%_]/g, (c) => `\\${c}`)}%` : undefined;
  return db
    .select({
      id: customers.id,
      name: customers.name,
      city: sql<string>`coalesce(${customers.billingAddress} ->> 'city', '')`,
      country: sql<string>`coalesce(${customers.billingAddress} ->> 'country', '')`,
      contactCount: sql<number>`(select count(*)::int from ${customerContacts} c where c.customer_id = ${CUSTOMER_ID})`,
      orderCount: sql<number>`(select count(*)::int from ${orders} o where o.customer_id = ${CUSTOMER_ID})`,
      openOrderCount: sql<number>`(select count(*)::int from ${orders} o where o.customer_id = ${CUSTOMER_ID} and o.status in ${OPEN_STATUSES})`,
    })
    .from(customers)
    .where(
      like
        ? sql`(${customers.name} ilike ${like} or ${customers.billingAddress} ->> 'city' ilike ${like} or exists (
            select 1 from ${customerContacts} c where c.customer_id = ${CUSTOMER_ID} and (c.name ilike ${like} or c.email ilike ${like})))`
        : undefined,
    )
    .orderBy(asc(customers.name));
}

export function findCustomer(db: Db | Tx, id: number) {
  return db.query.customers.findFirst({ where: eq(customers.id, id) });
}

/** Locks the company row for the rest of the transaction (edits to it and its contacts queue). */
export async function lockCustomer(tx: Tx, id: number) {
  const [row] = await tx.select().from(customers).where(eq(customers.id, id)).for('update');
  return row;
}

export function findCustomerByName(db: Db | Tx, name: string) {
  return db.query.customers.findFirst({ where: sql`lower(${customers.name}) = ${name.trim().toLowerCase()}` });
}

export function listContacts(db: Db | Tx, customerId: number) {
  return db.select().from(customerContacts).where(eq(customerContacts.customerId, customerId)).orderBy(asc(customerContacts.position), asc(customerContacts.id));
}

export async function insertCustomer(tx: Tx, values: typeof customers.$inferInsert) {
  const [row] = await tx.insert(customers).values(values).returning();
  return row;
}

export async function updateCustomer(tx: Tx, id: number, values: Partial<typeof customers.$inferInsert>) {
  await tx.update(customers).set({ ...values, updatedAt: new Date() }).where(eq(customers.id, id));
}

export async function insertContacts(tx: Tx, rows: NewContact[]) {
  if (rows.length) await tx.insert(customerContacts).values(rows);
}

export async function updateContact(tx: Tx, customerId: number, id: number, values: Partial<NewContact>) {
  await tx
    .update(customerContacts)
    .set({ ...values, updatedAt: new Date() })
    .where(and(eq(customerContacts.id, id), eq(customerContacts.customerId, customerId)));
}

/** Removes the company's contacts whose ids are not kept. */
export async function deleteContactsExcept(tx: Tx, customerId: number, keep: number[]) {
  await tx
    .delete(customerContacts)
    .where(and(eq(customerContacts.customerId, customerId), keep.length ? notInArray(customerContacts.id, keep) : undefined));
}

export function contactIdsOf(db: Db | Tx, customerId: number, ids: number[]) {
  if (!ids.length) return Promise.resolve([] as { id: number }[]);
  return db
    .select({ id: customerContacts.id })
    .from(customerContacts)
    .where(and(eq(customerContacts.customerId, customerId), inArray(customerContacts.id, ids)));
}
