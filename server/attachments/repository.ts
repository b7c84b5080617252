import { asc, eq } from 'drizzle-orm';
import type { Db, Tx } from '../db/client';
import { attachments, users } from '../db/schema';

export type AttachmentRow = typeof attachments.$inferSelect;

export async function insertAttachment(tx: Tx, values: typeof attachments.$inferInsert) {
  const [row] = await tx.insert(attachments).values(values).returning();
  return row;
}

export function findAttachment(db: Db | Tx, id: number) {
  return db.query.attachments.findFirst({ where: eq(attachments.id, id) });
}

export async function lockAttachment(tx: Tx, id: number) {
  const [row] = await tx.select().from(attachments).where(eq(attachments.id, id)).for('update');
  return row as AttachmentRow | undefined;
}

export async function deleteAttachment(tx: Tx, id: number) {
  await tx.delete(attachments).where(eq(attachments.id, id));
}

export function listForOrder(db: Db | Tx, orderId: number) {
  return db
    .select({ attachment: attachments, uploaderName: users.name })
    .from(attachments)
    .leftJoin(users, eq(users.id, attachments.uploadedBy))
    .where(eq(attachments.orderId, orderId))
    .orderBy(asc(attachments.createdAt), asc(attachments.id));
}
