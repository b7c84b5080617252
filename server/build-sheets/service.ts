import type { SessionUser } from '../../src/contracts/auth';
import {
  OVERRIDE_REASON_MIN,
  SHORT_STOCK_NOTE_MIN,
  WARNINGS_BLOCKING_APPROVAL,
  WARNINGS_NEEDING_OVERRIDE,
  type ApproveBuildSheetRequest,
  type BuildSheetRecord,
  type CoilResult,
  type DraftBuildSheetRequest,
  type EngineeringQueueItem,
  type OrderLineDetail,
  type ReleaseBuildSheetRequest,
  type StartingSpec,
} from '../../src/contracts/build-sheets';
import type { CoilSpec, CoilTarget } from '../../src/contracts/coil';
import { ORDER_STATUS_LABELS, type OrderStatus, type Requirement } from '../../src/contracts/orders';
import { RELEASED_STAGE } from '../../src/contracts/stages';
import type { StockCheck } from '../../src/contracts/stock';
import { PRIORITY_DEFAULT, type WorkOrderCreated } from '../../src/contracts/work-orders';
import { CoilSpecError, ENGINE_VERSION, MU0, designCoil, insulatedMassPerMetre, type WarningCode } from '../coil';
import * as customerRepo from '../customers/repository';
import type { Db, Tx } from '../db/client';
import { HttpError, badRequest, conflict, notFound, ruleBroken } from '../http/errors';
import * as orderRepo from '../orders/repository';
import { notifyFloor } from '../floor/feed';
import { lineFields, orderRecipients, transitionOrder, type NotificationSummary } from '../orders/service';
import { getReleaseSettings, withShopHeatTransfer } from '../settings/service';
import * as stockRepo from '../stock/repository';
import { allocate, freeSpools, stockCheckOf, wireNeeded } from '../stock/service';
import * as woRepo from '../work-orders/repository';
import { sheetChanges } from './changes';
import * as repo from './repository';

// The contract's lists are plain strings; these lines make the compiler hold them to the engine's codes.
const NEEDS_OVERRIDE: readonly WarningCode[] = WARNINGS_NEEDING_OVERRIDE;
const BLOCKS_APPROVAL: readonly WarningCode[] = WARNINGS_BLOCKING_APPROVAL;

/** Orders whose lines engineering no longer works on. */
const CLOSED_ORDER: readonly OrderStatus[] = ['cancelled', 'closed'];
/** Orders whose lines may be released to the floor (lines are fixed once acknowledged). */
const RELEASABLE_ORDER: readonly OrderStatus[] = ['acknowledged', 'in_production', 'partly_shipped'];

/**
 * `history`: for the demo seed only (never reachable from the API) — lets it draft, approve and
 * release lines of orders that are already shipped or closed, so the demo's past orders have the
 * sheets and work orders they would have had; their notices are recorded as skipped and they
 * reserve no wire (it was used long ago).
 */
export type ServiceOpts = { history?: boolean };

const label = (s: OrderStatus) => ORDER_STATUS_LABELS[s].toLowerCase();

// ── The starting spec of a line ─────────────────────────────────────────────────────────────

/** What the engineer has chosen so far (each overrides the requirement's preference). */
export type StartingChoices = Partial<Pick<CoilSpec, 'conductor' | 'wire' | 'insulationGrade' | 'pattern'>>;

/** Placeholder size when neither the customer nor the engineer named one: a mid-range magnet wire. */
const PLACEHOLDER_WIRE = { standard: 'AWG', gauge: 28 } as const;
/** Insulation grade when none is asked for: grade 2 is the usual stock (common practice, no published source). */
const DEFAULT_GRADE = 2 as const;
const DEFAULT_PATTERN = 'layer' as const;

const fmt = (x: number, digits = 3) => Number(x.toPrecision(digits)).toString();

/**
 * A starting CoilSpec and solve target from an order line's requirement, for *find wire*
 * (POST /api/coil/solve with { spec, target }). Pure. Every choice the requirement leaves open
 * is filled with a stated default and explained in `notes`.
 *
 * A field wanted at the winding's centre is not a target the solver takes; it is converted to
 * ampere-turns with the long-solenoid approximation B = μ₀·N·I/ℓ (ℓ = the bobbin's traverse),
 * so N·I = B·ℓ/μ₀. A real winding of finite length gives less than that at its centre, so the
 * engineer checks the sheet's centre field.
 */
