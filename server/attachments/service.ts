import { createHash, randomUUID } from 'node:crypto';
import type { Readable } from 'node:stream';
import type { SessionUser } from '../../src/contracts/auth';
import type { AttachmentCreated } from '../../src/contracts/orders';
import type { Db } from '../db/client';
import type { Storage } from '../infra/storage';
import { HttpError, badRequest, notFound, ruleBroken } from '../http/errors';
import * as orderRepo from '../orders/repository';
import { orderForViewer } from '../orders/service';
import * as repo from './repository';
import { ALLOWED_KINDS, sniffContent } from './sniff';

const FROZEN = ['cancelled', 'closed'];

const storeUnavailable = () => new HttpError(503, 'unavailable', 'The file store is not answering; try again shortly');

/** Keeps the last path part, drops control characters, and keeps it within 255 characters (extension kept). */
export function cleanFilename(name: string): string {
  // eslint-disable-next-line no-control-regex
  let base = (name.split(/[\\/]/).pop() ?? '').replace(/[\x00-\x1F\x7F]/g, '').trim();
  if (!base || base === '.' || base === '..') base = 'attachment';
  if (base.length > 255) {
    const dot = base.lastIndexOf('.');
    const ext = dot > 0 && base.length - dot <= 16 ? base.slice(dot) : '';
    base = base.slice(0, 255 - ext.length) + ext;
  }
  return base;
}

export type UploadedFile = { buffer: Buffer; originalname: string };

/**
 * Stores a drawing or spec for an order (or one of its lines). The content decides the type:
 * PDF, PNG, JPEG, DXF or STEP; anything else is refused (415) naming what it is. A file whose
 * name disagrees with its content (a PDF named .png) is kept under its name with the type its
 * content shows. Bytes go to the object store first; the row and its audit entry follow in one
 * transaction, and the object is removed again when that fails.
 */
export async function uploadAttachment(
  db: Db,
  storage: Storage,
  actor: SessionUser,
  orderId: number,
  file: UploadedFile | undefined,
  lineId: number | null | undefined,
): Promise<AttachmentCreated> {
  const { order } = await orderForViewer(db, actor, orderId);
  if (FROZEN.includes(order.status)) {
    throw ruleBroken(`A ${order.status} order takes no more files`, { file: `The order is ${order.status}` });
  }
  if (!file) throw badRequest('Choose a file to upload', { file: 'Choose a file to upload' });
  if (lineId != null && !(await orderRepo.listLines(db, orderId)).some((l) => l.id === lineId)) {
    throw badRequest('No such line on this order', { lineId: 'No such line on this order' });
  }
  const sniffed = await sniffContent(file.buffer);
  if (!sniffed.ok) {
    throw new HttpError(415, 'unsupported_media_type', `Only ${ALLOWED_KINDS} files are accepted; this is ${sniffed.what}`, {
      file: `This is ${sniffed.what}, not a ${ALLOWED_KINDS} file`,
    });
  }
  const filename = cleanFilename(file.originalname);
  const sha256 = createHash('sha256').update(file.buffer).digest('hex');
  const storageKey = `orders/${orderId}/${randomUUID()}`;
  try {
    await storage.put(storageKey, file.buffer, sniffed.contentType, { sha256 });
  } catch {
    throw storeUnavailable();
  }
  try {
    const row = await db.transaction(async (tx) => {
      const locked = await orderRepo.lockOrder(tx, orderId);
      if (!locked) throw notFound('No such order');
      if (FROZEN.includes(locked.status)) throw ruleBroken(`A ${locked.status} order takes no more files`, { file: `The order is ${locked.status}` });
      const a = await repo.insertAttachment(tx, {
        orderId,
        lineId: lineId ?? null,
        filename,
        contentType: sniffed.contentType,
        size: file.buffer.length,
        sha256,
        storageKey,
        uploadedBy: actor.id,
      });
      await orderRepo.insertEvent(tx, { orderId, actorId: actor.id, kind: 'attachment_added', changes: { attachment: [null, filename] } });
      return a;
    });
    return { id: row.id, filename: row.filename, contentType: row.contentType, size: row.size };
  } catch (e) {
    await storage.remove(storageKey).catch(() => {});
    throw e;
  }
}

/** The attachment and a stream of its bytes, if the viewer may read its order (else 404). */
export async function openAttachment(db: Db, storage: Storage, viewer: SessionUser, id: number) {
  const row = await repo.findAttachment(db, id);
  if (!row) throw notFound('No such attachment');
  try {
    await orderForViewer(db, viewer, row.orderId);
  } catch {
    throw notFound('No such attachment');
  }
  let body: Readable;
  try {
    body = (await storage.get(row.storageKey)).body;
  } catch (e) {
    if ((e as { name?: string }).name === 'NoSuchKey') throw notFound('The file of this attachment is missing from the store');
    throw storeUnavailable();
  }
  return { attachment: row, body };
}

/** Removes an attachment (row and audit entry in one transaction), then its object. */
export async function deleteAttachment(db: Db, storage: Storage, actor: SessionUser, id: number) {
  const key = await db.transaction(async (tx) => {
    const row = await repo.lockAttachment(tx, id);
    if (!row) throw notFound('No such attachment');
    const order = await orderRepo.lockOrder(tx, row.orderId);
    if (order && FROZEN.includes(order.status)) {
      throw ruleBroken(`The files of a ${order.status} order are kept`, { id: `The order is ${order.status}` });
    }
    await repo.deleteAttachment(tx, id);
    await orderRepo.insertEvent(tx, {
      orderId: row.orderId,
      actorId: actor.id,
      kind: 'attachment_removed',
      changes: { attachment: [row.filename, null] },
    });
    return row.storageKey;
  });
  // An object left behind by a failed removal is harmless: nothing points at it any more.
  await storage.remove(key).catch(() => {});
}
