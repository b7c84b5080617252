/**
 * The three imports: their columns, how a row becomes the input of the same contract schema the
 * form sends, and where a schema's complaint lands (row and column).
 */
import { sql } from 'drizzle-orm';
import type { ZodError } from 'zod';
import type { SessionUser, UnitPreferences } from '../../src/contracts/auth';
import { createCustomerRequest, type CreateCustomerRequest } from '../../src/contracts/customers';
import { createOrderRequest, type CreateOrderRequest } from '../../src/contracts/orders';
import { receiveSpoolRequest, wireWords, type ReceiveSpoolRequest } from '../../src/contracts/stock';
import { formatLength, formatMass, formatTemperature, massUnitFor } from '../../src/lib/units';
import type { Db, Tx } from '../db/client';
import { createCustomer } from '../customers/service';
import { createOrder } from '../orders/service';
import { receiveSpool } from '../stock/service';
import { type ColumnDef, type Row, limitInUnits, say } from './table';

/** One record a commit creates: the validated input, the rows it came from and its words. */
export type Planned<I> = { input: I; rows: Row[] };

export type KindPlan<I> = {
  columns: readonly ColumnDef[];
  /** Checks every row (problems land on the rows) and returns what a commit would create. */
  plan(db: Db | Tx, rows: Row[], prefs: UnitPreferences): Promise<{ items: Planned<I>[]; creates: Map<Row, string>; totals: Record<string, number> }>;
  /** Creates one planned record inside the import's transaction; returns its id. */
  create(tx: Tx, input: I, actor: SessionUser): Promise<number>;
};

/** The services open their own transaction; inside the import's, drizzle makes that a savepoint. */
const asDb = (tx: Tx) => tx as unknown as Db;

/**
 * Puts each complaint of a schema on its row and column: `rowFor(path)` picks the row,
 * `columnFor(path)` the column key (the longest matching path prefix in `map`).
 */
function spread(error: ZodError, prefs: UnitPreferences, rowFor: (path: PropertyKey[]) => Row, map: [string, string][]) {
  for (const issue of error.issues) {
    const path = issue.path.filter((p) => typeof p !== 'number').map(String).join('.');
    let key: string | null = null;
    let best = -1;
    for (const [prefix, column] of map) {
      if ((path === prefix || path.startsWith(`${prefix}.`)) && prefix.length > best) {
        key = column;
        best = prefix.length;
      }
    }
    const row = rowFor(issue.path);
    const q = key ? row.quantityOf(key) : undefined;
    // A quantity's range from the contract (SI) restated in the user's unit.
    const bound = issue.code === 'too_big' ? ['at most', issue.maximum] : issue.code === 'too_small' ? ['at least', issue.minimum] : null;
    const message = q && bound && typeof bound[1] === 'number' ? `${bound[0]} ${limitInUnits(q, bound[1], prefs)}` : say(issue.message, prefs);
    row.problem(key, message);
  }
}

/** A later row may leave a shared (order- or company-level) cell empty or repeat it; a different value is a problem. */
function shared(rows: Row[], key: string, what: string): string {
  const first = rows.find((r) => r.has(key));
  const value = first?.text(key) ?? '';
  for (const r of rows) if (r.has(key) && r.text(key) !== value) r.problem(key, `${what} differs from row ${first!.line} ("${value}")`);
  return value;
}

const groupBy = (rows: Row[], keyOf: (r: Row) => string | null) => {
  const groups = new Map<string, Row[]>();
  for (const r of rows) {
    const k = keyOf(r);
    if (k === null) continue;
    groups.set(k, [...(groups.get(k) ?? []), r]);
  }
  return [...groups.values()];
};

// ── Customers with contacts and addresses ──────────────────────────────────────────────────

const ADDRESS_PARTS = [
  ['line1', 'street', 'Street and number'],
  ['line2', 'line2', 'Second address line'],
  ['city', 'city', 'Town or city'],
  ['region', 'region', 'Region or state'],
  ['postalCode', 'postal_code', 'Postal code'],
  ['country', 'country', 'Country'],
] as const;

