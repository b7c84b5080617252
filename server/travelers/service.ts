import { createHash } from 'node:crypto';
import { PDFDocument } from 'pdf-lib';
import type { SessionUser } from '../../src/contracts/auth';
import { FLOW_STAGES, STAGE_LABELS } from '../../src/contracts/stages';
import { PRIORITY_LABELS, type Priority } from '../../src/contracts/work-orders';
import type { TravelerBatchResult, TravelerInfo } from '../../src/contracts/travelers';
import { renderTraveler } from '../../jobs/travelers/render';
import { publicJobId, type Queues } from '../../jobs/queues';
import type { Db } from '../db/client';
import type { Storage } from '../infra/storage';
import { HttpError, notFound, ruleBroken } from '../http/errors';
import { getShopSettings } from '../settings/service';
import * as repo from './repository';

/** The stages a traveler carries sign-off rows for: the floor's part of the flow. */
const SIGN_OFF_STAGES = FLOW_STAGES.filter((s) => !['engineering', 'ready', 'shipped'].includes(s));

/** One traveler per work order and build-sheet version: the key of its job and of its file. */
export const travelerJobKey = (workOrderId: number, buildSheetId: number) => `traveler-wo${workOrderId}-bs${buildSheetId}`;

const queueDown = () => new HttpError(503, 'unavailable', 'The print queue is not reachable right now; try again shortly');

/**
 * Puts a print job on the queue once: the same job id answers a second request, and a job that
 * failed is run again. An unreachable queue is a 503.
 */
async function enqueueOnce(queues: Queues, name: 'traveler' | 'batch', data: object, jobId: string) {
  try {
    const existing = await queues.travelers.getJob(jobId);
    if (existing && (await existing.getState()) === 'failed') await existing.retry('failed');
    else if (!existing) await queues.travelers.add(name, data, { jobId });
  } catch {
    throw queueDown();
  }
}

/**
 * Asks for a work order's traveler. The job id is derived from the work order and its build
 * sheet, so asking twice (or a retry) never prints twice: the same job answers.
 */
export async function requestTraveler(db: Db, queues: Queues, workOrderId: number, user: SessionUser) {
  const [wo] = await repo.workOrdersByIds(db, [workOrderId]);
  if (!wo) throw notFound('No such work order');
  const jobId = travelerJobKey(wo.id, wo.buildSheetId);
  await enqueueOnce(queues, 'traveler', { workOrderId: wo.id, userId: user.id }, jobId);
  return { jobId: publicJobId('travelers', jobId) };
}

/** Prints a whole order or a selection at once: one job, one merged PDF, progress as it goes. */
export async function requestBatch(db: Db, queues: Queues, req: { orderId?: number; workOrderIds?: number[] }, user: SessionUser) {
  const ids = req.orderId !== undefined ? (await repo.workOrdersOfOrder(db, req.orderId)).map((w) => w.id) : [...new Set(req.workOrderIds)];
  if (!ids.length) throw ruleBroken('This order has no work orders yet: release its build sheets first', { orderId: 'No work orders' });
  const found = await repo.workOrdersByIds(db, ids);
  const missing = ids.filter((id) => !found.some((f) => f.id === id));
  if (missing.length) throw new HttpError(400, 'validation', `No work order ${missing.join(', ')}`, { workOrderIds: `No such work order: ${missing.join(', ')}` });
  const ordered = ids.map((id) => found.find((f) => f.id === id)!);
  const key = createHash('sha256').update(ordered.map((w) => `${w.id}:${w.buildSheetId}`).join(',')).digest('hex').slice(0, 24);
  const jobId = `batch-${key}`;
  await enqueueOnce(queues, 'batch', { workOrderIds: ordered.map((w) => w.id), userId: user.id, key }, jobId);
  return { jobId: publicJobId('travelers', jobId), count: ordered.length };
}

/**
 * Releasing a build sheet prints its work orders' travelers: one batch job. When the queue is
 * unreachable the release still stands; the answer says so and the travelers can be printed from
 * the order page later.
 */
export async function queueTravelersAfterRelease(db: Db, queues: Queues, workOrderIds: number[], user: SessionUser) {
  if (!workOrderIds.length) return null;
  try {
    return await requestBatch(db, queues, { workOrderIds }, user);
  } catch {
    return null;
  }
}

const storageKey = (workOrderId: number, buildSheetId: number, sha: string) => `travelers/wo-${workOrderId}/bs-${buildSheetId}-${sha.slice(0, 12)}.pdf`;
export const batchStorageKey = (key: string) => `travelers/batches/${key}.pdf`;

/**
 * Builds and stores the traveler of a work order at its current build sheet, unless it exists
 * already (then the stored one is the answer: nothing prints twice).
 */