export function requirementToSpec(req: Requirement, choices: StartingChoices = {}): StartingSpec {
  const notes: string[] = [];
  const pref = req.conductor ?? {};
  const conductor = choices.conductor ?? pref.material ?? 'copper';
  if (!choices.conductor && !pref.material) notes.push('No conductor stated: copper assumed.');
  const wire = choices.wire ?? pref.wire ?? PLACEHOLDER_WIRE;
  if (!choices.wire && !pref.wire) {
    notes.push(`No wire size stated: AWG ${PLACEHOLDER_WIRE.gauge} is only a placeholder — use find wire to choose the size.`);
  }
  const insulationGrade = choices.insulationGrade ?? pref.insulationGrade ?? DEFAULT_GRADE;
  if (!choices.insulationGrade && !pref.insulationGrade) notes.push(`No insulation grade stated: grade ${DEFAULT_GRADE} assumed.`);
  const pattern = choices.pattern ?? DEFAULT_PATTERN;
  if (!choices.pattern) notes.push(`Winding pattern: ${DEFAULT_PATTERN} winding assumed; change it if the bobbin or the quantity calls for another.`);
  if (req.fit === 'envelope') {
    notes.push('The customer gave an envelope, not a bobbin: these are the envelope’s dimensions — take off the bobbin’s walls and flanges before approving.');
  }
  if (req.resistance !== undefined) {
    notes.push(`The customer expects ${fmt(req.resistance)} Ω at 20 °C (the line’s tolerance applies): compare the sheet’s resistance at 20 °C.`);
  }

  const spec: CoilSpec = {
    conductor,
    wire,
    insulationGrade,
    bobbin: req.bobbin,
    pattern,
    drive: req.drive,
    dutyCycle: req.dutyCycle,
    ambient: req.ambient,
    insulationClass: req.insulationClass,
    ...(req.magneticCircuit && { magneticCircuit: req.magneticCircuit }),
  };

  let target: CoilTarget | null;
  const t = req.target;
  if (t.kind === 'ampereTurns') target = { ampereTurns: t.ampereTurns };
  else if (t.kind === 'pull') target = { pullForce: t.force };
  else if (t.at === 'gap') target = { gapFluxDensity: t.fluxDensity };
  else {
    const ampereTurns = (t.fluxDensity * req.bobbin.length) / MU0;
    target = { ampereTurns };
    notes.push(
      `The field wanted at the centre (${fmt(t.fluxDensity)} T) is converted to ${fmt(ampereTurns)} ampere-turns with the long-solenoid approximation B = μ₀·N·I/ℓ over the ${fmt(req.bobbin.length * 1000)} mm traverse; a winding of finite length gives less at its centre, so check the sheet’s centre field.`,
    );
  }
  return { spec, target, notes };
}

// ── Reading ─────────────────────────────────────────────────────────────────────────────────

const codes = (s: repo.SheetRow) => s.result.warnings.map((w) => w.code);

function toRecord(
  s: repo.SheetRow,
  orderId: number,
  orderStatus: OrderStatus,
  names: Map<number, string>,
  previous: repo.SheetRow | undefined,
): BuildSheetRecord {
  const who = (id: number | null) => (id !== null && names.has(id) ? { id, name: names.get(id)! } : null);
  const overrideNeededFor = codes(s).filter((c) => NEEDS_OVERRIDE.includes(c));
  const blockedBy = codes(s).filter((c) => BLOCKS_APPROVAL.includes(c));
  return {
    id: s.id,
    lineId: s.lineId,
    orderId,
    version: s.version,
    status: s.status,
    spec: s.spec,
    target: s.target ?? null,
    result: s.result as unknown as CoilResult,
    engineVersion: s.engineVersion,
    notes: s.notes,
    overrideReason: s.overrideReason,
    shortStockNote: s.shortStockNote,
    draftedBy: who(s.draftedBy),
    draftedAt: s.draftedAt.toISOString(),
    approvedBy: who(s.approvedBy),
    approvedAt: s.approvedAt?.toISOString() ?? null,
    releasedBy: who(s.releasedBy),
    releasedAt: s.releasedAt?.toISOString() ?? null,
    supersededAt: s.supersededAt?.toISOString() ?? null,
    overrideNeededFor,
    blockedBy,
    can: {
      approve: s.status === 'draft' && blockedBy.length === 0 && !CLOSED_ORDER.includes(orderStatus),
      release: s.status === 'approved' && RELEASABLE_ORDER.includes(orderStatus),
    },
    changes: sheetChanges(previous, s),
  };
}

