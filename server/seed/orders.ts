/**
 * Demo seed: the invented shop's customers, their contacts and a few dozen orders in every
 * status, spread over past and coming weeks, with some small drawings in the object store.
 * Everything goes through the services (customers, orders, attachments). All companies,
 * people, streets, towns and countries here are invented.
 */
import PDFDocument from 'pdfkit';
import { sql } from 'drizzle-orm';
import { deflateSync } from 'node:zlib';
import type { SessionUser } from '../../src/contracts/auth';
import type { CreateCustomerRequest } from '../../src/contracts/customers';
import { createCustomerRequest, updateCustomerRequest } from '../../src/contracts/customers';
import type { OrderStatus, RequirementInput } from '../../src/contracts/orders';
import { createOrderRequest } from '../../src/contracts/orders';
import { uploadAttachment } from '../attachments/service';
import { config } from '../config';
import { createCustomer, updateCustomer } from '../customers/service';
import * as customerRepo from '../customers/repository';
import type { Db } from '../db/client';
import { orders } from '../db/schema';
import { createStorage, type Storage } from '../infra/storage';
import { acknowledgeOrder, cancelOrder, createOrder, moveOrder, today } from '../orders/service';
import { findUserByEmail } from '../users/repository';
import { toSessionUser } from '../users/service';

type CompanySeed = Omit<CreateCustomerRequest, 'notes' | 'shippingAddress' | 'contacts'> & {
  notes?: string;
  shippingAddress?: CreateCustomerRequest['shippingAddress'];
  contacts: { name: string; email?: string; phone?: string; notifyOrders?: boolean; notifyShipping?: boolean }[];
  /** Short code used in the demo's purchase-order and part numbers. */
  code: string;
};

const addr = (line1: string, city: string, postalCode: string, country: string, region = '') => ({
  line1,
  line2: '',
  city,
  region,
  postalCode,
  country,
});

/** Eight invented companies; the first already exists from the 'demo-users' step. */
export const DEMO_COMPANIES: CompanySeed[] = [
  {
    code: 'PVS',
    name: 'Pellridge Valve Systems',
    notes: 'Demo customer. Prefers class F (155) on every valve coil; pays on 30 days.',
    billingAddress: addr('14 Tallowmere Road', 'Pellridge Cross', 'PX4 7RD', 'Estvaria'),
    shippingAddress: addr('Unit 3, Sorrel Yard', 'Pellridge Cross', 'PX4 9SY', 'Estvaria'),
    contacts: [
      { name: 'Ottilie Brannagh', email: 'ottilie.brannagh@pellridge.example', phone: '+00 41 555 0142', notifyOrders: true },
      { name: 'Barnaby Quist', email: 'goods-in@pellridge.example', phone: '+00 41 555 0177', notifyShipping: true },
    ],
  },
  {
    code: 'QDW',
    name: 'Quillon Dosing Works',
    billingAddress: addr('2 Fennick Lane', 'Quillon Harbour', 'QH2 1FL', 'Estvaria'),
    contacts: [
      { name: 'Halvard Stemmings', email: 'h.stemmings@quillon-dosing.example', phone: '+00 43 555 0610', notifyOrders: true, notifyShipping: true },
    ],
  },
  {
    code: 'VDC',
    name: 'Varnholt Door Controls',
    notes: 'Holding magnets for fire doors; asks for a certificate with every batch.',
    billingAddress: addr('88 Osperlin Avenue', 'Varnholt', '7731', 'Norlund', 'Upper Carrow'),
    contacts: [
      { name: 'Wenna Caldbrook', email: 'purchasing@varnholt.example', phone: '+00 52 555 0199', notifyOrders: true },
      { name: 'Tamsin Orrell', email: 'tamsin.orrell@varnholt.example', notifyShipping: true },
      { name: 'Ivo Peskett', phone: '+00 52 555 0123' },
    ],
  },
  {
    code: 'KPM',
    name: 'Kestrimar Packaging Machines',
    billingAddress: addr('Hall 6, Brackenmoor Park', 'Kestrimar', 'K19 3BP', 'Estvaria'),
    contacts: [
      // No contact asks for order notices: the first contact is written to instead.
      { name: 'Delphine Arkwell', email: 'd.arkwell@kestrimar.example', phone: '+00 44 555 0871' },
      { name: 'Rowan Fettiplace', email: 'stores@kestrimar.example', notifyShipping: true },
    ],
  },
  {
    code: 'URE',
    name: 'Ulvenfold Rail Equipment',
    notes: 'Track-side actuators: ambient to 70 °C, class H (180).',
    billingAddress: addr('1 Signal House, Gorran Street', 'Ulvenfold', '4410', 'Norlund'),
    contacts: [
      { name: 'Casimir Thorne-Abbott', email: 'c.thorne-abbott@ulvenfold-rail.example', notifyOrders: true },
      { name: 'Linnea Moss-Haverly', email: 'l.moss-haverly@ulvenfold-rail.example', phone: '+00 52 555 0304', notifyOrders: true, notifyShipping: true },
    ],
  },
  {
    code: 'CMD',
    name: 'Corvane Medical Devices',
    billingAddress: addr('40 Wrenfield Close', 'Corvane St. Aldous', 'CS8 2WC', 'Estvaria'),
    contacts: [{ name: 'Esmé Galloway-Prynne', email: 'supply@corvane-med.example', phone: '+00 41 555 0455', notifyOrders: true, notifyShipping: true }],
  },
  {
    code: 'BVS',
    name: 'Brassoway Vending Systems',
    billingAddress: addr('7 Copperkettle Row', 'Brassoway', 'BW1 6CR', 'Estvaria'),
    contacts: [
      // Phone only: acknowledgements to this company have nobody to go to (recorded as skipped).
      { name: 'Fergus Lanyon', phone: '+00 45 555 0912' },
    ],
  },
  {
    code: 'NLA',
    name: 'Nimbrell Laboratory Automation',
    billingAddress: addr('Nimbrell Science Quarter, Building 12', 'Aldercombe', '9902', 'Norlund', 'West Marrow'),
    contacts: [
      { name: 'Saoirse Venning', email: 's.venning@nimbrell-lab.example', notifyOrders: true },
      { name: 'Otto Klimsby', email: 'o.klimsby@nimbrell-lab.example', phone: '+00 52 555 0730', notifyShipping: true },
    ],
  },
];