const CUSTOMER_COLUMNS: ColumnDef[] = [
  { key: 'company', required: true, meaning: 'Company name; rows with the same name make one customer (one row per contact)', example: 'Harrowgate Pump Controls' },
  { key: 'notes', meaning: 'Internal notes, never shown to the customer', example: 'Pays on 30 days' },
  ...ADDRESS_PARTS.map(([, k, m]) => ({ key: `billing_${k}`, meaning: `Billing address: ${m.toLowerCase()}`, example: k === 'street' ? '14 Quarry Lane' : k === 'city' ? 'Eastmere' : k === 'country' ? 'Nordland' : '' })),
  ...ADDRESS_PARTS.map(([, k, m]) => ({ key: `shipping_${k}`, meaning: `Shipping address (empty: ship to the billing address): ${m.toLowerCase()}`, example: '' })),
  { key: 'contact_name', meaning: 'A person at the company (leave the contact columns empty for none)', example: 'Ines Varga' },
  { key: 'contact_email', meaning: 'Their e-mail address', example: 'ines.varga@harrowgate.example' },
  { key: 'contact_phone', meaning: 'Their phone number', example: '+00 555 0142' },
  { key: 'contact_order_notices', meaning: 'yes: they receive order acknowledgements and release notices', example: 'yes' },
  { key: 'contact_shipping_notices', meaning: 'yes: they receive shipment notices', example: 'no' },
];

const CUSTOMER_PATHS: [string, string][] = [
  ['name', 'company'],
  ['notes', 'notes'],
  ...ADDRESS_PARTS.flatMap(([p, k]) => [[`billingAddress.${p}`, `billing_${k}`], [`shippingAddress.${p}`, `shipping_${k}`]] as [string, string][]),
  ['contacts', 'contact_name'],
  ['contacts.name', 'contact_name'],
  ['contacts.email', 'contact_email'],
  ['contacts.phone', 'contact_phone'],
  ['contacts.notifyOrders', 'contact_order_notices'],
  ['contacts.notifyShipping', 'contact_shipping_notices'],
];

export const customersImport: KindPlan<CreateCustomerRequest> = {
  columns: CUSTOMER_COLUMNS,
  async plan(db, rows, prefs) {
    const creates = new Map<Row, string>();
    const items: Planned<CreateCustomerRequest>[] = [];
    for (const r of rows) if (!r.has('company')) r.problem('company', 'Enter the company name');
    const existing = new Set(
      (await db.execute<{ n: string }>(sql`select lower(name) as n from customers`)).rows.map((x) => x.n),
    );
    let contacts = 0;
    for (const group of groupBy(rows, (r) => (r.has('company') ? r.text('company').toLowerCase() : null))) {
      const first = group[0];
      const name = shared(group, 'company', 'Company name');
      const address = (side: 'billing' | 'shipping') =>
        Object.fromEntries(ADDRESS_PARTS.map(([p, k, m]) => [p, shared(group, `${side}_${k}`, m)]));
      const billing = address('billing');
      const shipping = address('shipping');
      const contactRows = group.filter((r) => ['contact_name', 'contact_email', 'contact_phone', 'contact_order_notices', 'contact_shipping_notices'].some((k) => r.has(k)));
      const input = {
        name,
        notes: shared(group, 'notes', 'Notes'),
        billingAddress: billing,
        shippingAddress: Object.values(shipping).some((v) => v !== '') ? shipping : null,
        contacts: contactRows.map((r) => ({
          name: r.text('contact_name'),
          email: r.text('contact_email'),
          phone: r.text('contact_phone'),
          notifyOrders: r.flag('contact_order_notices'),
          notifyShipping: r.flag('contact_shipping_notices'),
        })),
      };
      const parsed = createCustomerRequest.safeParse(input);
      if (!parsed.success) {
        const rowFor = (path: PropertyKey[]) => (path[0] === 'contacts' && typeof path[1] === 'number' ? contactRows[path[1]] : first);
        spread(parsed.error, prefs, rowFor, CUSTOMER_PATHS);
      }
      if (existing.has(name.toLowerCase())) first.problem('company', `A customer named "${name}" exists already`);
      const town = [billing.city, billing.country].filter(Boolean).join(', ');
      creates.set(first, `customer “${name}”${town ? ` (${town})` : ''}`);
      for (const r of contactRows) {
        const notices = [r.flag('contact_order_notices') && 'order notices', r.flag('contact_shipping_notices') && 'shipment notices'].filter(Boolean);
        const c = `contact ${r.text('contact_name') || '(no name)'}${notices.length ? ` — ${notices.join(', ')}` : ''}`;
        creates.set(r, creates.has(r) ? `${creates.get(r)} with ${c}` : c);
      }
      contacts += contactRows.length;
      if (parsed.success) items.push({ input: parsed.data, rows: group });
    }
    return { items, creates, totals: { customers: items.length, contacts } };
  },
  async create(tx, input, actor) {
    return (await createCustomer(asDb(tx), input, actor)).id;
  },
};