/** Records of sheets of one line; `earlier` holds versions to compare with that are not in `sheets`. */
async function records(db: Db | Tx, sheets: repo.SheetRow[], orderId: number, orderStatus: OrderStatus, earlier: repo.SheetRow[] = []) {
  const names = await orderRepo.userNames(db, sheets.flatMap((s) => [s.draftedBy, s.approvedBy, s.releasedBy]));
  const byVersion = new Map([...earlier, ...sheets].map((s) => [s.version, s]));
  return sheets.map((s) => toRecord(s, orderId, orderStatus, names, byVersion.get(s.version - 1)));
}

export async function getBuildSheet(db: Db | Tx, id: number): Promise<BuildSheetRecord> {
  const sheet = await repo.findSheet(db, id);
  if (!sheet) throw notFound('No such build sheet');
  const line = await repo.findLine(db, sheet.lineId);
  if (!line) throw notFound('No such build sheet');
  const previous = sheet.version > 1 ? await repo.findVersion(db, sheet.lineId, sheet.version - 1) : undefined;
  return (await records(db, [sheet], line.order.id, line.order.status, previous ? [previous] : []))[0];
}

/** A line with its order, customer, requirement, every sheet version and the starting spec. */
export async function getOrderLine(db: Db | Tx, lineId: number): Promise<OrderLineDetail> {
  const row = await repo.findLine(db, lineId);
  if (!row) throw notFound('No such order line');
  const { line: l, order: o } = row;
  const sheets = await repo.listForLine(db, lineId);
  return {
    ...lineFields(l),
    order: { id: o.id, number: o.number, status: o.status, purchaseOrder: o.purchaseOrder, orderDate: o.orderDate, dueDate: o.dueDate },
    customer: { id: o.customerId, name: row.customerName },
    sheets: await records(db, sheets, o.id, o.status),
    releasedSheetId: sheets.find((s) => s.status === 'released')?.id ?? null,
    starting: requirementToSpec(l.requirement),
    can: { draft: !CLOSED_ORDER.includes(o.status) },
  };
}

export async function engineeringQueue(db: Db | Tx): Promise<EngineeringQueueItem[]> {
  const rows = await repo.engineeringQueue(db);
  return rows.map((r) => ({
    lineId: r.line.id,
    lineNo: r.line.lineNo,
    title: r.line.title,
    quantity: r.line.quantity,
    dueDate: r.order.dueDate,
    late: r.late,
    order: { id: r.order.id, number: r.order.number, status: r.order.status, purchaseOrder: r.order.purchaseOrder },
    customer: r.customer,
    latestSheet: r.latest && r.latest.id !== null ? { id: r.latest.id, version: r.latest.version, status: r.latest.status } : null,
  }));
}

// ── Drafting and approving ──────────────────────────────────────────────────────────────────

function orderOpen(status: OrderStatus, opts: ServiceOpts) {
  if (CLOSED_ORDER.includes(status) && !(opts.history && status === 'closed')) {
    throw ruleBroken(`The order is ${label(status)}; its lines take no more build sheets`, { order: `The order is ${label(status)}` });
  }
}

/** Runs the engine on a spec; a spec it refuses is 400 naming the field under `spec.`. */
function design(spec: CoilSpec) {
  try {
    return designCoil(spec);
  } catch (e) {
    if (e instanceof CoilSpecError) throw badRequest(e.message, { [`spec.${e.field}`]: e.message.replace(`${e.field}: `, '') });
    throw e;
  }
}

/**
 * A new draft version of a line's build sheet, with the engine's result computed now. Earlier
 * versions stay as they are (history).
 */
export async function draftBuildSheet(
  db: Db,
  lineId: number,
  input: DraftBuildSheetRequest,
  actor: SessionUser,
  opts: ServiceOpts = {},
): Promise<BuildSheetRecord> {
  // A spec naming no heat-transfer coefficient gets the shop's adopted default (if any), stored with the sheet.
  const spec = await withShopHeatTransfer(db, input.spec);
  const result = design(spec);
  const id = await db.transaction(async (tx) => {
    const line = await repo.lockLine(tx, lineId);
    if (!line) throw notFound('No such order line');
    const found = await repo.findLine(tx, lineId);
    orderOpen(found!.order.status, opts);
    const version = await repo.nextVersion(tx, lineId);
    const row = await repo.insertSheet(tx, {
      lineId,
      version,
      status: 'draft',
      spec,
      target: input.target,
      result,
      engineVersion: ENGINE_VERSION,
      notes: input.notes,
      draftedBy: actor.id,
    });
    return row.id;
  });
  return getBuildSheet(db, id);
}