// ── Line templates (SI: metres, volts, amperes, newtons, tesla) ─────────────────────────────

type LineTemplate = { title: string; requirement: RequirementInput; tolerancePercent?: number; terminationNotes?: string; leadNotes?: string };

const mm = (x: number) => x / 1000;

export const LINE_TEMPLATES: LineTemplate[] = [
  {
    title: 'Valve coil 12 V DC, plunger pull',
    requirement: {
      drive: { kind: 'voltage', volts: 12 },
      dutyCycle: 1,
      ambient: 40,
      insulationClass: 155,
      bobbin: { innerDiameter: mm(10), outerDiameter: mm(28), length: mm(32) },
      conductor: { material: 'copper', insulationGrade: 2 },
      magneticCircuit: { relativePermeability: 2000, saturationFluxDensity: 1.5, ironPathLength: mm(60), airGap: mm(1), gapCount: 1, area: 9.5e-5 },
      target: { kind: 'pull', force: 12 },
    },
    terminationNotes: 'Two 6.3 mm spade terminals moulded into the flange.',
  },
  {
    title: 'Solenoid 24 V DC, 50 % duty',
    requirement: {
      drive: { kind: 'voltage', volts: 24 },
      dutyCycle: 0.5,
      ambient: 40,
      insulationClass: 130,
      bobbin: { innerDiameter: mm(16), outerDiameter: mm(40), length: mm(45) },
      target: { kind: 'ampereTurns', ampereTurns: 1000 },
    },
    leadNotes: 'Flying leads 300 mm, PTFE sleeved, tinned 5 mm.',
  },
  {
    title: 'Holding magnet coil 230 V AC rectified',
    requirement: {
      // 230 V AC through a full-wave bridge: the DC mean is 0.9 × 230 ≈ 207 V (2√2/π).
      drive: { kind: 'voltage', volts: 207 },
      dutyCycle: 1,
      ambient: 50,
      insulationClass: 180,
      fit: 'envelope',
      bobbin: { innerDiameter: mm(30), outerDiameter: mm(80), length: mm(25) },
      magneticCircuit: { relativePermeability: 1500, saturationFluxDensity: 1.6, ironPathLength: mm(120), airGap: mm(0.1), gapCount: 2, area: 1.2e-3 },
      target: { kind: 'pull', force: 900 },
    },
    terminationNotes: 'Leads through a PG7 gland; bridge rectifier supplied by the customer.',
  },
  {
    title: 'Actuator coil, current-driven 1.5 A',
    requirement: {
      drive: { kind: 'current', amps: 1.5 },
      dutyCycle: 0.3,
      ambient: 25,
      insulationClass: 155,
      bobbin: { innerDiameter: mm(12), outerDiameter: mm(30), length: mm(40) },
      target: { kind: 'field', fluxDensity: 0.015, at: 'centre' },
    },
  },
  {
    title: 'Latch coil 12 V DC, field in the gap',
    requirement: {
      drive: { kind: 'voltage', volts: 12 },
      dutyCycle: 0.1,
      ambient: 55,
      insulationClass: 155,
      bobbin: { innerDiameter: mm(8), outerDiameter: mm(22), length: mm(18) },
      magneticCircuit: { relativePermeability: 3000, saturationFluxDensity: 1.4, ironPathLength: mm(40), airGap: mm(0.5), gapCount: 1, area: 5e-5 },
      target: { kind: 'field', fluxDensity: 0.6, at: 'gap' },
    },
  },
  {
    title: 'Valve coil 24 V DC, 56 Ω',
    requirement: {
      drive: { kind: 'voltage', volts: 24 },
      dutyCycle: 1,
      ambient: 45,
      insulationClass: 155,
      bobbin: { innerDiameter: mm(16), outerDiameter: mm(44), length: mm(45) },
      conductor: { material: 'copper', wire: { standard: 'AWG', gauge: 27 }, insulationGrade: 2 },
      resistance: 56,
      target: { kind: 'ampereTurns', ampereTurns: 600 },
    },
    tolerancePercent: 7,
    terminationNotes: 'DIN 43650 form B connector.',
  },
  {
    title: 'Door holder coil 24 V DC',
    requirement: {
      drive: { kind: 'voltage', volts: 24 },
      dutyCycle: 1,
      ambient: 40,
      insulationClass: 130,
      fit: 'envelope',
      bobbin: { innerDiameter: mm(20), outerDiameter: mm(50), length: mm(20) },
      magneticCircuit: { relativePermeability: 1500, saturationFluxDensity: 1.5, ironPathLength: mm(70), airGap: mm(0.2), gapCount: 2, area: 6e-4 },
      target: { kind: 'pull', force: 400 },
    },
  },
  {
    title: 'Metric-wire actuator coil 2 A, aluminium',
    requirement: {
      drive: { kind: 'current', amps: 2 },
      dutyCycle: 0.25,
      ambient: 70,
      insulationClass: 180,
      bobbin: { innerDiameter: mm(18), outerDiameter: mm(46), length: mm(60) },
      conductor: { material: 'aluminium', wire: { standard: 'metric', diameter: mm(0.5) } },
      target: { kind: 'ampereTurns', ampereTurns: 1500 },
    },
    leadNotes: 'Crimped ring terminals M4.',
  },
];