// ── Wire spools ────────────────────────────────────────────────────────────────────────────

const SPOOL_COLUMNS: ColumnDef[] = [
  { key: 'conductor', required: true, meaning: 'copper or aluminium', example: 'copper' },
  { key: 'wire_standard', required: true, meaning: 'AWG or metric', example: 'AWG' },
  { key: 'awg_gauge', meaning: 'AWG wires: the gauge number', example: '31' },
  { key: 'metric_diameter_mm', meaning: 'Metric wires: the IEC 60317-0-1 nominal bare diameter, mm', example: '' },
  { key: 'insulation_grade', required: true, meaning: 'Insulation grade 1, 2 or 3', example: '2' },
  { key: 'supplier', required: true, meaning: 'Who supplied it', example: 'Brackwater Wire Mills' },
  { key: 'lot', required: true, meaning: "The supplier's lot number", example: 'BW-24-0917' },
  { key: 'net_mass', quantity: 'mass', required: true, meaning: 'Wire on the spool, without the spool body', example: 12.5 },
  { key: 'location', meaning: 'Shelf or rack', example: 'Rack B2' },
  { key: 'received', meaning: 'Date received, YYYY-MM-DD (empty: today)', example: '2025-03-14' },
];

const SPOOL_PATHS: [string, string][] = [
  ['conductor', 'conductor'],
  ['wire', 'wire_standard'],
  ['wire.standard', 'wire_standard'],
  ['wire.gauge', 'awg_gauge'],
  ['wire.diameter', 'metric_diameter_mm'],
  ['insulationGrade', 'insulation_grade'],
  ['supplier', 'supplier'],
  ['lot', 'lot'],
  ['netMass', 'net_mass'],
  ['location', 'location'],
  ['receivedAt', 'received'],
];

export const spoolsImport: KindPlan<ReceiveSpoolRequest> = {
  columns: SPOOL_COLUMNS,
  async plan(_db, rows, prefs) {
    const creates = new Map<Row, string>();
    const items: Planned<ReceiveSpoolRequest>[] = [];
    for (const r of rows) {
      const standard = r.text('wire_standard');
      const std = standard.toLowerCase() === 'awg' ? 'AWG' : standard.toLowerCase() === 'metric' ? 'metric' : standard;
      const diameterMm = r.num('metric_diameter_mm', 'Metric diameter');
      const input = {
        conductor: r.text('conductor').toLowerCase(),
        wire: std === 'AWG' ? { standard: 'AWG', gauge: r.num('awg_gauge', 'AWG gauge') } : { standard: std, diameter: diameterMm === undefined ? undefined : diameterMm / 1000 },
        insulationGrade: r.num('insulation_grade', 'Insulation grade'),
        supplier: r.text('supplier'),
        lot: r.text('lot'),
        netMass: r.num('net_mass', 'Net mass'),
        location: r.text('location'),
        ...(r.has('received') && { receivedAt: r.text('received') }),
      };
      const parsed = receiveSpoolRequest.safeParse(input);
      if (!parsed.success) spread(parsed.error, prefs, () => r, SPOOL_PATHS);
      else if (r.problems.length === 0) {
        const s = parsed.data;
        creates.set(r, `spool of ${wireWords(s)}, ${formatMass(s.netMass, massUnitFor(prefs.lengthUnit))}, lot ${s.lot} from ${s.supplier}`);
        items.push({ input: s, rows: [r] });
      }
    }
    return { items, creates, totals: { spools: items.length } };
  },
  async create(tx, input, actor) {
    return (await receiveSpool(tx, input, actor)).id;
  },
};

