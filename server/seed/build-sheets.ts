/**
 * Demo seed: wire stock and build sheets. Receives the spools, then drafts, approves and
 * releases build sheets through the build-sheet service (never by writing rows), so the demo
 * shop has released work orders for the orders that are in production or past, lines still
 * awaiting engineering (some with drafts), releases despite short stock and a superseded version.
 * Every design is the engine's own (engine 2: it meets its target at the low operating corner and
 * stays within its class at the high one), so no demo sheet carries a warning; an approval would
 * take an override reason only if one did. Suppliers, lots and notes are invented.
 */
import { asc, eq, sql } from 'drizzle-orm';
import type { SessionUser } from '../../src/contracts/auth';
import type { CoilSpec, CoilTarget } from '../../src/contracts/coil';
import type { OrderStatus } from '../../src/contracts/orders';
import type { ReceiveSpoolBody } from '../../src/contracts/stock';
import { receiveSpoolRequest } from '../../src/contracts/stock';
import { approveBuildSheet, draftBuildSheet, releaseBuildSheet, requirementToSpec, stockCheck, type ServiceOpts } from '../build-sheets/service';
import { solveCoil, sweepWireSizes, type BuildSheet } from '../coil';
import type { Db } from '../db/client';
import { buildSheets, orderLines, orders } from '../db/schema';
import { receiveSpool } from '../stock/service';
import { findUserByEmail } from '../users/repository';
import { toSessionUser } from '../users/service';

const daysAgo = (d: number) => new Date(Date.now() - d * 86_400_000).toISOString();
const awg = (gauge: number) => ({ standard: 'AWG' as const, gauge });

/**
 * Thirteen invented spools: copper grade 2 mostly, in the sizes the demo designs use, two of
 * aluminium in the R40 size 0.85 mm and one metric copper. AWG 31 is deliberately short, so the
 * last door-holder releases need a note.
 */
const SPOOLS: ReceiveSpoolBody[] = [
  { conductor: 'copper', wire: awg(20), insulationGrade: 2, supplier: 'Hollinrake Wire Co.', lot: 'HW-23-0388', netMass: 35, location: 'Floor bay 2', receivedAt: daysAgo(140) },
  { conductor: 'copper', wire: awg(27), insulationGrade: 2, supplier: 'Hollinrake Wire Co.', lot: 'HW-23-0417', netMass: 120, location: 'Rack A1', receivedAt: daysAgo(120) },
  { conductor: 'copper', wire: awg(27), insulationGrade: 2, supplier: 'Marrowgate Enamels', lot: 'ME-5512', netMass: 90, location: 'Rack A1', receivedAt: daysAgo(30) },
  { conductor: 'copper', wire: awg(27), insulationGrade: 2, supplier: 'Tessaly Magnet Wire', lot: 'TMW/91-02', netMass: 80, location: 'Floor bay 1', receivedAt: daysAgo(8) },
  { conductor: 'copper', wire: awg(29), insulationGrade: 2, supplier: 'Hollinrake Wire Co.', lot: 'HW-23-0502', netMass: 60, location: 'Rack A2', receivedAt: daysAgo(95) },
  { conductor: 'copper', wire: awg(29), insulationGrade: 2, supplier: 'Tessaly Magnet Wire', lot: 'TMW/88-13', netMass: 50, location: 'Rack A2', receivedAt: daysAgo(12) },
  { conductor: 'copper', wire: awg(31), insulationGrade: 2, supplier: 'Tessaly Magnet Wire', lot: 'TMW/88-20', netMass: 40, location: 'Rack A3', receivedAt: daysAgo(60) },
  { conductor: 'copper', wire: awg(30), insulationGrade: 1, supplier: 'Quenby Fine Wires', lot: 'QFW-0733', netMass: 6, location: 'Cabinet F', receivedAt: daysAgo(20) },
  { conductor: 'copper', wire: awg(33), insulationGrade: 2, supplier: 'Quenby Fine Wires', lot: 'QFW-0719', netMass: 30, location: 'Cabinet F', receivedAt: daysAgo(45) },
  { conductor: 'copper', wire: awg(40), insulationGrade: 2, supplier: 'Quenby Fine Wires', lot: 'QFW-0802', netMass: 25, location: 'Cabinet F', receivedAt: daysAgo(25) },
  { conductor: 'copper', wire: { standard: 'metric', diameter: 0.25e-3 }, insulationGrade: 2, supplier: 'Brevik Kabelwerk', lot: 'BK-2291-7', netMass: 7.5, location: 'Rack B1', receivedAt: daysAgo(50) },
  { conductor: 'aluminium', wire: { standard: 'metric', diameter: 0.85e-3 }, insulationGrade: 2, supplier: 'Brevik Kabelwerk', lot: 'BK-AL-0412', netMass: 50, location: 'Rack B2', receivedAt: daysAgo(80) },
  { conductor: 'aluminium', wire: { standard: 'metric', diameter: 0.85e-3 }, insulationGrade: 2, supplier: 'Ostrander Alloys', lot: 'OA-AL085-031', netMass: 45, location: 'Rack B2', receivedAt: daysAgo(35) },
];

