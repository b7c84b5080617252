/**
 * Demo seed: past shipments, made through the shipments service (applyCreateShipment — the same
 * rules as the API), and customer users for a few more companies.
 *
 * The shipped and partly shipped demo orders (all lines, or all but the last for a partly shipped
 * one) went through the floor before the demo began: their work orders get a compact history
 * (one move per stage, inspection signed by floor staff), every unit a passing test record judged
 * by the server's judge (judgeUnit), written in bulk so the seed stays quick; then one shipment per
 * order ships them. The closed orders are older history: they shipped before the shop recorded
 * shipments here (server/seed/history.ts). Their documents are drawn on first download (or by a
 * redraw), which keeps the seed quick. Carriers, tracking numbers and people are invented.
 */
import { and, asc, eq, inArray, sql } from 'drizzle-orm';
import type { SessionUser } from '../../src/contracts/auth';
import { EMPTY_ADDRESS } from '../../src/contracts/customers';
import { createShipmentRequest } from '../../src/contracts/shipments';
import { FLOOR_STAGES } from '../../src/contracts/floor';
import type { Stage } from '../../src/contracts/stages';
import type { Db, Tx } from '../db/client';
import { buildSheets, customers, notifications, orderEvents, orderLines, orders, shipments, spoolReservations, spools, stations, testRecords, users, workOrderEvents, workOrders } from '../db/schema';
import { addDays, localDate } from '../floor/estimate';
import { oldestLotOfWorkOrderWire } from '../floor/repository';
import { wireOutsideStation } from '../floor/service';
import { applyCreateShipment } from '../shipments/service';
import { judgeUnit } from '../test-records/judge';
import { findUserByEmail } from '../users/repository';
import { hashPassword, toSessionUser } from '../users/service';
import { DEMO_PASSWORD } from './demo';
import { DEMO_FLOOR_STAFF } from './floor';
import { ensureInstruments, readings, rng } from './test-records';

/** Customer users besides customer@spoolwright.test (Pellridge): invented people at invented companies. */
export const DEMO_CUSTOMER_USERS = [
  { email: 'quillon@spoolwright.test', name: 'Halvard Stemmings', company: 'Quillon Dosing Works' },
  { email: 'varnholt@spoolwright.test', name: 'Tamsin Orrell', company: 'Varnholt Door Controls' },
  { email: 'ulvenfold@spoolwright.test', name: 'Linnea Moss-Haverly', company: 'Ulvenfold Rail Equipment' },
];

const CARRIERS = [
  { carrier: 'Brindle Freight', service: 'Next day', prefix: 'BF' },
  { carrier: 'Harrow Parcel', service: 'Economy, 2–3 days', prefix: 'HP' },
  { carrier: 'Larkspur van', service: 'Own delivery', prefix: '' },
];

export const demoCustomerUsersStep = {
  id: 'demo-customer-users',
  async run(db: Db) {
    if (!(await findUserByEmail(db, 'customer@spoolwright.test'))) return; // not a demo installation
    const passwordHash = await hashPassword(DEMO_PASSWORD);
    for (const u of DEMO_CUSTOMER_USERS) {
      if (await findUserByEmail(db, u.email)) continue;
      const [company] = await db.select({ id: customers.id }).from(customers).where(sql`lower(${customers.name}) = ${u.company.toLowerCase()}`);
      if (!company) continue;
      await db.insert(users).values({ email: u.email, name: u.name, role: 'customer', passwordHash, customerId: company.id, lengthUnit: 'mm' });
    }
  },
};