export async function ensureTraveler(db: Db, storage: Storage, publicUrl: string, workOrderId: number, userId: number) {
  const src = await repo.loadTravelerSource(db, workOrderId);
  if (!src) throw notFound(`No work order ${workOrderId}`);
  const existing = await repo.findTraveler(db, workOrderId, src.sheet.id);
  if (existing) return existing;
  const [shop, user] = await Promise.all([getShopSettings(db), repo.userById(db, userId)]);
  const pdf = await renderTraveler({
    shopName: shop.name,
    paper: shop.paper,
    url: `${publicUrl.replace(/\/$/, '')}/work-orders/${workOrderId}`,
    generatedAt: new Date(),
    generatedBy: user?.name ?? 'Spoolwright',
    units: { lengthUnit: user?.lengthUnit ?? 'mm', temperatureUnit: user?.temperatureUnit ?? 'C' },
    workOrder: {
      number: src.workOrder.number,
      quantity: src.workOrder.quantity,
      dueDate: src.workOrder.dueDate,
      priority: PRIORITY_LABELS[src.workOrder.priority as Priority] ?? String(src.workOrder.priority),
      stage: src.workOrder.stage,
    },
    order: { number: src.order.number, purchaseOrder: src.order.purchaseOrder, customerName: src.customerName },
    line: {
      lineNo: src.line.lineNo,
      title: src.line.title,
      customerPartNumber: src.line.customerPartNumber || null,
      tolerancePercent: Number(src.line.tolerancePercent),
      terminationNotes: src.line.terminationNotes ?? '',
      leadNotes: src.line.leadNotes ?? '',
    },
    sheet: { version: src.sheet.version, engineVersion: src.sheet.engineVersion, spec: src.sheet.spec, result: src.sheet.result, approvedBy: src.approvedByName ?? null },
    spoolLots: src.lots,
    stages: SIGN_OFF_STAGES.map((s) => ({ key: s, label: STAGE_LABELS[s] })),
    scrapAllowancePercent: Number(shop.scrapAllowancePercent),
  });
  const sha256 = createHash('sha256').update(pdf).digest('hex');
  const pages = (await PDFDocument.load(pdf)).getPageCount();
  const key = storageKey(workOrderId, src.sheet.id, sha256);
  await storage.put(key, pdf, 'application/pdf', { sha256 });
  return repo.insertTraveler(db, {
    workOrderId,
    buildSheetId: src.sheet.id,
    buildSheetVersion: src.sheet.version,
    storageKey: key,
    sha256,
    size: pdf.length,
    pages,
    paper: shop.paper,
    createdBy: userId,
  });
}

/** Builds every traveler of a batch (reporting progress) and merges them into one PDF. */
export async function buildBatch(
  db: Db,
  storage: Storage,
  publicUrl: string,
  data: { workOrderIds: number[]; userId: number; key: string },
  progress: (percent: number) => Promise<void>,
): Promise<TravelerBatchResult> {
  const merged = await PDFDocument.create();
  merged.setTitle(`Travelers (${data.workOrderIds.length})`);
  let done = 0;
  for (const id of data.workOrderIds) {
    const t = await ensureTraveler(db, storage, publicUrl, id, data.userId);
    const part = await PDFDocument.load(await storage.getBuffer(t.storageKey));
    const pages = await merged.copyPages(part, part.getPageIndices());
    for (const p of pages) merged.addPage(p);
    done += 1;
    // The last 5 % is the merge and upload.
    await progress(Math.round((done / data.workOrderIds.length) * 95));
  }
  const bytes = Buffer.from(await merged.save());
  await storage.put(batchStorageKey(data.key), bytes, 'application/pdf');
  await progress(100);
  return { count: data.workOrderIds.length, pages: merged.getPageCount(), downloadUrl: `/api/traveler-batches/${data.key}.pdf` };
}

/** What exists for a work order: its latest traveler and whether the build sheet moved on since. */
export async function travelerInfo(db: Db, workOrderId: number): Promise<TravelerInfo> {
  const [wo] = await repo.workOrdersByIds(db, [workOrderId]);
  if (!wo) throw notFound('No such work order');
  const t = await repo.latestTraveler(db, workOrderId);
  return {
    exists: !!t,
    stale: !!t && t.buildSheetId !== wo.buildSheetId,
    buildSheetVersion: t?.buildSheetVersion ?? null,
    createdAt: t?.createdAt.toISOString() ?? null,
    sha256: t?.sha256 ?? null,
    size: t?.size ?? null,
    pages: t?.pages ?? null,
    downloadUrl: t ? `/api/work-orders/${workOrderId}/traveler.pdf` : null,
  };
}

export async function latestTravelerFile(db: Db, storage: Storage, workOrderId: number) {
  const t = await repo.latestTraveler(db, workOrderId);
  if (!t) throw notFound('No traveler has been printed for this work order yet');
  const [wo] = await repo.workOrdersByIds(db, [workOrderId]);
  const file = await storage.get(t.storageKey);
  return { ...file, filename: `traveler-${wo?.number ?? workOrderId}.pdf`, sha256: t.sha256 };
}

export async function batchFile(storage: Storage, key: string) {
  if (!/^[a-f0-9]{24}$/.test(key)) throw notFound('No such batch');
  try {
    const file = await storage.get(batchStorageKey(key));
    return { ...file, filename: `travelers-${key.slice(0, 8)}.pdf` };
  } catch {
    throw notFound('No such batch (print it again)');
  }
}