/** Every status, how many demo orders have it, and where their dates fall (days from today). */
const PLAN: { status: OrderStatus; count: number; ordered: [number, number]; due: [number, number] }[] = [
  { status: 'entered', count: 6, ordered: [-4, 0], due: [10, 45] },
  { status: 'acknowledged', count: 6, ordered: [-16, -3], due: [-8, 35] },
  { status: 'in_production', count: 6, ordered: [-32, -10], due: [-6, 21] },
  { status: 'partly_shipped', count: 3, ordered: [-40, -20], due: [-8, 6] },
  { status: 'shipped', count: 4, ordered: [-55, -25], due: [-20, -2] },
  { status: 'closed', count: 4, ordered: [-90, -50], due: [-45, -20] },
  { status: 'cancelled', count: 3, ordered: [-30, -2], due: [5, 30] },
];

/** The path through the status table to each status (see ORDER_TRANSITIONS in orders/service). */
const PATH: Record<OrderStatus, OrderStatus[]> = {
  entered: [],
  acknowledged: ['acknowledged'],
  in_production: ['acknowledged', 'in_production'],
  partly_shipped: ['acknowledged', 'in_production', 'partly_shipped'],
  shipped: ['acknowledged', 'in_production', 'shipped'],
  closed: ['acknowledged', 'in_production', 'shipped', 'closed'],
  cancelled: ['acknowledged', 'cancelled'],
};

const CANCEL_REASONS = ['Customer replaced the order with a revised one', 'Project stopped at the customer', 'Duplicate of an order entered by phone'];

/** A small deterministic random source, so every demo database looks the same. */
function rng(seed: number) {
  let s = seed >>> 0;
  return () => {
    s = (s * 1664525 + 1013904223) >>> 0;
    return s / 2 ** 32;
  };
}

function addDays(base: Date, days: number) {
  const d = new Date(base);
  d.setDate(d.getDate() + days);
  return today(d);
}

