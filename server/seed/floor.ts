/**
 * Demo seed: the shop floor. Adds a few stations and five floor staff, assigns the released work
 * orders of orders in production and moves them along the stages through the floor service
 * (applyAssignment, applyMove — the same rules as the API), so the board has work in every floor
 * stage, a couple on hold with reasons, a couple in rework, and histories spread over the days
 * since release. Stations, people and notes are invented.
 *
 * Not moved: work orders of orders already shipped or closed. `shipped` is set only by a
 * shipment (a later issue); until then those stay where the release put them.
 */
import { and, asc, eq, inArray, sql } from 'drizzle-orm';
import type { SessionUser } from '../../src/contracts/auth';
import { createStationRequest, FLOOR_STAGES, type CreateStationBody } from '../../src/contracts/floor';
import type { Stage } from '../../src/contracts/stages';
import type { Db, Tx } from '../db/client';
import { buildSheets, orders, spoolReservations, spools, stations, users, workOrders } from '../db/schema';
import { oldestLotOfWorkOrderWire } from '../floor/repository';
import { applyAssignment, applyMove, createStation } from '../floor/service';
import { findUserByEmail } from '../users/repository';
import { hashPassword, toSessionUser } from '../users/service';
import { DEMO_PASSWORD } from './demo';
import { testBatchForPacking } from './test-records';

/** Invented stations: three winders, a termination bench, the varnish oven and a test bench. */
const STATIONS: CreateStationBody[] = [
  { name: 'Winder 1 · Tamsin', kind: 'winder', wireDiameterMin: 0.2e-3, wireDiameterMax: 1.0e-3, spindleRpm: 1800, setupSeconds: 900 },
  { name: 'Winder 2 · Brock', kind: 'winder', wireDiameterMin: 0.2e-3, wireDiameterMax: 1.3e-3, spindleRpm: 1400, setupSeconds: 1200 },
  { name: 'Winder 3 · Fine wire', kind: 'winder', wireDiameterMin: 0.04e-3, wireDiameterMax: 0.3e-3, spindleRpm: 3000, setupSeconds: 1500 },
  { name: 'Termination bench A', kind: 'bench', setupSeconds: 300 },
  { name: 'Varnish tank and oven', kind: 'oven', setupSeconds: 600 },
  { name: 'Test bench T1', kind: 'tester', setupSeconds: 300 },
];

/** Five invented floor staff (sign in as <first name>@spoolwright.test with the demo password). */
export const DEMO_FLOOR_STAFF = [
  { email: 'wendell@spoolwright.test', name: 'Wendell Ashgrove' },
  { email: 'saoirse@spoolwright.test', name: 'Saoirse Pennick' },
  { email: 'joaquim@spoolwright.test', name: 'Joaquim Trelawney' },
  { email: 'hattie@spoolwright.test', name: 'Hattie Marchbank' },
  { email: 'seun@spoolwright.test', name: 'Oluwaseun Drave' },
];

const HOLD_REASONS = [
  'Customer asked us to confirm the lead length before we go on',
  'Bobbins from this batch have flash on the flange; waiting for replacements',
];
const REWORK_NOTES = ['Three units read open circuit at test; rewind them', 'Lead sleeving split on two units; re-terminate'];

/**
 * Where each in-production work order ends up, in turn. Several in every floor stage, at least
 * three each in winding, testing and packing, two on hold and two in rework.
 */
const TARGETS: Stage[] = [
  'winding', 'testing', 'packing', 'terminating', 'impregnating', 'curing', 'inspection', 'winding', 'testing', 'packing',
  'on_hold', 'rework', 'winding', 'testing', 'packing', 'ready', 'terminating', 'curing', 'on_hold', 'rework',
  'impregnating', 'inspection', 'winding', 'testing', 'packing', 'ready',
];

