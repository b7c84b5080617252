import { afterAll, describe, expect, it } from 'vitest';
import { csrf, testApp, uniqueEmail } from '../helpers/app';
import { PASSWORD } from '../helpers/orders';

const t = testApp();
afterAll(() => t.close());

type Agent = Awaited<ReturnType<typeof t.signIn>>;
const HEADER =
  'company,notes,billing_street,billing_line2,billing_city,billing_region,billing_postal_code,billing_country,shipping_street,shipping_line2,shipping_city,shipping_region,shipping_postal_code,shipping_country,contact_name,contact_email,contact_phone,contact_order_notices,contact_shipping_notices';
const tag = `${process.pid}-${Date.now().toString(36)}`;

/** 200 customers, one contact each (invented names); `bad` maps a 0-based data row to a broken row. */
function customersCsv(bad: Record<number, string> = {}) {
  const rows = Array.from({ length: 200 }, (_, i) =>
    bad[i] ?? `Import Test Works ${tag} ${i},,${i} Mill Road,,Eastmere,,EM${i},Nordland,,,,,,,Contact ${i},contact${i}@import.example,,yes,no`,
  );
  return [HEADER, ...rows].join('\r\n') + '\r\n';
}

const send = (agent: Agent, path: string, csv: string) => agent.post(path).set(csrf).attach('file', Buffer.from(csv, 'utf8'), { filename: 'import.csv', contentType: 'text/csv' });

async function countCustomers() {
  const r = await t.deps.pool.query<{ n: string }>(`select count(*) as n from customers where name like $1`, [`Import Test Works ${tag}%`]);
  return Number(r.rows[0].n);
}

describe('importing customers from CSV', () => {
  // Spreadsheet rows: header = row 1, data row i = row i + 2.
  const broken = {
    17: `Import Test Works ${tag} 17,,17 Mill Road,,Eastmere,,EM17,Nordland,,,,,,,Contact 17,not-an-address,,no,no`,
    88: `Import Test Works ${tag} 88,,88 Mill Road,,,,EM88,Nordland,,,,,,,Contact 88,c88@import.example,,no,no`,
    150: `Import Test Works ${tag} 150,,150 Mill Road,,Eastmere,,EM150,Nordland,,,,,,,,,,yes,no`,
  };

  it('reports exactly the three bad rows of 200 in a dry run and commits nothing until they are fixed', async () => {
    const office = await t.signIn('office');
    const dry = await send(office, '/api/imports/customers/dry-run', customersCsv(broken));
    expect(dry.status, JSON.stringify(dry.body).slice(0, 400)).toBe(200);
    expect(dry.body.rowCount).toBe(200);
    expect(dry.body.ok).toBe(false);
    const bad = dry.body.rows.filter((r: { problems: unknown[] }) => r.problems.length > 0);
    expect(bad.map((r: { row: number }) => r.row)).toEqual([19, 90, 152]);
    expect(bad[0].problems).toEqual([{ column: 'contact_email', message: 'Not an e-mail address' }]);
    expect(bad[1].problems).toEqual([{ column: 'billing_city', message: 'Enter the town or city' }]);
    expect(bad[2].problems[0].column).toBe('contact_name');
    expect(dry.body.rows[0].creates).toBe(`customer “Import Test Works ${tag} 0” (Eastmere, Nordland) with contact Contact 0 — order notices`);

    const refused = await send(office, '/api/imports/customers/commit', customersCsv(broken));
    expect(refused.status).toBe(422);
    expect(refused.body.error.report.rows.filter((r: { problems: unknown[] }) => r.problems.length).length).toBe(3);
    expect(await countCustomers()).toBe(0);

    const fixed = await send(office, '/api/imports/customers/commit', customersCsv());
    expect(fixed.status, JSON.stringify(fixed.body).slice(0, 400)).toBe(201);
    expect(fixed.body.totals).toEqual({ customers: 200, contacts: 200 });
    expect(await countCustomers()).toBe(200);
    const one = await office.get(`/api/customers/${fixed.body.ids[5]}`);
    expect(one.body.customer.contacts[0]).toMatchObject({ name: 'Contact 5', email: 'contact5@import.example', notifyOrders: true, notifyShipping: false });
    expect(one.body.customer.billingAddress).toMatchObject({ line1: '5 Mill Road', city: 'Eastmere', postalCode: 'EM5', country: 'Nordland' });

    // The same file again: every company exists now, so every row is refused and nothing doubles.
    const again = await send(office, '/api/imports/customers/dry-run', customersCsv());
    expect(again.body.rows.filter((r: { problems: unknown[] }) => r.problems.length).length).toBe(200);
  });

  it('groups rows of one company into one customer with several contacts, and flags a differing address', async () => {
    const office = await t.signIn('office');
    const name = `Import Group ${tag}`;
    const csv = [
      HEADER,
      `${name},,1 Dock St,,Westharbour,,,Nordland,,,,,,,Ana Lind,ana@group.example,,yes,yes`,
      `${name},,,,,,,,,,,,,,Bo Steen,bo@group.example,,no,yes`,
      `${name},,2 Dock St,,,,,,,,,,,,Cy Moor,,,,`,
    ].join('\n');
    const dry = await send(office, '/api/imports/customers/dry-run', csv);
    expect(dry.body.rows.map((r: { row: number; problems: { column: string }[] }) => [r.row, r.problems.map((p) => p.column)])).toEqual([
      [2, []],
      [3, []],
      [4, ['billing_street']],
    ]);
    expect(dry.body.totals).toEqual({ customers: 1, contacts: 3 });
  });

  it('names unknown and missing columns, and refuses roles other than office and admin', async () => {
    const office = await t.signIn('office');
    const dry = await send(office, '/api/imports/customers/dry-run', 'company,colour\nA,red\n');
    expect(dry.body.ok).toBe(false);
    expect(dry.body.fileProblems[0]).toMatch(/^Unknown column "colour"/);
    const floor = await t.signIn('floor');
    expect((await send(floor, '/api/imports/customers/dry-run', customersCsv())).status).toBe(403);
  });
});

