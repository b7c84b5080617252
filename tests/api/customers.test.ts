import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { customerContacts, customers } from '../../server/db/schema';
import { csrf, testApp } from '../helpers/app';
import { customerAgent, newCompany, newOrder, uniquePo } from '../helpers/orders';

const t = testApp();
afterAll(() => t.close());

let office: Awaited<ReturnType<typeof t.signIn>>;
beforeAll(async () => {
  office = await t.signIn('office');
});

const address = { line1: '5 Invented Lane', city: 'Nowhere Junction', postalCode: 'NJ1 1AA', country: 'Testland' };

describe('customers', () => {
  it('creates a company with addresses and contacts in one go, and reads it back', async () => {
    const name = `Fernwhistle Pumps ${uniquePo()}`;
    const res = await office
      .post('/api/customers')
      .set(csrf)
      .send({
        name,
        notes: 'Pays late; call first',
        billingAddress: address,
        contacts: [
          { name: 'Ada Inventa', email: 'Ada@Example.test', phone: '+00 1 555 0100', notifyOrders: true },
          { name: 'Bo Fictive', email: 'bo@example.test', notifyShipping: true },
        ],
      });
    expect(res.status).toBe(201);
    const c = res.body.customer;
    expect(c).toMatchObject({ name, notes: 'Pays late; call first', billingAddress: { ...address, line2: '', region: '' }, shippingAddress: null, orders: [] });
    expect(c.contacts).toEqual([
      { id: expect.any(Number), name: 'Ada Inventa', email: 'ada@example.test', phone: '+00 1 555 0100', notifyOrders: true, notifyShipping: false },
      { id: expect.any(Number), name: 'Bo Fictive', email: 'bo@example.test', phone: '', notifyOrders: false, notifyShipping: true },
    ]);
    const read = await (await t.signIn('engineer')).get(`/api/customers/${c.id}`);
    expect(read.status).toBe(200);
    expect(read.body.customer.contacts).toHaveLength(2);
  });

  it('names each bad field (400) and writes nothing', async () => {
    const name = `Half Written ${uniquePo()}`;
    const res = await office
      .post('/api/customers')
      .set(csrf)
      .send({
        name,
        billingAddress: { line1: '1 Some Road' },
        contacts: [{ name: 'Ok Person', email: 'ok@example.test' }, { name: '', email: 'not-an-address' }, { name: 'No Mail', notifyOrders: true }],
      });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation');
    expect(res.body.error.fields).toMatchObject({
      'billingAddress.city': expect.stringMatching(/town/i),
      'billingAddress.country': expect.any(String),
      'contacts.1.name': expect.any(String),
      'contacts.1.email': 'Not an e-mail address',
      'contacts.2.email': expect.stringMatching(/needs an e-mail/i),
    });
    expect(await t.deps.db.query.customers.findFirst({ where: eq(customers.name, name) })).toBeUndefined();
  });

  it('refuses a second company of the same name in another case (409 with fields.name)', async () => {
    const c = await newCompany(office);
    const res = await office.post('/api/customers').set(csrf).send({ name: c.name.toUpperCase() });
    expect(res.status).toBe(409);
    expect(res.body.error.fields.name).toBeTruthy();
  });

  it('edits a company and replaces its contacts in one transaction', async () => {
    const c = await newCompany(office, [
      { name: 'Keep Me', email: 'keep@example.test' },
      { name: 'Drop Me', email: 'drop@example.test' },
    ]);
    const [keep] = c.contacts;
    const res = await office
      .patch(`/api/customers/${c.id}`)
      .set(csrf)
      .send({
        shippingAddress: address,
        contacts: [{ name: 'New Person', email: 'new@example.test', notifyOrders: true }, { id: keep.id, name: 'Keep Me Renamed', email: 'keep@example.test' }],
      });
    expect(res.status).toBe(200);
    expect(res.body.customer.shippingAddress).toMatchObject(address);
    expect(res.body.customer.contacts.map((x: { name: string; id: number }) => [x.name, x.id === keep.id])).toEqual([
      ['New Person', false],
      ['Keep Me Renamed', true],
    ]);
  });

  it('a bad contact id leaves company and contacts untouched', async () => {
    const other = await newCompany(office, [{ name: 'Someone Else' }]);
    const c = await newCompany(office, [{ name: 'Original' }]);
    const res = await office
      .patch(`/api/customers/${c.id}`)
      .set(csrf)
      .send({ name: `${c.name} renamed`, contacts: [{ name: 'Fresh' }, { id: other.contacts[0].id, name: 'Stolen' }] });
    expect(res.status).toBe(400);
    expect(res.body.error.fields['contacts.1.id']).toMatch(/no such contact/i);
    const row = await t.deps.db.query.customers.findFirst({ where: eq(customers.id, c.id) });
    expect(row!.name).toBe(c.name);
    const rows = await t.deps.db.select().from(customerContacts).where(eq(customerContacts.customerId, c.id));
    expect(rows.map((r) => r.name)).toEqual(['Original']);
    expect((await office.patch(`/api/customers/${c.id}`).set(csrf).send({})).status).toBe(400);
    expect((await office.patch('/api/customers/999999').set(csrf).send({ name: 'X' })).status).toBe(404);
  });

  it('lists companies with a search over names, contacts and towns', async () => {
    const tag = uniquePo('zq').toLowerCase();
    const c = await newCompany(office, [{ name: 'Searchable Contact', email: `${tag}@example.test` }]);
    const shipping = await t.signIn('shipping');
    const all = await shipping.get('/api/customers');
    expect(all.status).toBe(200);
    expect(all.body.customers.length).toBeGreaterThanOrEqual(8);
    const found = await shipping.get(`/api/customers?q=${encodeURIComponent(tag)}`);
    expect(found.body.customers).toEqual([
      { id: c.id, name: c.name, city: '', country: '', contactCount: 1, orderCount: 0, openOrderCount: 0 },
    ]);
    const pct = await shipping.get('/api/customers?q=%25');
    expect(pct.status).toBe(200); // a % is searched for literally, not as a wildcard
  });

  it("a customer user reads only its own company (others' → 404), without internal notes", async () => {
    const mine = await newCompany(office, [{ name: 'Mine' }]);
    await office.patch(`/api/customers/${mine.id}`).set(csrf).send({ notes: 'internal: slow payer' });
    await newOrder(office, mine.id);
    const other = await newCompany(office);
    const buyer = await customerAgent(t, mine.id);
    const own = await buyer.get(`/api/customers/${mine.id}`);
    expect(own.status).toBe(200);
    expect(own.body.customer.notes).toBeUndefined();
    expect(JSON.stringify(own.body)).not.toMatch(/slow payer/);
    expect(own.body.customer.orders).toHaveLength(1);
    const theirs = await buyer.get(`/api/customers/${other.id}`);
    expect(theirs.status).toBe(404);
    expect((await buyer.get('/api/customers')).status).toBe(403);
    expect((await buyer.patch(`/api/customers/${mine.id}`).set(csrf).send({ name: 'Mine' })).status).toBe(403);
  });
});