// ── Small drawings made here ────────────────────────────────────────────────────────────────

function makePdf(title: string, lines: string[]): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    const doc = new PDFDocument({ size: 'A6', margin: 24, compress: true, info: { Title: title, Author: 'Spoolwright demo' } });
    const chunks: Buffer[] = [];
    doc.on('data', (c: Buffer) => chunks.push(c));
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
    doc.fontSize(11).text(title);
    doc.moveDown(0.5).fontSize(8);
    for (const l of lines) doc.text(l);
    // A bobbin outline: flanges and core.
    doc.rect(60, 150, 12, 90).stroke().rect(168, 150, 12, 90).stroke().rect(72, 180, 96, 30).stroke();
    doc.fontSize(6).text('Invented demo drawing - not for manufacture', 24, 260);
    doc.end();
  });
}

const CRC_TABLE = Array.from({ length: 256 }, (_, n) => {
  let c = n;
  for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
  return c >>> 0;
});
function crc32(buf: Buffer) {
  let c = 0xffffffff;
  for (const b of buf) c = CRC_TABLE[(c ^ b) & 0xff] ^ (c >>> 8);
  return (c ^ 0xffffffff) >>> 0;
}
function chunk(type: string, data: Buffer) {
  const len = Buffer.alloc(4);
  len.writeUInt32BE(data.length);
  const td = Buffer.concat([Buffer.from(type, 'ascii'), data]);
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(crc32(td));
  return Buffer.concat([len, td, crc]);
}

/** A tiny greyscale PNG: a light sheet with a dark bobbin cross-section drawn on it. */
export function makePng(width = 96, height = 64): Buffer {
  const rows: Buffer[] = [];
  for (let y = 0; y < height; y++) {
    const row = Buffer.alloc(width + 1, 0xf2); // filter byte 0 then pixels
    row[0] = 0;
    for (let x = 0; x < width; x++) {
      const flange = (x >= 16 && x < 22) || (x >= 74 && x < 80);
      const core = x >= 22 && x < 74 && y >= 26 && y < 38;
      const winding = x >= 22 && x < 74 && ((y >= 12 && y < 26) || (y >= 38 && y < 52));
      const inBody = y >= 6 && y < 58;
      if (inBody && flange) row[x + 1] = 0x30;
      else if (core) row[x + 1] = 0x70;
      else if (winding) row[x + 1] = (x + y) % 3 === 0 ? 0xa0 : 0xb8;
    }
    rows.push(row);
  }
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(width, 0);
  ihdr.writeUInt32BE(height, 4);
  ihdr[8] = 8; // bit depth
  ihdr[9] = 0; // greyscale
  return Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    chunk('IHDR', ihdr),
    chunk('IDAT', deflateSync(Buffer.concat(rows))),
    chunk('IEND', Buffer.alloc(0)),
  ]);
}

// ── The step ────────────────────────────────────────────────────────────────────────────────

