import { and, asc, desc, eq, lte, sql } from 'drizzle-orm';
import type { Db } from '../db/client';
import { notifications } from '../db/schema';
import { notFound, ruleBroken } from '../http/errors';

export type NotificationRow = typeof notifications.$inferSelect;

/**
 * The transactional outbox. A business change writes a `notifications` row in its own
 * transaction; the dispatcher (jobs/dispatcher.ts) puts due rows on the mail queue with the row id
 * as the job id; the mail processor sends each row at most once, holding the row's lock while it
 * sends and recording the message id in the same transaction.
 */

/** Pending rows whose time has come, oldest first. */
export function listDue(db: Db, limit = 100) {
  return db
    .select({ id: notifications.id })
    .from(notifications)
    .where(and(eq(notifications.status, 'pending'), lte(notifications.dueAt, new Date())))
    .orderBy(asc(notifications.dueAt))
    .limit(limit);
}

export type SendOutcome =
  | { outcome: 'sent'; messageId: string }
  | { outcome: 'already-sent' | 'not-pending'; status: string }
  | { outcome: 'busy' };

/**
 * Sends one notification exactly once. The row is locked (SKIP LOCKED: another worker sending it
 * right now means 'busy', and the job is retried later) for the whole send; the status changes to
 * 'sent' in the same transaction, so a worker that dies mid-send leaves the row pending and
 * unsent, and one that finished leaves it sent — a retry or a duplicate job sends nothing.
 */
export async function sendNotification(
  db: Db,
  id: number,
  send: (row: NotificationRow) => Promise<{ messageId: string }>,
): Promise<SendOutcome> {
  return db.transaction(async (tx) => {
    const [row] = await tx.select().from(notifications).where(eq(notifications.id, id)).for('update', { skipLocked: true });
    if (!row) {
      const exists = await tx.select({ status: notifications.status }).from(notifications).where(eq(notifications.id, id));
      if (!exists.length) throw notFound(`No notification ${id}`);
      return { outcome: 'busy' } as const;
    }
    if (row.status === 'sent') return { outcome: 'already-sent', status: row.status } as const;
    if (row.status !== 'pending') return { outcome: 'not-pending', status: row.status } as const;
    const { messageId } = await send(row);
    await tx
      .update(notifications)
      .set({ status: 'sent', sentAt: new Date(), messageId, attempts: row.attempts + 1, lastError: null })
      .where(eq(notifications.id, id));
    return { outcome: 'sent', messageId } as const;
  });
}

/** Records a failed attempt; `final` marks the row failed (the admin can retry it). */
export async function recordFailure(db: Db, id: number, error: string, final: boolean) {
  await db
    .update(notifications)
    .set({
      attempts: sql`${notifications.attempts} + 1`,
      lastError: error.slice(0, 2000),
      ...(final && { status: 'failed' as const, reason: 'Gave up after the last attempt' }),
    })
    .where(and(eq(notifications.id, id), eq(notifications.status, 'pending')));
}

/** Admin: a failed (or skipped) row goes back to pending; the dispatcher picks it up. */
export async function retryNotification(db: Db, id: number) {
  const [row] = await db.select().from(notifications).where(eq(notifications.id, id));
  if (!row) throw notFound('No such notification');
  if (row.status === 'sent') throw ruleBroken('This message was sent already; it is never sent twice', { status: 'sent' });
  if (row.status === 'pending') return row;
  if (!row.recipients.length) throw ruleBroken('This notification has nobody to send to', { recipients: 'No recipient' });
  const [updated] = await db
    .update(notifications)
    .set({ status: 'pending', dueAt: new Date(), reason: null })
    .where(eq(notifications.id, id))
    .returning();
  return updated;
}

export async function listNotifications(db: Db, status?: NotificationRow['status'], limit = 500) {
  return db
    .select()
    .from(notifications)
    .where(status ? eq(notifications.status, status) : undefined)
    .orderBy(desc(notifications.createdAt))
    .limit(limit);
}