describe('importing spools and open orders in the user’s units', () => {
  it('reads an inch user’s template (lb, °F, in) and reports in those units', async () => {
    const admin = await t.signIn('admin');
    const email = uniqueEmail('inches');
    const made = await admin.post('/api/users').set(csrf).send({ email, name: 'Inch Office', role: 'office', password: PASSWORD });
    expect(made.status).toBe(201);
    const inch = await t.signIn({ email, password: PASSWORD });
    expect((await inch.patch('/api/me').set(csrf).send({ lengthUnit: 'in', temperatureUnit: 'F' })).status).toBe(200);

    const tpl = await inch.get('/api/imports/spools/template.csv');
    expect(tpl.status).toBe(200);
    expect(tpl.headers['content-type']).toMatch(/^text\/csv/);
    expect(tpl.text.split('\r\n')[0]).toContain('net_mass_lb');

    // 22.046 lb = 10.000 kg (1 lb = 0.45359237 kg exactly, NIST SP 811 appendix B).
    const spools = `${tpl.text.trim()}\r\naluminium,AWG,25,,1,Import Wire Co,IMP-${tag},22.046,Rack Z,2024-01-05\r\naluminium,AWG,25,,1,Import Wire Co,IMP2-${tag},5000,Rack Z,\r\n`;
    const dry = await send(inch, '/api/imports/spools/dry-run', spools);
    expect(dry.body.rows[0].problems).toEqual([]);
    expect(dry.body.rows[0].creates).toMatch(/22\.05\slb/);
    // 2000 kg is the contract's limit: 4409 lb (2000 / 0.45359237 = 4409.2).
    expect(dry.body.rows[1].problems).toEqual([{ column: 'net_mass_lb', message: 'at most 4409 lb' }]);

    const ok = await send(inch, '/api/imports/spools/commit', spools.split('\r\n').slice(0, 2).join('\r\n'));
    expect(ok.status, JSON.stringify(ok.body)).toBe(201);
    const list = await inch.get('/api/spools');
    const spool = list.body.spools.find((s: { id: number }) => s.id === ok.body.ids[0]);
    expect(spool.netMass).toBeCloseTo(10.0, 3);

    const customer = await inch.post('/api/customers').set(csrf).send({ name: `Import Orders ${tag}` });
    expect(customer.status).toBe(201);
    const cols = await inch.get('/api/imports/orders/columns');
    const header = cols.body.columns.map((c: { name: string }) => c.name);
    expect(header).toContain('ambient_f');
    expect(header).toContain('bobbin_outer_diameter_in');
    const row = (po: string, title: string, ambientF: string) => {
      const v: Record<string, string> = {
        customer: `Import Orders ${tag}`, purchase_order: po, due_date: '2031-06-30', line_title: title, quantity: '40', drive: 'voltage', drive_value: '24',
        duty_cycle_percent: '100', ambient_f: ambientF, insulation_class: '155', bobbin_inner_diameter_in: '0.5', bobbin_outer_diameter_in: '1.25',
        bobbin_length_in: '1.5', target: 'ampere-turns', target_value: '800',
      };
      return header.map((h: string) => v[h] ?? '').join(',');
    };
    // 104 °F = 40 °C; 0.5 in = 12.7 mm (NIST SP 811 §4.2.1.1 and appendix B). 500 °F = 260 °C is above the contract's 250 °C limit.
    const orders = [header.join(','), row(`PO-A-${tag}`, 'Coil one', '104'), row(`PO-A-${tag}`, 'Coil two', '104'), row(`PO-B-${tag}`, 'Coil three', '500')].join('\n');
    const dryOrders = await send(inch, '/api/imports/orders/dry-run', orders);
    expect(dryOrders.body.rows.map((r: { problems: { column: string }[] }) => r.problems.map((p) => p.column))).toEqual([[], [], ['ambient_f']]);
    // 250 °C = 482 °F (°F = °C × 9/5 + 32, NIST SP 811 §4.2.1.1).
    expect(dryOrders.body.rows[2].problems[0].message).toBe('at most 482 °F');
    expect(dryOrders.body.rows[0].creates).toContain('ambient 104.0');
    const committed = await send(inch, '/api/imports/orders/commit', orders.split('\n').slice(0, 3).join('\n'));
    expect(committed.status, JSON.stringify(committed.body).slice(0, 300)).toBe(201);
    expect(committed.body.totals).toEqual({ orders: 1, lines: 2 });
    const order = await inch.get(`/api/orders/${committed.body.ids[0]}`);
    expect(order.body.order.status).toBe('entered');
    expect(order.body.order.lines.map((l: { title: string }) => l.title)).toEqual(['Coil one', 'Coil two']);
    expect(order.body.order.lines[0].requirement.ambient).toBeCloseTo(40, 9);
    expect(order.body.order.lines[0].requirement.bobbin.innerDiameter).toBeCloseTo(0.0127, 12);
  });
});