export async function seedFloor(db: Db) {
  const existing = await db.select({ id: stations.id }).from(stations).limit(1);
  if (existing.length) return;
  const foremanRow = await findUserByEmail(db, 'foreman@spoolwright.test');
  if (!foremanRow) return; // not a demo installation
  const foreman = toSessionUser(foremanRow);
  const tx = db as unknown as Tx;

  const made = [];
  for (const s of STATIONS) made.push(await createStation(db, createStationRequest.parse(s)));
  const winders = made.filter((s) => s.kind === 'winder');

  const passwordHash = await hashPassword(DEMO_PASSWORD);
  const staffRows = await db
    .insert(users)
    .values(DEMO_FLOOR_STAFF.map((p) => ({ ...p, role: 'floor' as const, passwordHash })))
    .returning();
  const staff: SessionUser[] = staffRows.map(toSessionUser);

  // The released work orders of orders in production.
  const wos = await db
    .select({
      id: workOrders.id,
      version: workOrders.version,
      turns: sql<number>`(${buildSheets.result}->>'turns')::int`,
      bareDiameter: sql<number>`(${buildSheets.result}->'wire'->>'bareDiameter')::float8`,
    })
    .from(workOrders)
    .innerJoin(orders, eq(orders.id, workOrders.orderId))
    .innerJoin(buildSheets, eq(buildSheets.id, workOrders.buildSheetId))
    .where(and(eq(orders.status, 'in_production'), eq(workOrders.stage, 'ready')))
    // Those released days ago first, so their histories have room; then by due date.
    .orderBy(sql`${workOrders.createdAt} > now() - interval '2 days'`, asc(workOrders.dueDate), asc(workOrders.id));
  const lots = new Map(
    (
      await db
        .select({ workOrderId: spoolReservations.workOrderId, lot: spools.lot })
        .from(spoolReservations)
        .innerJoin(spools, eq(spools.id, spoolReservations.spoolId))
        .where(inArray(spoolReservations.workOrderId, wos.length ? wos.map((w) => w.id) : [-1]))
    ).map((r) => [r.workOrderId, r.lot]),
  );

  // Assign: each person works mostly at a winder of their own (two share the third), in
  // batches; a job whose wire that winder does not take goes to the first winder that does.
  const takes = (st: (typeof winders)[number], d: number) => (st.wireDiameterMin === null || d >= st.wireDiameterMin) && (st.wireDiameterMax === null || d <= st.wireDiameterMax);
  const winderFor = (k: number, d: number) => [winders[k % winders.length], ...winders].find((st) => takes(st, d)) ?? winders[k % winders.length];
  const plan = wos.slice(0, TARGETS.length).map((w, i) => {
    const k = i % staff.length;
    return { ...w, target: TARGETS[i], person: staff[k], station: winderFor(k, w.bareDiameter) };
  });
  for (const person of staff) {
    const mine = plan.filter((p) => p.person.id === person.id);
    for (const station of winders) {
      const batch = mine.filter((p) => p.station.id === station.id);
      if (batch.length) await applyAssignment(tx, foreman, { ids: batch.map((p) => p.id), assigneeId: person.id, stationId: station.id });
    }
  }
  // A few more ready ones waiting for a winder, nobody assigned yet.
  const waiting = wos.slice(TARGETS.length, TARGETS.length + 4);
  const waitingHere = waiting.filter((w) => takes(winders[0], w.bareDiameter));
  if (waitingHere.length) await applyAssignment(tx, foreman, { ids: waitingHere.map((w) => w.id), stationId: winders[0].id });

  let held = 0;
  let reworked = 0;
  let packed = 0;
  for (const p of plan) {
    let version = p.version + 1; // the assignment bumped it
    const step = async (actor: SessionUser, to: Stage, extra: Record<string, unknown> = {}) => {
      const moved = await applyMove(tx, actor, p.id, { to, version, ...extra });
      version = moved.version;
    };
    const walkTo = async (last: Stage) => {
      for (const stage of FLOOR_STAGES.slice(1, FLOOR_STAGES.indexOf(last) + 1)) {
        const finishing = stage === 'terminating';
        // The winder's counter reads a turn or two over now and then; the spool is the one reserved.
        const lot = finishing ? (lots.get(p.id) ?? (await oldestLotOfWorkOrderWire(tx, p.id))) : null;
        const extra = finishing && lot ? { turnsCounter: p.turns + (p.id % 3 === 0 ? 2 : 0), spoolLot: lot, stationId: p.station.id } : {};
        // The packing gate needs every unit's test passed or dispositioned (server/seed/test-records.ts).
        if (stage === 'packing') await testBatchForPacking(tx, p.person, p.id, packed++);
        await step(p.person, stage, extra);
      }
    };
    if (p.target === 'on_hold') {
      await walkTo(held === 0 ? 'winding' : 'impregnating');
      await step(foreman, 'on_hold', { note: HOLD_REASONS[held++ % HOLD_REASONS.length] });
    } else if (p.target === 'rework') {
      await walkTo('testing');
      await step(foreman, 'rework', { note: REWORK_NOTES[reworked++ % REWORK_NOTES.length] });
    } else if (p.target !== 'ready') {
      await walkTo(p.target);
    }
  }

  // Spread this step's events (all stamped with the transaction's "now") over the days since each
  // work order's release, in their order; the work orders' updated_at follows their last event.
  await db.execute(sql`
    with ranked as (
      select e.id, w.created_at as released,
             row_number() over (partition by e.work_order_id order by e.id) as rn,
             count(*) over (partition by e.work_order_id) as n
        from work_order_events e join work_orders w on w.id = e.work_order_id
       where e.at = now() and e.kind <> 'release')
    update work_order_events e
       set at = r.released + (now() - r.released) * (r.rn::float8 / (r.n + 1)::float8)
      from ranked r where r.id = e.id`);
  if (!plan.length && !waiting.length) return;
  await db.execute(sql`
    update work_orders w set updated_at = x.at
      from (select work_order_id, max(at) as at from work_order_events group by work_order_id) x
     where x.work_order_id = w.id and w.id in (${sql.join([...plan, ...waiting].map((w) => sql`${w.id}`), sql`, `)})`);
}

/** The seed step registered in SEED_STEPS (server/seed/demo.ts), after 'demo-build-sheets'. */
export const demoFloorStep = {
  id: 'demo-floor',
  run: (db: Db) => seedFloor(db),
};