/** Seeds the demo customers and orders; leaves a database that has orders alone. */
export async function seedDemoOrders(db: Db, storage?: Storage) {
  const existing = await db.select({ id: orders.id }).from(orders).limit(1);
  if (existing.length) return;
  const officeRow = await findUserByEmail(db, 'office@spoolwright.test');
  if (!officeRow) return; // not a demo installation
  const office: SessionUser = toSessionUser(officeRow);
  const random = rng(4242);
  const pick = <T>(xs: readonly T[]) => xs[Math.floor(random() * xs.length)];
  const between = ([lo, hi]: [number, number]) => lo + Math.floor(random() * (hi - lo + 1));

  // Customers, through the customers service.
  const companies: { id: number; code: string }[] = [];
  for (const c of DEMO_COMPANIES) {
    const { code, ...body } = c;
    const found = await customerRepo.findCustomerByName(db, c.name);
    const customer = found
      ? await updateCustomer(db, found.id, updateCustomerRequest.parse({ ...body, shippingAddress: body.shippingAddress ?? null }), office)
      : await createCustomer(db, createCustomerRequest.parse(body), office);
    companies.push({ id: customer.id, code });
  }

  // Orders: every status, dates around today, 2–4 lines each.
  const now = new Date();
  let k = 0;
  const created: { id: number; status: OrderStatus }[] = [];
  for (const plan of PLAN) {
    for (let i = 0; i < plan.count; i++, k++) {
      const company = companies[k % companies.length];
      const orderDate = addDays(now, between(plan.ordered));
      let dueDate = addDays(now, between(plan.due));
      if (dueDate < orderDate) dueDate = addDays(new Date(`${orderDate}T12:00:00`), 14);
      const lineCount = 2 + Math.floor(random() * 3);
      const lines = Array.from({ length: lineCount }, (_, n) => {
        const t = pick(LINE_TEMPLATES);
        return {
          quantity: pick([5, 10, 20, 25, 50, 60, 100, 120, 250, 400]),
          title: t.title,
          customerPartNumber: `${company.code}-${1100 + k * 7 + n}-${String.fromCharCode(65 + (n % 3))}`,
          requirement: t.requirement,
          ...(t.tolerancePercent !== undefined && { tolerancePercent: t.tolerancePercent }),
          terminationNotes: t.terminationNotes ?? '',
          leadNotes: t.leadNotes ?? '',
        };
      });
      const input = createOrderRequest.parse({
        customerId: company.id,
        purchaseOrder: `${company.code}-PO-${24_000 + k * 13}`,
        orderDate,
        dueDate,
        notes: k % 5 === 0 ? 'Customer asked for a call before shipping.' : '',
        lines,
      });
      const order = await createOrder(db, input, office);
      created.push({ id: order.id, status: plan.status });
    }
  }

  // Statuses: acknowledge and cancel the service way. Release to the floor (in_production),
  // shipments (partly_shipped, shipped) and closing belong to later features, which will
  // add their own records (work orders, shipments); here those orders only walk the status
  // table through the orders service, without those records.
  let cancelled = 0;
  for (const o of created) {
    const path = PATH[o.status];
    for (const step of path) {
      if (step === 'acknowledged') await acknowledgeOrder(db, o.id, office);
      else if (step === 'cancelled') await cancelOrder(db, o.id, CANCEL_REASONS[cancelled++ % CANCEL_REASONS.length], office);
      else await moveOrder(db, o.id, step, office.id);
    }
  }

  // A few small drawings, stored through the attachments service in the object store.
  if (storage) {
    await storage.ensureBucket();
    const drawingsFor = created.filter((o) => o.status === 'entered' || o.status === 'acknowledged').slice(0, 4);
    const files = [
      { name: 'valve-coil-outline.pdf', body: await makePdf('Valve coil outline', ['Bobbin ID 10 mm, OD 28 mm, traverse 32 mm', 'Spade terminals 6.3 mm']) },
      { name: 'bobbin-section.png', body: makePng() },
      { name: 'holding-magnet-envelope.pdf', body: await makePdf('Holding magnet envelope', ['Envelope OD 80 mm, height 25 mm', 'Leads through PG7 gland']) },
      { name: 'connector-detail.png', body: makePng(64, 48) },
    ];
    for (const [i, o] of drawingsFor.entries()) {
      await uploadAttachment(db, storage, office, o.id, { buffer: files[i].body, originalname: files[i].name }, null);
    }
  }

  // Spread the audit trail over each order's own weeks (the services stamped everything "now").
  await db.execute(sql`
    with ranked as (
      select e.id, e.order_id, o.order_date, o.due_date,
             row_number() over (partition by e.order_id order by e.id) - 1 as k,
             count(*) over (partition by e.order_id) as n
      from order_events e join orders o on o.id = e.order_id)
    update order_events e
       set at = least(now(), (r.order_date + time '09:10') + r.k * ((greatest(r.due_date - r.order_date, 2) * interval '1 day') / r.n))
      from ranked r where r.id = e.id`);
  await db.execute(sql`
    update orders o set
      created_at = (select min(at) from order_events e where e.order_id = o.id),
      updated_at = (select max(at) from order_events e where e.order_id = o.id),
      acknowledged_at = case when o.acknowledged_at is null then null
        else (select min(at) from order_events e where e.order_id = o.id and e.kind = 'acknowledged') end,
      cancelled_at = case when o.cancelled_at is null then null
        else (select min(at) from order_events e where e.order_id = o.id and e.kind = 'cancelled') end`);
  await db.execute(sql`
    update notifications n set created_at = o.acknowledged_at, due_at = o.acknowledged_at
      from orders o where o.id = n.order_id and o.acknowledged_at is not null`);
  await db.execute(sql`
    update attachments a set created_at = e.at
      from order_events e where e.order_id = a.order_id and e.kind = 'attachment_added'`);
}

/** The seed step registered in SEED_STEPS (server/seed/demo.ts). */
export const demoOrdersStep = {
  id: 'demo-orders',
  async run(db: Db) {
    const storage = createStorage(config().s3);
    try {
      await seedDemoOrders(db, storage);
    } finally {
      storage.client.destroy();
    }
  },
};
