import type { SessionUser } from '../../src/contracts/auth';
import type { ListWorkOrdersQuery, WorkOrderDetail, WorkOrderSummary } from '../../src/contracts/work-orders';
import { sheetEssentials } from '../build-sheets/essentials';
import type { Db, Tx } from '../db/client';
import { notFound } from '../http/errors';
import * as repo from './repository';

type Row = Awaited<ReturnType<typeof repo.listWorkOrders>>[number];

/** Customer-role users read only their own company's work orders. */
function scopeFor(viewer: SessionUser): number | undefined {
  if (viewer.role !== 'customer') return undefined;
  return viewer.customerId ?? -1;
}

function toSummary(r: Row, internal: boolean): WorkOrderSummary {
  const w = r.wo;
  return {
    id: w.id,
    number: w.number,
    stage: w.stage,
    version: w.version,
    quantity: w.quantity,
    dueDate: w.dueDate,
    priority: w.priority,
    ...(internal && { assignee: w.assigneeId !== null && r.assigneeName ? { id: w.assigneeId, name: r.assigneeName } : null }),
    station: null,
    order: { id: r.order.id, number: r.order.number, purchaseOrder: r.order.purchaseOrder, customer: { id: r.order.customerId, name: r.customerName } },
    line: r.line,
    buildSheetId: w.buildSheetId,
    createdAt: w.createdAt.toISOString(),
  };
}

export async function listWorkOrders(db: Db | Tx, viewer: SessionUser, q: Partial<ListWorkOrdersQuery> = {}): Promise<WorkOrderSummary[]> {
  const rows = await repo.listWorkOrders(db, { stages: q.stage, orderId: q.orderId, lineId: q.lineId, customerId: scopeFor(viewer) });
  return rows.map((r) => toSummary(r, viewer.role !== 'customer'));
}

/** One work order with its sheet's essentials and its history; another company's is 404 for a customer. */
export async function getWorkOrder(db: Db | Tx, viewer: SessionUser, id: number): Promise<WorkOrderDetail> {
  const [row] = await repo.listWorkOrders(db, { id, customerId: scopeFor(viewer) });
  if (!row) throw notFound('No such work order');
  const internal = viewer.role !== 'customer';
  const events = await repo.listEvents(db, id);
  return {
    ...toSummary(row, internal),
    buildSheet: internal ? sheetEssentials(row.sheet, row.line.tolerancePercent) : null,
    events: events.map(({ event: e, userName }) => ({
      id: e.id,
      at: e.at.toISOString(),
      ...(internal && { user: e.userId !== null && userName ? { id: e.userId, name: userName } : null, note: e.note }),
      fromStage: e.fromStage,
      toStage: e.toStage,
      stationId: e.stationId,
    })),
  };
}