// ── Open orders ────────────────────────────────────────────────────────────────────────────

const ORDER_COLUMNS: ColumnDef[] = [
  { key: 'customer', required: true, meaning: 'An existing customer, by name (import customers first)', example: 'Harrowgate Pump Controls' },
  { key: 'purchase_order', required: true, meaning: "The customer's purchase-order number; rows with the same customer and number make one order (one row per line)", example: 'PO-88213' },
  { key: 'order_date', meaning: 'YYYY-MM-DD (empty: today)', example: '2025-03-03' },
  { key: 'due_date', required: true, meaning: 'Requested ship date, YYYY-MM-DD', example: '2025-04-18' },
  { key: 'order_notes', meaning: 'Internal notes on the order', example: '' },
  { key: 'line_title', required: true, meaning: 'What the customer calls the coil', example: 'Valve coil 24 V' },
  { key: 'quantity', required: true, meaning: 'Units ordered', example: '200' },
  { key: 'customer_part_number', meaning: "The customer's part number", example: 'HPC-VC-24' },
  { key: 'tolerance_percent', meaning: '± % on the resistance at 20 °C (empty: 10)', example: '7' },
  { key: 'drive', required: true, meaning: 'voltage or current', example: 'voltage' },
  { key: 'drive_value', required: true, meaning: 'Supply voltage (V) or current (A)', example: '24' },
  { key: 'duty_cycle_percent', required: true, meaning: 'Duty cycle, % (100: continuous)', example: '100' },
  { key: 'ambient', quantity: 'temperature', required: true, meaning: 'Highest ambient temperature', example: 40 },
  { key: 'insulation_class', required: true, meaning: 'Thermal class (IEC 60085): 105, 120, 130, 155, 180, 200 or 220', example: '155' },
  { key: 'fit', meaning: 'bobbin (wind on these dimensions) or envelope (the finished coil must fit inside); empty: bobbin', example: 'bobbin' },
  { key: 'bobbin_inner_diameter', quantity: 'length', required: true, meaning: 'Bobbin (or envelope) inner diameter', example: 0.012 },
  { key: 'bobbin_outer_diameter', quantity: 'length', required: true, meaning: 'Bobbin (or envelope) outer diameter', example: 0.03 },
  { key: 'bobbin_length', quantity: 'length', required: true, meaning: 'Traverse length', example: 0.035 },
  { key: 'target', required: true, meaning: 'ampere-turns or field (at the winding centre); a pull needs the magnetic circuit: enter such lines in the order form', example: 'ampere-turns' },
  { key: 'target_value', required: true, meaning: 'Ampere-turns (A) or flux density (T)', example: '900' },
  { key: 'resistance_ohm', meaning: 'A DC resistance at 20 °C the customer expects, Ω', example: '' },
  { key: 'conductor', meaning: 'copper or aluminium, if the customer asks for one', example: '' },
  { key: 'awg_gauge', meaning: 'An AWG gauge, if the customer asks for one', example: '' },
  { key: 'insulation_grade', meaning: 'An insulation grade 1–3, if the customer asks for one', example: '' },
  { key: 'termination_notes', meaning: 'How the leads end', example: 'Flying leads, tinned' },
  { key: 'lead_notes', meaning: 'Lead length and colour', example: '' },
];

