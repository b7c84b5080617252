import type { SessionUser } from '../../src/contracts/auth';
import type { Stage } from '../../src/contracts/stages';
import type { ListWorkOrdersQuery, WorkOrderDetail, WorkOrderSummary } from '../../src/contracts/work-orders';
import { sheetEssentials } from '../build-sheets/essentials';
import type { Db, Tx } from '../db/client';
import { estimateRemaining, lateness, localDate } from '../floor/estimate';
import { allowedMoves, MOVERS, type UnitTestState } from '../floor/moves';
import { unitTestGate } from '../floor/unit-tests';
import { notFound } from '../http/errors';
import { getFloorSettings, type FloorSettings } from '../settings/service';
import * as repo from './repository';

type Row = Awaited<ReturnType<typeof repo.listWorkOrders>>[number];

/** Customer-role users read only their own company's work orders. */
function scopeFor(viewer: SessionUser): number | undefined {
  if (viewer.role !== 'customer') return undefined;
  return viewer.customerId ?? -1;
}

const iso = (v: string | Date | null) => (v === null ? null : new Date(v).toISOString());

type Ctx = { viewer: SessionUser; settings: FloorSettings; today: string; tests: Map<number, UnitTestState> };

function toSummary(r: Row, c: Ctx): WorkOrderSummary {
  const w = r.wo;
  const internal = c.viewer.role !== 'customer';
  const heldFrom = w.stage === 'on_hold' ? (r.lastFrom as Stage | null) : null;
  const est = estimateRemaining({ quantity: w.quantity, stage: w.stage, heldFrom, turns: r.sheet.result.turns }, r.station?.id ? r.station : null, c.settings);
  const flags = lateness(w.dueDate, w.stage, est.hours, c.today, c.settings);
  return {
    id: w.id,
    number: w.number,
    stage: w.stage,
    version: w.version,
    quantity: w.quantity,
    dueDate: w.dueDate,
    priority: w.priority,
    ...(internal && { assignee: w.assigneeId !== null && r.assigneeName ? { id: w.assigneeId, name: r.assigneeName } : null }),
    station: r.station?.id ? { id: r.station.id, name: r.station.name } : null,
    order: { id: r.order.id, number: r.order.number, purchaseOrder: r.order.purchaseOrder, customer: { id: r.order.customerId, name: r.customerName } },
    line: r.line,
    buildSheetId: w.buildSheetId,
    createdAt: w.createdAt.toISOString(),
    enteredStageAt: iso(r.enteredStageAt) ?? w.createdAt.toISOString(),
    late: flags.late,
    atRisk: flags.atRisk,
    estimatedHours: Math.round(est.hours * 100) / 100,
    ...(internal && {
      holdReason: w.stage === 'on_hold' ? (r.lastNote ?? '') : null,
      allowedMoves: MOVERS.includes(c.viewer.role)
        ? allowedMoves({
            actor: c.viewer,
            workOrder: { stage: w.stage, assigneeId: w.assigneeId },
            heldFrom,
            unitTests: c.tests.get(w.id) ?? { state: 'not_tracked' },
            stationId: w.stationId,
          })
        : [],
    }),
  };
}

async function context(db: Db | Tx, viewer: SessionUser, rows: Row[]): Promise<Ctx> {
  // One after the other: inside a transaction `db` is a single connection (pg refuses overlapping queries on one client).
  const settings = await getFloorSettings(db);
  const tests = await unitTestGate(db, rows.map((r) => r.wo.id));
  return { viewer, settings, today: localDate(), tests };
}

/** Rows with their summaries, for the board, "my work" and the load view. */
export async function summaries(db: Db | Tx, viewer: SessionUser, f: repo.WorkOrderFilter) {
  const rows = await repo.listWorkOrders(db, { ...f, customerId: scopeFor(viewer) });
  const c = await context(db, viewer, rows);
  return rows.map((r) => ({ row: r, summary: toSummary(r, c), settings: c.settings }));
}

export async function listWorkOrders(db: Db | Tx, viewer: SessionUser, q: Partial<ListWorkOrdersQuery> = {}): Promise<WorkOrderSummary[]> {
  const today = localDate();
  const list = await summaries(db, viewer, {
    stages: q.stage,
    orderId: q.orderId,
    lineId: q.lineId,
    customer: q.customer,
    assignee: q.assignee,
    station: q.station,
    dueFrom: q.dueFrom,
    dueTo: q.dueTo,
    number: q.number,
    late: q.late === undefined ? undefined : { today, value: q.late },
  });
  return list.map((x) => x.summary).filter((s) => q.atRisk === undefined || s.atRisk === q.atRisk);
}

/** One work order with its sheet's essentials and its history; another company's is 404 for a customer. */
export async function getWorkOrder(db: Db | Tx, viewer: SessionUser, id: number): Promise<WorkOrderDetail> {
  const [row] = await repo.listWorkOrders(db, { id, customerId: scopeFor(viewer) });
  if (!row) throw notFound('No such work order');
  const internal = viewer.role !== 'customer';
  const c = await context(db, viewer, [row]);
  const events = await repo.listEvents(db, id);
  return {
    ...toSummary(row, c),
    buildSheet: internal ? sheetEssentials(row.sheet, row.line.tolerancePercent) : null,
    events: events.map(({ event: e, userName, stationName, assigneeName }) => ({
      id: e.id,
      kind: e.kind,
      at: e.at.toISOString(),
      ...(internal && {
        user: e.userId !== null && userName ? { id: e.userId, name: userName } : null,
        note: e.note,
        station: e.stationId !== null && stationName ? { id: e.stationId, name: stationName } : null,
        ...(e.kind === 'assign' && { assignee: e.assigneeId !== null && assigneeName ? { id: e.assigneeId, name: assigneeName } : null }),
        turnsCounter: e.turnsCounter,
        spoolLot: e.spoolLot,
      }),
      fromStage: e.fromStage,
      toStage: e.toStage,
      stationId: e.stationId,
    })),
  };
}