const fixed = (s: repo.SheetRow) =>
  ruleBroken(`Version ${s.version} is ${s.status} and cannot change; draft a new version instead`, {
    status: `This sheet is ${s.status}`,
  });

/**
 * Approves a draft. A sheet whose coil does not fit is never approved; one with an
 * over-temperature, thermal-runaway or saturation warning needs a written override reason.
 */
export async function approveBuildSheet(
  db: Db,
  id: number,
  input: ApproveBuildSheetRequest,
  actor: SessionUser,
  opts: ServiceOpts = {},
): Promise<BuildSheetRecord> {
  await db.transaction(async (tx) => {
    const sheet = await repo.lockSheet(tx, id);
    if (!sheet) throw notFound('No such build sheet');
    const line = await repo.findLine(tx, sheet.lineId);
    orderOpen(line!.order.status, opts);
    if (sheet.status !== 'draft') throw fixed(sheet);
    const blocked = sheet.result.warnings.filter((w) => BLOCKS_APPROVAL.includes(w.code));
    if (blocked.length) {
      throw ruleBroken('A coil that does not fit cannot be approved; draft a new version that fits', {
        result: blocked.map((w) => w.message).join(' '),
      });
    }
    const needs = sheet.result.warnings.filter((w) => NEEDS_OVERRIDE.includes(w.code));
    const reason = input.overrideReason;
    if (needs.length && (!reason || reason.length < OVERRIDE_REASON_MIN)) {
      throw ruleBroken(`This sheet has warnings (${needs.map((w) => w.code).join(', ')}); approving it needs a written override reason`, {
        overrideReason: reason
          ? `Say why in at least ${OVERRIDE_REASON_MIN} characters`
          : `Write why this sheet may be built despite: ${needs.map((w) => w.message).join(' ')}`,
      });
    }
    await repo.updateSheet(tx, id, { status: 'approved', approvedBy: actor.id, approvedAt: new Date(), overrideReason: reason ?? null });
  });
  return getBuildSheet(db, id);
}

// ── Stock ───────────────────────────────────────────────────────────────────────────────────

const wireKey = (s: repo.SheetRow): stockRepo.WireKey => ({
  conductor: s.spec.conductor,
  wire: s.spec.wire,
  insulationGrade: s.spec.insulationGrade,
});

/**
 * Wire mass one unit takes from a spool (whose net mass counts the enamel too), kg. Engine 2
 * results carry it as wireMass; an engine 1 result counted the bare conductor only, so its
 * insulated mass is worked out from its own wire length and diameters (the record is not changed).
 */
export function spoolMassPerUnit(s: repo.SheetRow): number {
  const r = s.result;
  if (r.conductorMass !== undefined) return r.wireMass;
  return r.wireLength * insulatedMassPerMetre(s.spec.conductor, r.wire.bareDiameter, r.wire.overallDiameter);
}

/** What releasing a sheet would need of its wire against the free stock (before release). */
export async function stockCheck(db: Db | Tx, id: number): Promise<StockCheck> {
  const sheet = await repo.findSheet(db, id);
  if (!sheet) throw notFound('No such build sheet');
  const line = await repo.findLine(db, sheet.lineId);
  if (!line) throw notFound('No such build sheet');
  const { scrapAllowancePercent } = await getReleaseSettings(db);
  const key = wireKey(sheet);
  return stockCheckOf(key, await freeSpools(db, key), line.line.quantity, spoolMassPerUnit(sheet), scrapAllowancePercent);
}

// ── Releasing ───────────────────────────────────────────────────────────────────────────────

/** "WO-" + two-digit year + "-" + the shop-wide sequence. */
export const formatWorkOrderNumber = (at: Date, n: number) => `WO-${String(at.getFullYear() % 100).padStart(2, '0')}-${String(n).padStart(5, '0')}`;

/** A quantity split into batches of at most `per` units: 60 by 25 → 25, 25, 10. */
export function splitQuantity(quantity: number, per: number): number[] {
  const out: number[] = [];
  for (let left = quantity; left > 0; left -= per) out.push(Math.min(per, left));
  return out;
}