const ORDER_PATHS: [string, string][] = [
  ['customerId', 'customer'],
  ['purchaseOrder', 'purchase_order'],
  ['orderDate', 'order_date'],
  ['dueDate', 'due_date'],
  ['notes', 'order_notes'],
  ['lines', 'line_title'],
  ['lines.title', 'line_title'],
  ['lines.quantity', 'quantity'],
  ['lines.customerPartNumber', 'customer_part_number'],
  ['lines.tolerancePercent', 'tolerance_percent'],
  ['lines.terminationNotes', 'termination_notes'],
  ['lines.leadNotes', 'lead_notes'],
  ['lines.requirement.drive', 'drive'],
  ['lines.requirement.drive.volts', 'drive_value'],
  ['lines.requirement.drive.amps', 'drive_value'],
  ['lines.requirement.dutyCycle', 'duty_cycle_percent'],
  ['lines.requirement.ambient', 'ambient'],
  ['lines.requirement.insulationClass', 'insulation_class'],
  ['lines.requirement.fit', 'fit'],
  ['lines.requirement.bobbin', 'bobbin_inner_diameter'],
  ['lines.requirement.bobbin.innerDiameter', 'bobbin_inner_diameter'],
  ['lines.requirement.bobbin.outerDiameter', 'bobbin_outer_diameter'],
  ['lines.requirement.bobbin.length', 'bobbin_length'],
  ['lines.requirement.target', 'target'],
  ['lines.requirement.target.ampereTurns', 'target_value'],
  ['lines.requirement.target.fluxDensity', 'target_value'],
  ['lines.requirement.magneticCircuit', 'target'],
  ['lines.requirement.resistance', 'resistance_ohm'],
  ['lines.requirement.conductor.material', 'conductor'],
  ['lines.requirement.conductor.wire', 'awg_gauge'],
  ['lines.requirement.conductor.insulationGrade', 'insulation_grade'],
];

function lineOf(r: Row) {
  const drive = r.text('drive').toLowerCase();
  const value = r.num('drive_value', 'Drive');
  const target = r.text('target').toLowerCase().replace(/[\s_]+/g, '-');
  const targetValue = r.num('target_value', 'Target');
  const duty = r.num('duty_cycle_percent', 'Duty cycle');
  if (target === 'pull') r.problem('target', 'A pull target needs the magnetic circuit (iron and air gap): enter this line in the order form');
  else if (target !== 'ampere-turns' && target !== 'field') r.problem('target', 'Write ampere-turns or field');
  if (drive !== 'voltage' && drive !== 'current') r.problem('drive', 'Write voltage or current');
  const gauge = r.num('awg_gauge', 'AWG gauge');
  const grade = r.num('insulation_grade', 'Insulation grade');
  const conductor = r.text('conductor').toLowerCase();
  const preference = {
    ...(conductor && { material: conductor }),
    ...(gauge !== undefined && { wire: { standard: 'AWG', gauge } }),
    ...(grade !== undefined && { insulationGrade: grade }),
  };
  return {
    title: r.text('line_title'),
    quantity: r.num('quantity', 'Quantity'),
    customerPartNumber: r.text('customer_part_number'),
    ...(r.has('tolerance_percent') && { tolerancePercent: r.num('tolerance_percent', 'Tolerance') }),
    terminationNotes: r.text('termination_notes'),
    leadNotes: r.text('lead_notes'),
    requirement: {
      drive: drive === 'current' ? { kind: 'current', amps: value } : { kind: 'voltage', volts: value },
      dutyCycle: duty === undefined ? undefined : duty / 100,
      ambient: r.num('ambient', 'Ambient'),
      insulationClass: r.num('insulation_class', 'Insulation class'),
      fit: r.text('fit').toLowerCase() || 'bobbin',
      bobbin: {
        innerDiameter: r.num('bobbin_inner_diameter', 'Inner diameter'),
        outerDiameter: r.num('bobbin_outer_diameter', 'Outer diameter'),
        length: r.num('bobbin_length', 'Traverse length'),
      },
      ...(Object.keys(preference).length && { conductor: preference }),
      ...(r.has('resistance_ohm') && { resistance: r.num('resistance_ohm', 'Resistance') }),
      target: target === 'field' ? { kind: 'field', fluxDensity: targetValue, at: 'centre' } : { kind: 'ampereTurns', ampereTurns: targetValue },
    },
  };
}

