import type { SessionUser } from '../../src/contracts/auth';
import type {
  Address,
  ContactRecord,
  CreateCustomerRequest,
  CustomerDetail,
  CustomerSummary,
  UpdateCustomerRequest,
} from '../../src/contracts/customers';
import { EMPTY_ADDRESS } from '../../src/contracts/customers';
import type { Db, Tx } from '../db/client';
import { HttpError, badRequest, notFound } from '../http/errors';
import { listOrders } from '../orders/service';
import * as repo from './repository';

type ContactList = NonNullable<UpdateCustomerRequest['contacts']>;

const isUniqueViolation = (e: unknown) =>
  (e as { code?: string }).code === '23505' || (e as { cause?: { code?: string } }).cause?.code === '23505';
const nameTaken = () => new HttpError(409, 'conflict', 'A customer with this name exists already', { name: 'Already in use by another customer' });

function toContact(c: repo.ContactRow): ContactRecord {
  return { id: c.id, name: c.name, email: c.email, phone: c.phone, notifyOrders: c.notifyOrders, notifyShipping: c.notifyShipping };
}

/** Customer-role users see only their own company; for them any other company does not exist. */
function assertMayRead(viewer: SessionUser, customerId: number) {
  if (viewer.role === 'customer' && viewer.customerId !== customerId) throw notFound('No such customer');
}

export async function listCustomers(db: Db, q?: string): Promise<CustomerSummary[]> {
  return repo.listCustomers(db, q || undefined);
}

export async function getCustomer(db: Db, viewer: SessionUser, id: number): Promise<CustomerDetail> {
  assertMayRead(viewer, id);
  const row = await repo.findCustomer(db, id);
  if (!row) throw notFound('No such customer');
  const contacts = await repo.listContacts(db, id);
  const orders = await listOrders(db, viewer, { customerId: id });
  return {
    id: row.id,
    name: row.name,
    ...(viewer.role !== 'customer' && { notes: row.notes }),
    billingAddress: { ...EMPTY_ADDRESS, ...row.billingAddress },
    shippingAddress: row.shippingAddress ? { ...EMPTY_ADDRESS, ...row.shippingAddress } : null,
    contacts: contacts.map(toContact),
    orders: orders.map((o) => ({
      id: o.id,
      number: o.number,
      purchaseOrder: o.purchaseOrder,
      status: o.status,
      orderDate: o.orderDate,
      dueDate: o.dueDate,
      late: o.late,
    })),
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
  };
}

/** Writes the whole contact list: listed ids change, new entries are added, the rest removed. */
async function writeContacts(tx: Tx, customerId: number, contacts: ContactList) {
  const ids = contacts.flatMap((c) => (c.id ? [c.id] : []));
  const dupes = ids.filter((id, i) => ids.indexOf(id) !== i);
  if (dupes.length) {
    const i = contacts.findIndex((c, k) => c.id === dupes[0] && k > contacts.findIndex((x) => x.id === dupes[0]));
    throw badRequest('A contact is listed twice', { [`contacts.${i}.id`]: 'This contact is listed twice' });
  }
  const known = new Set((await repo.contactIdsOf(tx, customerId, ids)).map((r) => r.id));
  const fields: Record<string, string> = {};
  contacts.forEach((c, i) => {
    if (c.id && !known.has(c.id)) fields[`contacts.${i}.id`] = 'No such contact at this customer';
  });
  if (Object.keys(fields).length) throw badRequest('Some contacts do not belong to this customer', fields);
  await repo.deleteContactsExcept(tx, customerId, ids);
  const fresh: Parameters<typeof repo.insertContacts>[1] = [];
  for (const [position, c] of contacts.entries()) {
    const values = { name: c.name, email: c.email, phone: c.phone, notifyOrders: c.notifyOrders, notifyShipping: c.notifyShipping, position };
    if (c.id) await repo.updateContact(tx, customerId, c.id, values);
    else fresh.push({ ...values, customerId });
  }
  await repo.insertContacts(tx, fresh);
}

/** Creates a company with its contacts in one transaction. */
export async function createCustomer(db: Db, input: CreateCustomerRequest, viewer: SessionUser): Promise<CustomerDetail> {
  if (await repo.findCustomerByName(db, input.name)) throw nameTaken();
  if (input.contacts.some((c) => c.id)) {
    const i = input.contacts.findIndex((c) => c.id);
    throw badRequest('A new customer has no contacts to change yet', { [`contacts.${i}.id`]: 'Leave out the id for a new contact' });
  }
  let id: number;
  try {
    id = await db.transaction(async (tx) => {
      const row = await repo.insertCustomer(tx, {
        name: input.name,
        notes: input.notes,
        billingAddress: input.billingAddress as Address,
        shippingAddress: input.shippingAddress as Address | null,
      });
      await writeContacts(tx, row.id, input.contacts);
      return row.id;
    });
  } catch (e) {
    if (isUniqueViolation(e)) throw nameTaken(); // two offices entering the same company at once
    throw e;
  }
  return getCustomer(db, viewer, id);
}

/** Changes a company and, when given, replaces its contact list, in one transaction. */
export async function updateCustomer(db: Db, id: number, input: UpdateCustomerRequest, viewer: SessionUser): Promise<CustomerDetail> {
  try {
    await db.transaction(async (tx) => {
      const row = await repo.lockCustomer(tx, id);
      if (!row) throw notFound('No such customer');
      if (input.name !== undefined && input.name.toLowerCase() !== row.name.toLowerCase()) {
        const other = await repo.findCustomerByName(tx, input.name);
        if (other && other.id !== id) throw nameTaken();
      }
      const { contacts, ...fields } = input;
      if (Object.keys(fields).length || contacts) await repo.updateCustomer(tx, id, fields as Parameters<typeof repo.updateCustomer>[2]);
      if (contacts) await writeContacts(tx, id, contacts);
    });
  } catch (e) {
    if (isUniqueViolation(e)) throw nameTaken();
    throw e;
  }
  return getCustomer(db, viewer, id);
}