const OVERRIDE_REASON =
  'Customer runs this coil on a timed pulse well below continuous rating; confirmed by phone, their controller limits on-time.';
const SHORT_STOCK_NOTE = 'More of this size is ordered from the usual supplier, due in three days; winding starts with what is on the rack.';

/** Does a sheet reach the target at its low operating corner (low supply, winding hot)? */
const meets = (s: BuildSheet, t: CoilTarget) =>
  (t.ampereTurns === undefined || s.corners.low.ampereTurns >= t.ampereTurns) &&
  (t.pullForce === undefined || (s.corners.low.pullForce ?? 0) >= t.pullForce) &&
  (t.gapFluxDensity === undefined || (s.corners.low.gapFluxDensity ?? 0) >= t.gapFluxDensity);

/** Warnings that make a size unfit to offer: it does not fit, runs away or runs over its class. */
const unfit = (s: BuildSheet) => s.warnings.some((w) => w.code === 'does-not-fit' || w.code === 'thermal-runaway' || w.code === 'over-temperature');

/**
 * The wire to build a line with. When the customer states the resistance their electronics
 * expect, the size within its class at the high corner whose R20 comes closest to it, as the
 * engineer would pick it (the sheet then shows how its other figures compare). Otherwise the
 * solver's best size when one meets the target cleanly; else the coolest size that fits and meets
 * the target although it runs hot (the engineer approves it with an override reason), else the
 * coolest size that fits.
 */
function chooseDesign(spec: CoilSpec, target: CoilTarget | null, resistance?: number): { spec: CoilSpec; target: CoilTarget | null } {
  if (resistance !== undefined) {
    const fits = sweepWireSizes(spec).filter((s) => !unfit(s));
    if (fits.length) {
      const off = (r: number) => Math.abs(Math.log(r / resistance));
      const closest = fits.reduce((a, b) => (off(b.resistance20) < off(a.resistance20) ? b : a));
      return { spec: { ...spec, wire: closest.wire.size }, target };
    }
  }
  if (target) {
    const best = solveCoil(spec, target).best;
    if (best) return { spec: { ...spec, wire: best.wire.size }, target };
  }
  const fitting = sweepWireSizes(spec).filter((s) => !s.warnings.some((w) => w.code === 'does-not-fit' || w.code === 'thermal-runaway'));
  const meeting = target ? fitting.filter((s) => meets(s, target)) : [];
  const pool = meeting.length ? meeting : fitting;
  if (!pool.length) return { spec, target };
  const coolest = pool.reduce((a, b) => (b.windingTemperature < a.windingTemperature ? b : a));
  return { spec: { ...spec, wire: coolest.wire.size }, target };
}

type Plan = 'release' | 'approve' | 'draft' | 'none';

/** What happens to each line of an order, by the order's status and its place in the list. */
function planFor(status: OrderStatus, nth: number, lineIndex: number, lineCount: number): Plan {
  switch (status) {
    case 'shipped':
    case 'closed':
    case 'partly_shipped':
      return 'release';
    case 'in_production':
      // Every second order still has its last line at engineering, half of those with a draft.
      if (nth % 2 === 1 && lineIndex === lineCount - 1) return nth % 4 === 1 ? 'draft' : 'none';
      return 'release';
    case 'acknowledged':
      // Two acknowledged orders get their first line released (and so go into production);
      // the others wait at engineering with a draft, an approved sheet, or nothing yet.
      if (nth < 2) return lineIndex === 0 ? 'release' : lineIndex === 1 ? 'draft' : 'none';
      if (nth === 2) return lineIndex === 0 ? 'approve' : 'draft';
      if (nth === 3) return lineIndex === 0 ? 'draft' : 'none';
      return 'none';
    case 'entered':
      return nth === 0 && lineIndex === 0 ? 'draft' : 'none';
    default:
      return 'none';
  }
}