export type ReleaseResult = {
  /** The new work orders; their ids are what the traveler queue is asked to print (after commit). */
  workOrders: WorkOrderCreated[];
  buildSheet: BuildSheetRecord;
  stock: StockCheck;
  /** The customer notice; null when a revised version replaces an earlier release (the customer was told then). */
  notification: NotificationSummary | null;
};

/**
 * Releases an approved sheet to the floor, in one transaction: the line's quantity split into
 * work orders of at most `unitsPerWorkOrder` units (stage ready, numbered from the shop-wide
 * sequence, each with its first event), the wire they need reserved from spools of the same
 * wire oldest lot first, the previous released version superseded (its work orders still ready
 * go on hold and give back their wire), the order moved to in_production when acknowledged, and
 * an 'order_released' notice for the customer. Short stock is refused unless an engineer or
 * admin writes a short-stock note. The sheet row is locked first: the same sheet released twice
 * at once gives one release and one 409.
 *
 * The result's `workOrders[].id` are the ids to hand to the traveler queue after this returns
 * (the transaction has committed by then).
 */
export async function releaseBuildSheet(
  db: Db,
  id: number,
  input: ReleaseBuildSheetRequest,
  actor: SessionUser,
  opts: ServiceOpts = {},
): Promise<ReleaseResult> {
  const out = await db.transaction(async (tx) => {
    const sheet = await repo.lockSheet(tx, id);
    if (!sheet) throw notFound('No such build sheet');
    if (sheet.status === 'released') throw conflict(`Version ${sheet.version} was released already`);
    if (sheet.status !== 'approved') {
      throw ruleBroken(
        sheet.status === 'draft' ? 'Approve the sheet before releasing it' : `Version ${sheet.version} is superseded; release the newer version`,
        { status: `This sheet is ${sheet.status}` },
      );
    }
    const found = await repo.findLine(tx, sheet.lineId);
    if (!found) throw notFound('No such build sheet');
    const line = found.line;
    const order = await orderRepo.lockOrder(tx, found.order.id);
    if (!order) throw notFound('No such order');
    const history = opts.history && (order.status === 'shipped' || order.status === 'closed');
    if (!RELEASABLE_ORDER.includes(order.status) && !history) {
      throw ruleBroken(
        order.status === 'entered'
          ? 'Acknowledge the order before releasing: while it is entered its lines can still change'
          : `The order is ${label(order.status)}; nothing more is released to the floor for it`,
        { order: `The order is ${label(order.status)}` },
      );
    }

    // A newer version replaces the released one: it is superseded; its work orders not yet started go on hold.
    const previous = await repo.lockReleased(tx, line.id, id);
    const now = new Date();
    if (previous) {
      await repo.updateSheet(tx, previous.id, { status: 'superseded', supersededAt: now });
      const waiting = await woRepo.lockBySheetAndStage(tx, previous.id, RELEASED_STAGE);
      const ids = waiting.map((w) => w.id);
      await stockRepo.deleteReservations(tx, ids);
      await woRepo.setStage(tx, ids, 'on_hold');
      await woRepo.insertEvents(
        tx,
        ids.map((workOrderId) => ({
          workOrderId,
          at: now,
          userId: actor.id,
          fromStage: RELEASED_STAGE,
          toStage: 'on_hold' as const,
          note: `Build sheet v${previous.version} superseded by v${sheet.version}; its wire reservation was given back`,
        })),
      );
      // The board hears of it like any other move.
      for (const w of waiting) await notifyFloor(tx, { kind: 'move', id: w.id, number: w.number, stage: 'on_hold', version: w.version + 1, at: now.toISOString() });
    }
    const firstRelease = !previous && !(await repo.everReleased(tx, line.id, id));

    // Stock: lock the wire's spools, then check and reserve oldest lot first.
    const { unitsPerWorkOrder, scrapAllowancePercent } = await getReleaseSettings(tx);
    const key = wireKey(sheet);
    await stockRepo.lockSpools(tx, key);
    const spools = await freeSpools(tx, key);
    const stock = stockCheckOf(key, spools, line.quantity, spoolMassPerUnit(sheet), scrapAllowancePercent);
    const note = input.shortStockNote;
    // A past order's wire was used long ago: the demo seed's history releases reserve none.
    if (stock.short && !history) {
      const fmtKg = (x: number) => `${fmt(x)} kg`;
      const mayOverride = actor.role === 'engineer' || actor.role === 'admin';
      if (!mayOverride || !note) {
        throw ruleBroken(`Short of wire: the work orders need ${fmtKg(stock.needed)}, the spools hold ${fmtKg(stock.available)} free`, {
          stock: `Short by ${fmtKg(stock.shortfall)}`,
          ...(mayOverride && { shortStockNote: 'To release anyway, write a short-stock note' }),
        });
      }
      if (note.length < SHORT_STOCK_NOTE_MIN) {
        throw ruleBroken('The short-stock note is too short', { shortStockNote: `Say why in at least ${SHORT_STOCK_NOTE_MIN} characters` });
      }
    }

    // Work orders, their first events and their wire.
    const released: WorkOrderCreated[] = [];
    for (const quantity of splitQuantity(line.quantity, unitsPerWorkOrder)) {
      const number = formatWorkOrderNumber(now, await woRepo.nextWorkOrderSequence(tx));
      const wo = await woRepo.insertWorkOrder(tx, {
        number,
        orderId: order.id,
        lineId: line.id,
        buildSheetId: id,
        stage: RELEASED_STAGE,
        quantity,
        dueDate: order.dueDate,
        priority: PRIORITY_DEFAULT,
        version: 1,
      });
      await woRepo.insertEvents(tx, [
        {
          workOrderId: wo.id,
          at: now,
          userId: actor.id,
          fromStage: null,
          toStage: RELEASED_STAGE,
          kind: 'release' as const,
          note: `Released from build sheet v${sheet.version}${stock.short && !history ? ` despite short wire stock: ${note}` : ''}`,
        },
      ]);
      const takes = history ? [] : allocate(spools, wireNeeded(spoolMassPerUnit(sheet), quantity, scrapAllowancePercent));
      await stockRepo.insertReservations(tx, takes.map((t) => ({ spoolId: t.spoolId, workOrderId: wo.id, mass: t.mass })));
      released.push({ id: wo.id, number: wo.number, stage: wo.stage, quantity: wo.quantity, dueDate: wo.dueDate, version: wo.version });
      if (!history) await notifyFloor(tx, { kind: 'release', id: wo.id, number: wo.number, stage: wo.stage, version: wo.version, at: now.toISOString() });
    }

    await repo.updateSheet(tx, id, {
      status: 'released',
      releasedBy: actor.id,
      releasedAt: now,
      shortStockNote: stock.short && !history ? note! : null,
    });

    // The order goes into production with its first released line.
    if (order.status === 'acknowledged') {
      await transitionOrder(tx, order, 'in_production', actor.id, { note: `Line ${line.lineNo} released to the floor (build sheet v${sheet.version})` });
    }

    let notification: NotificationSummary | null = null;
    if (firstRelease) {
      const customer = await customerRepo.findCustomer(tx, order.customerId);
      const lines = await orderRepo.listLines(tx, order.id);
      const recipients = await orderRecipients(tx, order.customerId);
      const skipped = history ? 'Recorded by the demo seed for a past order; not sent' : recipients.length ? null : 'The customer has no contact with an e-mail address';
      const row = await orderRepo.insertNotification(tx, {
        kind: 'order_released',
        orderId: order.id,
        recipients,
        payload: {
          orderId: order.id,
          orderNumber: order.number,
          customerId: order.customerId,
          customerName: customer?.name ?? '',
          purchaseOrder: order.purchaseOrder,
          dueDate: order.dueDate,
          releasedAt: now.toISOString(),
          line: { lineNo: line.lineNo, quantity: line.quantity, title: line.title, customerPartNumber: line.customerPartNumber },
          workOrderCount: released.length,
          lines: lines.map((l) => ({ lineNo: l.lineNo, quantity: l.quantity, title: l.title, customerPartNumber: l.customerPartNumber })),
        },
        status: skipped ? 'skipped' : 'pending',
        reason: skipped,
        dueAt: now,
      });
      notification = { id: row.id, status: row.status, recipients: row.recipients, reason: row.reason };
    }
    return { workOrders: released, stock, notification };
  });
  return { ...out, buildSheet: await getBuildSheet(db, id) };
}

/** For callers outside HTTP (the seed): an HttpError's fields in one line. */
export const describeError = (e: unknown) => (e instanceof HttpError ? `${e.message} ${JSON.stringify(e.fields ?? {})}` : String(e));