export const ordersImport: KindPlan<CreateOrderRequest> = {
  columns: ORDER_COLUMNS,
  async plan(db, rows, prefs) {
    const creates = new Map<Row, string>();
    const items: Planned<CreateOrderRequest>[] = [];
    const customers = new Map(
      (await db.execute<{ id: number; n: string; name: string }>(sql`select id, lower(name) as n, name from customers`)).rows.map((c) => [c.n, c]),
    );
    const takenPos = new Set(
      (await db.execute<{ k: string }>(sql`select customer_id || '/' || lower(purchase_order) as k from orders`)).rows.map((x) => x.k),
    );
    for (const r of rows) {
      if (!r.has('customer')) r.problem('customer', 'Enter the customer');
      if (!r.has('purchase_order')) r.problem('purchase_order', "Enter the customer's purchase-order number");
    }
    let lines = 0;
    const keyOf = (r: Row) => (r.has('customer') && r.has('purchase_order') ? `${r.text('customer').toLowerCase()}\u0000${r.text('purchase_order').toLowerCase()}` : null);
    for (const group of groupBy(rows, keyOf)) {
      const first = group[0];
      const customer = customers.get(first.text('customer').toLowerCase());
      if (!customer) first.problem('customer', `No customer named "${first.text('customer')}" (import the customers first)`);
      const po = first.text('purchase_order');
      if (customer && takenPos.has(`${customer.id}/${po.toLowerCase()}`)) first.problem('purchase_order', `${customer.name} has an order with purchase order ${po} already`);
      const input = {
        customerId: customer?.id ?? 1,
        purchaseOrder: po,
        ...(shared(group, 'order_date', 'Order date') && { orderDate: shared(group, 'order_date', 'Order date') }),
        dueDate: shared(group, 'due_date', 'Requested ship date'),
        notes: shared(group, 'order_notes', 'Order notes'),
        lines: group.map(lineOf),
      };
      const parsed = createOrderRequest.safeParse(input);
      if (!parsed.success) spread(parsed.error, prefs, (path) => (path[0] === 'lines' && typeof path[1] === 'number' ? group[path[1]] : first), ORDER_PATHS);
      group.forEach((r, i) => {
        const req = input.lines[i].requirement;
        const drive = req.drive.kind === 'current' ? `${r.text('drive_value')} A` : `${r.text('drive_value')} V`;
        const line = `line ${i + 1}: ${r.text('quantity')} × ${r.text('line_title')} (${drive}, ${formatLength(req.bobbin.outerDiameter, prefs.lengthUnit)} bobbin, ambient ${formatTemperature(req.ambient, prefs.temperatureUnit)}, class ${r.text('insulation_class')})`;
        creates.set(r, i === 0 ? `order ${po} for ${customer?.name ?? first.text('customer')}, due ${input.dueDate}; ${line}` : line);
      });
      lines += group.length;
      if (parsed.success && customer) items.push({ input: parsed.data, rows: group });
    }
    return { items, creates, totals: { orders: items.length, lines } };
  },
  async create(tx, input, actor) {
    return (await createOrder(asDb(tx), input, actor)).id;
  },
};

export const IMPORTS = { customers: customersImport, spools: spoolsImport, orders: ordersImport } as const;