/** A compact floor history of a work order: one move per stage into packing, by one floor hand. */
async function walkToPacking(tx: Tx, wo: typeof workOrders.$inferSelect, by: number, lot: string, turns: number, stationId: number | null, until: Date) {
  const stages = FLOOR_STAGES as Stage[];
  const from = wo.createdAt.getTime();
  const span = Math.max(until.getTime() - from, 3_600_000);
  await tx.insert(workOrderEvents).values(
    stages.slice(1).map((to, i) => ({
      workOrderId: wo.id,
      at: new Date(from + (span * (i + 1)) / stages.length),
      userId: by,
      kind: 'move' as const,
      fromStage: stages[i],
      toStage: to,
      note: '',
      ...(to === 'terminating' && { turnsCounter: turns, spoolLot: lot, stationId }),
    })),
  );
  await tx
    .update(workOrders)
    .set({ stage: 'packing', stationId, version: sql`${workOrders.version} + ${stages.length - 1}`, updatedAt: until })
    .where(eq(workOrders.id, wo.id));
}

export async function seedShipments(db: Db) {
  const tx = db as unknown as Tx;
  const [any] = await tx.select({ id: shipments.id }).from(shipments).limit(1);
  if (any) return;
  const shipperRow = await findUserByEmail(db, 'shipping@spoolwright.test');
  if (!shipperRow) return; // not a demo installation
  const shipper: SessionUser = toSessionUser(shipperRow);
  const hands = await tx.select({ id: users.id }).from(users).where(inArray(users.email, DEMO_FLOOR_STAFF.map((p) => p.email))).orderBy(asc(users.id));
  const handIds = hands.length ? hands.map((h) => h.id) : [shipper.id];
  const instrumentIds = await ensureInstruments(tx);

  const rows = await tx
    .select({ wo: workOrders, order: orders, lineNo: orderLines.lineNo, tolerancePercent: orderLines.tolerancePercent, sheet: buildSheets })
    .from(workOrders)
    .innerJoin(orders, eq(orders.id, workOrders.orderId))
    .innerJoin(orderLines, eq(orderLines.id, workOrders.lineId))
    .innerJoin(buildSheets, eq(buildSheets.id, workOrders.buildSheetId))
    .where(and(inArray(orders.status, ['shipped', 'partly_shipped']), eq(workOrders.stage, 'ready')))
    .orderBy(asc(orders.id), asc(orderLines.lineNo), asc(workOrders.id));
  const lastLine = new Map<number, number>();
  for (const r of rows) lastLine.set(r.order.id, Math.max(lastLine.get(r.order.id) ?? 0, r.lineNo));
  const chosen = rows.filter((r) => r.order.status === 'shipped' || r.lineNo < lastLine.get(r.order.id)!);
  const lots = new Map(
    (
      await tx
        .select({ workOrderId: spoolReservations.workOrderId, lot: spools.lot })
        .from(spoolReservations)
        .innerJoin(spools, eq(spools.id, spoolReservations.spoolId))
        .where(inArray(spoolReservations.workOrderId, chosen.length ? chosen.map((c) => c.wo.id) : [-1]))
    ).map((x) => [x.workOrderId, x.lot]),
  );

  // Each job was wound at a winder that takes its wire (the floor's rule), taking turns.
  const winders = await tx.select().from(stations).where(eq(stations.kind, 'winder')).orderBy(asc(stations.id));
  const winderFor = (n: number, number: string, bareDiameter: number) => {
    const fits = winders.filter((st) => wireOutsideStation(st, [{ number, bareDiameter }]).length === 0);
    return fits.length ? fits[n % fits.length].id : null;
  };

  const today = localDate();
  const byOrder = new Map<number, typeof chosen>();
  for (const c of chosen) byOrder.set(c.order.id, [...(byOrder.get(c.order.id) ?? []), c]);
  let k = 0;
  for (const list of byOrder.values()) {
    const order = list[0].order;
    const yesterday = addDays(today, -1 - (k % 3));
    const earliest = addDays(order.orderDate, 5);
    let shipDate = order.dueDate < yesterday ? order.dueDate : yesterday;
    if (shipDate < earliest) shipDate = earliest < today ? earliest : today;
    const shipAt = new Date(`${shipDate}T14:30:00`);
    const tested = new Date(shipAt.getTime() - 30 * 3_600_000);
    const r = rng(31337 + order.id);

    const records: (typeof testRecords.$inferInsert)[] = [];
    for (const [i, c] of list.entries()) {
      const hand = handIds[(k + i) % handIds.length];
      const lot = lots.get(c.wo.id) ?? (await oldestLotOfWorkOrderWire(tx, c.wo.id)) ?? 'no lot recorded';
      const stationId = winderFor(k + i, c.wo.number, c.sheet.result.wire.bareDiameter);
      await walkToPacking(tx, c.wo, hand, lot, c.sheet.result.turns, stationId, new Date(tested.getTime() + 4 * 3_600_000));
      for (let u = 1; u <= c.wo.quantity; u++) {
        const serial = `${c.wo.number}-${String(u).padStart(3, '0')}`;
        let input = readings(r, c.sheet, c.tolerancePercent, serial, instrumentIds);
        let j = judgeUnit(input, c.sheet, c.tolerancePercent);
        if (!j.passed) {
          input = readings(r, c.sheet, c.tolerancePercent, serial, instrumentIds, { off: 0 });
          j = judgeUnit(input, c.sheet, c.tolerancePercent);
        }
        records.push({
          workOrderId: c.wo.id,
          buildSheetId: c.sheet.id,
          serial,
          resistance: input.resistance,
          temperature: input.temperature,
          // The judgement's values as stored columns (Judgement is exactly those).
          ...j,
          entered: input,
          instrumentIds,
          stationId,
          testedBy: hand,
          testedAt: new Date(tested.getTime() + u * 120_000),
        });
      }
    }
    for (let i = 0; i < records.length; i += 500) await tx.insert(testRecords).values(records.slice(i, i + 500));

    const [customer] = await tx.select().from(customers).where(eq(customers.id, order.customerId));
    const units = list.reduce((s, c) => s + c.wo.quantity, 0);
    const boxes = Math.max(1, Math.ceil(units / 60));
    const via = CARRIERS[k % CARRIERS.length];
    const shipTo = { ...EMPTY_ADDRESS, ...(customer.shippingAddress ?? customer.billingAddress) };
    await applyCreateShipment(
      tx,
      shipper,
      createShipmentRequest.parse({
        workOrderIds: list.map((c) => c.wo.id),
        shipTo,
        attention: k % 2 === 0 ? 'Goods in' : '',
        carrier: via.carrier,
        service: via.service,
        trackingNumber: via.prefix ? `${via.prefix}${String(48_200_000 + order.id * 7919).padStart(10, '0')}` : '',
        packages: Array.from({ length: boxes }, (_, b) => ({
          weight: Math.round((Math.min(60, units - b * 60) * 0.18 + 0.6) * 100) / 100,
          length: 400,
          width: 300,
          height: 220,
        })),
        shipDate,
        packingNote: k % 3 === 0 ? 'Coils bagged in tens with desiccant; leads taped to the bobbins.' : '',
      }),
      { at: shipAt },
    );
    k += 1;
  }

  // The services stamped the orders' audit rows "now": they happened when each shipment did.
  await tx.execute(sql`
    update ${orderEvents} e set at = s.created_at from ${shipments} s where e.note = 'Shipment ' || s.number`);
  await tx.execute(sql`
    update ${orders} o set updated_at = x.at from (select order_id, max(at) as at from ${orderEvents} group by order_id) x
     where x.order_id = o.id and o.status in ('shipped', 'partly_shipped')`);
  // Shipment notices of the demo's past are history: recorded, not sent.
  await tx
    .update(notifications)
    .set({ status: 'skipped', reason: 'Demo history: shipped before the demo began; not sent' })
    .where(and(eq(notifications.kind, 'shipment_sent'), eq(notifications.status, 'pending')));

}

/** The seed step registered in SEED_STEPS (server/seed/demo.ts), after the test records. */
export const demoShipmentsStep = {
  id: 'demo-shipments',
  run: (db: Db) => seedShipments(db),
};
