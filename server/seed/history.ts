/**
 * Demo seed: history from before the shop recorded shipments in Spoolwright. The demo's closed
 * orders (45–90 days old) left the shop then, so their work orders are marked shipped, each with
 * one event saying so. Only this seed writes `shipped` directly: in the product a shipment is the
 * one way there, and the newer shipped and partly shipped orders get real shipments
 * (server/seed/shipments.ts).
 */
import { and, eq, inArray, sql } from 'drizzle-orm';
import type { Db } from '../db/client';
import { orderLines, orders, workOrderEvents, workOrders } from '../db/schema';

export const demoShippedHistoryStep = {
  id: 'demo-shipped-history',
  async run(db: Db) {
    const done = await db
      .select({ id: workOrders.id, stage: workOrders.stage, dueDate: workOrders.dueDate, status: orders.status, lineNo: orderLines.lineNo, orderId: orders.id })
      .from(workOrders)
      .innerJoin(orders, eq(orders.id, workOrders.orderId))
      .innerJoin(orderLines, eq(orderLines.id, workOrders.lineId))
      .where(and(inArray(orders.status, ['closed']), eq(workOrders.stage, 'ready')));
    const shipped = done;
    if (!shipped.length) return;
    const ids = shipped.map((w) => w.id);
    await db
      .update(workOrders)
      .set({ stage: 'shipped', version: sql`${workOrders.version} + 1`, updatedAt: sql`(${workOrders.dueDate}::timestamp + interval '10 hours')` })
      .where(inArray(workOrders.id, ids));
    await db.insert(workOrderEvents).values(
      shipped.map((w) => ({
        workOrderId: w.id,
        at: new Date(`${w.dueDate}T10:00:00Z`),
        userId: null,
        kind: 'move' as const,
        fromStage: 'ready' as const,
        toStage: 'shipped' as const,
        note: 'Shipped before the shop recorded shipments in Spoolwright (demo history)',
      })),
    );
  },
};