export async function seedBuildSheets(db: Db) {
  const existing = await db.select({ id: buildSheets.id }).from(buildSheets).limit(1);
  if (existing.length) return;
  const engineerRow = await findUserByEmail(db, 'engineer@spoolwright.test');
  const officeRow = await findUserByEmail(db, 'office@spoolwright.test');
  if (!engineerRow || !officeRow) return; // not a demo installation
  const engineer: SessionUser = toSessionUser(engineerRow);
  const office: SessionUser = toSessionUser(officeRow);

  for (const s of SPOOLS) await receiveSpool(db, receiveSpoolRequest.parse(s), office);

  const rows = await db
    .select({ order: { id: orders.id, status: orders.status }, line: orderLines })
    .from(orderLines)
    .innerJoin(orders, eq(orders.id, orderLines.orderId))
    .orderBy(asc(orders.id), asc(orderLines.lineNo));
  const byOrder = new Map<number, { status: OrderStatus; lines: (typeof orderLines.$inferSelect)[] }>();
  for (const r of rows) {
    if (!byOrder.has(r.order.id)) byOrder.set(r.order.id, { status: r.order.status, lines: [] });
    byOrder.get(r.order.id)!.lines.push(r.line);
  }

  const designs = new Map<string, { spec: CoilSpec; target: CoilTarget | null }>();
  const seen = new Map<OrderStatus, number>();
  let revised = false;
  for (const { status, lines } of byOrder.values()) {
    const nth = seen.get(status) ?? 0;
    seen.set(status, nth + 1);
    const opts: ServiceOpts = { history: status === 'shipped' || status === 'closed' };
    for (const [i, line] of lines.entries()) {
      const plan = planFor(status, nth, i, lines.length);
      if (plan === 'none') continue;
      const key = JSON.stringify(line.requirement);
      if (!designs.has(key)) {
        const start = requirementToSpec(line.requirement);
        designs.set(key, chooseDesign(start.spec, start.target, line.requirement.resistance));
      }
      const design = designs.get(key)!;
      const sheet = await draftBuildSheet(db, line.id, { ...design, notes: '' }, engineer, opts);
      if (plan === 'draft') continue;
      await approveBuildSheet(db, sheet.id, { overrideReason: sheet.overrideNeededFor.length ? OVERRIDE_REASON : undefined }, engineer, opts);
      if (plan === 'approve') continue;
      const stock = opts.history ? null : await stockCheck(db, sheet.id);
      await releaseBuildSheet(db, sheet.id, { shortStockNote: stock?.short ? SHORT_STOCK_NOTE : undefined }, engineer, opts);

      // One line in production gets a revised version: v1 is superseded, its waiting work orders go on hold.
      if (!revised && status === 'in_production' && design.spec.pattern === 'layer' && !sheet.overrideNeededFor.length) {
        revised = true;
        const v2 = await draftBuildSheet(
          db,
          line.id,
          { spec: { ...design.spec, pattern: 'orthocyclic' }, target: design.target, notes: 'Orthocyclic for a tighter build; same wire.' },
          engineer,
        );
        await approveBuildSheet(db, v2.id, { overrideReason: v2.overrideNeededFor.length ? OVERRIDE_REASON : undefined }, engineer);
        const stock2 = await stockCheck(db, v2.id);
        await releaseBuildSheet(db, v2.id, { shortStockNote: stock2.short ? SHORT_STOCK_NOTE : undefined }, engineer);
      }
    }
  }

  // Spread the records over the orders' own weeks (the services stamped everything "now"): a
  // sheet of an order already in production or past was drafted, approved and released around
  // the time the order went into production.
  await db.execute(sql`
    with started as (
      select e.order_id, min(e.at) as at from order_events e
       where e.kind = 'status_changed' and e.changes->'status'->>1 = 'in_production' group by e.order_id),
    sheets as (
      select b.id, s.at + (b.version - 1) * interval '2 days' as released_at
        from build_sheets b join order_lines l on l.id = b.line_id join started s on s.order_id = l.order_id
       where s.at < now() - interval '1 day')
    update build_sheets b set
      drafted_at = least(now(), x.released_at - interval '26 hours'),
      approved_at = case when b.approved_at is null then null else least(now(), x.released_at - interval '3 hours') end,
      released_at = case when b.released_at is null then null else least(now(), x.released_at) end,
      superseded_at = case when b.superseded_at is null then null else least(now(), x.released_at + interval '2 days') end
      from sheets x where x.id = b.id`);
  await db.execute(sql`
    update work_orders w set created_at = b.released_at, updated_at = b.released_at
      from build_sheets b where b.id = w.build_sheet_id and b.released_at is not null`);
  await db.execute(sql`
    update work_order_events e set at = case when e.from_stage is null then w.created_at else greatest(e.at, w.created_at) end
      from work_orders w where w.id = e.work_order_id`);
  await db.execute(sql`
    update spool_reservations r set created_at = w.created_at from work_orders w where w.id = r.work_order_id`);
  await db.execute(sql`
    update notifications n set created_at = b.released_at, due_at = b.released_at
      from build_sheets b join order_lines l on l.id = b.line_id
     where n.kind = 'order_released' and n.order_id = l.order_id and (n.payload->'line'->>'lineNo')::int = l.line_no
       and b.released_at is not null and b.version = 1`);
  // Notices of releases backdated into the past would have gone out then; the demo does not send them now.
  await db.execute(sql`
    update notifications set status = 'skipped', reason = 'Demo history: released before the demo began; not sent'
     where kind = 'order_released' and status = 'pending' and created_at < now() - interval '1 day'`);
}

/** The seed step registered in SEED_STEPS (server/seed/demo.ts), after 'demo-orders'. */
export const demoBuildSheetsStep = {
  id: 'demo-build-sheets',
  run: (db: Db) => seedBuildSheets(db),
};
