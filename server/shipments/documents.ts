/**
 * A shipment's documents: drawn (jobs/documents/render.ts), stored in the object store with their
 * checksum, one row per shipment and kind. `ensureShipmentDocument` is the one way to get one:
 * it locks the shipment row, so two callers at once (the documents job and the mail processor)
 * draw it once; the second finds the stored one. Drawing again (`force`) replaces the row.
 */
import { createHash } from 'node:crypto';
import { PDFDocument } from 'pdf-lib';
import type { SessionUser } from '../../src/contracts/auth';
import { EMPTY_ADDRESS } from '../../src/contracts/customers';
import { SHIPMENT_DOCUMENT_KINDS, type ShipmentDocumentKind } from '../../src/contracts/shipments';
import { renderCertificate, renderPackingList, type CertificateUnit, type DocHeader } from '../../jobs/documents/render';
import { publicJobId, type Queues } from '../../jobs/queues';
import type { Db } from '../db/client';
import type { Storage } from '../infra/storage';
import { HttpError, notFound } from '../http/errors';
import { getShopSettings } from '../settings/service';
import { unitStandings } from '../test-records/service';
import * as repo from './repository';
import { getShipment, shipmentCustomer } from './service';

export const DOCUMENT_FILE_NAMES: Record<ShipmentDocumentKind, string> = { packing_list: 'packing-list', certificate: 'certificate-of-conformance' };

/** The documents job of a shipment: its id says what it does. A redraw names the drawing it replaces. */
export const documentsJobId = (shipmentId: number, replacing?: Date | null) => `shipment-docs-${shipmentId}${replacing ? `-redraw-${replacing.getTime()}` : ''}`;
export type DocumentsJobData = { shipmentId: number; force: boolean };

/** Everything both documents print, read once. */
async function documentSource(db: Db, shipmentId: number) {
  const s = await getShipment(db, shipmentId);
  const shop = await getShopSettings(db);
  const header: DocHeader = {
    shopName: shop.name,
    paper: shop.paper,
    number: s.number,
    shipDate: s.shipDate,
    customerName: s.customer.name,
    shipTo: { ...EMPTY_ADDRESS, ...s.shipTo },
    attention: s.attention,
    carrier: s.carrier,
    service: s.service,
    trackingNumber: s.trackingNumber,
    generatedAt: new Date(),
  };
  const items = s.items.map((i) => ({
    purchaseOrder: i.purchaseOrder,
    orderNumber: i.orderNumber,
    lineNo: i.lineNo,
    customerPartNumber: i.customerPartNumber,
    title: i.lineTitle,
    workOrderNumber: i.workOrderNumber,
    quantity: i.quantity,
    serials: i.serials,
  }));
  return { s, header, items };
}

async function certificateData(db: Db, src: Awaited<ReturnType<typeof documentSource>>) {
  const { s, header, items } = src;
  const woIds = s.items.map((i) => i.workOrderId);
  const raw = await repo.itemsOf(db, [s.id]);
  const records = await repo.testRecordsOf(db, woIds);
  const standings = await unitStandings(db, woIds);
  const lots = await repo.wireLotsOf(db, woIds);
  const sheets = new Map((await repo.sheetsWithPeople(db, [...new Set(raw.map((r) => r.wo.buildSheetId))])).map((x) => [x.sheet.id, x]));
  const instrumentIds = new Set<number>();
  const groups = s.items.map((item, k) => {
    const latest = new Map<string, (typeof records)[number]>();
    for (const r of records) if (r.workOrderId === item.workOrderId) latest.set(r.serial, r);
    const states = new Map((standings.get(item.workOrderId)?.units ?? []).map((u) => [u.serial, u.state]));
    const units: CertificateUnit[] = item.serials.map((serial) => {
      const r = latest.get(serial);
      if (!r) throw new Error(`No test record for serial ${serial} of ${item.workOrderNumber}`);
      r.instrumentIds.forEach((i) => instrumentIds.add(i));
      const reading = (name: string) => r.readings.find((x) => x.name === name);
      const hipot = r.entered.hipot;
      const ir = r.entered.insulationResistance;
      return {
        serial,
        verdict: states.get(serial) === 'use_as_is' ? 'use_as_is' : 'passed',
        resistance20: r.resistance20,
        nominalResistance20: r.nominalResistance20,
        tolerancePercent: r.tolerancePercent,
        deviationPercent: r.deviationPercent,
        hipot: hipot ? { voltage: hipot.voltage, seconds: hipot.seconds, leakage: hipot.leakage, passed: reading('hipot')?.passed ?? !hipot.breakdown } : null,
        insulation: ir ? { voltage: ir.voltage, resistance: ir.resistance, passed: reading('insulation_resistance')?.passed ?? true } : null,
        testedAt: r.testedAt.toISOString(),
      };
    });
    const sheet = sheets.get(raw.find((r) => r.wo.id === item.workOrderId)!.wo.buildSheetId)!;
    return {
      ...items[k],
      buildSheet: {
        version: sheet.sheet.version,
        engineVersion: sheet.sheet.engineVersion,
        approvedBy: sheet.approvedByName,
        approvedAt: sheet.sheet.approvedAt?.toISOString() ?? null,
        releasedBy: sheet.releasedByName,
        releasedAt: sheet.sheet.releasedAt?.toISOString() ?? null,
      },
      wireLots: (lots.get(item.workOrderId) ?? []).map((l) => ({ lot: l.lot, supplier: l.supplier })),
      units,
    };
  });
  const insts = await repo.instrumentsByIds(db, [...instrumentIds]);
  return {
    ...header,
    groups,
    instruments: insts.map((i) => ({ name: i.name, kind: i.kind, serial: i.serial, calibrationDue: i.calibrationDue })),
    signedBy: s.createdBy?.name ?? 'the shipping department',
    signedOn: s.shipDate,
  };
}

const storageKey = (shipmentId: number, kind: ShipmentDocumentKind, sha: string) => `shipments/sh-${shipmentId}/${kind}-${sha.slice(0, 12)}.pdf`;

/**
 * The stored document of a shipment, drawn now if it is not stored yet (or `force`). Holds the
 * shipment row's lock while drawing: a second caller waits and then finds it.
 */
export async function ensureShipmentDocument(db: Db, storage: Storage, shipmentId: number, kind: ShipmentDocumentKind, opts: { force?: boolean } = {}) {
  return db.transaction(async (tx) => {
    const locked = await repo.lockShipment(tx, shipmentId);
    if (!locked) throw notFound('No such shipment');
    const existing = await repo.findDocument(tx, shipmentId, kind);
    if (existing && !opts.force) return existing;
    const src = await documentSource(db, shipmentId);
    const pdf = kind === 'packing_list' ? await renderPackingList({ ...src.header, packages: src.s.packageList, packingNote: src.s.packingNote, items: src.items }) : await renderCertificate(await certificateData(db, src));
    const sha256 = createHash('sha256').update(pdf).digest('hex');
    const pages = (await PDFDocument.load(pdf)).getPageCount();
    const key = storageKey(shipmentId, kind, sha256);
    await storage.put(key, pdf, 'application/pdf', { sha256 });
    return repo.upsertDocument(tx, { shipmentId, kind, storageKey: key, sha256, size: pdf.length, pages });
  });
}

/** Both documents (the documents job). */
export async function ensureShipmentDocuments(db: Db, storage: Storage, shipmentId: number, force = false) {
  const out = [];
  for (const kind of SHIPMENT_DOCUMENT_KINDS) out.push(await ensureShipmentDocument(db, storage, shipmentId, kind, { force }));
  return out;
}

/**
 * Puts the documents job on the queue once (the same id answers twice; a failed one runs again).
 * `force` draws both again: the job id names the drawing it replaces, so asking twice draws once.
 */
export async function queueDocuments(db: Db, queues: Queues, shipmentId: number, force = false) {
  let replacing: Date | null = null;
  if (force) {
    const docs = await repo.documentsOf(db, [shipmentId]);
    replacing = docs.length ? new Date(Math.max(...docs.map((d) => d.createdAt.getTime()))) : null;
  }
  const jobId = documentsJobId(shipmentId, replacing);
  try {
    const existing = await queues.documents.getJob(jobId);
    if (existing && (await existing.getState()) === 'failed') await existing.retry('failed');
    else if (!existing) await queues.documents.add('shipment-docs', { shipmentId, force } satisfies DocumentsJobData, { jobId });
  } catch {
    throw new HttpError(503, 'unavailable', 'The documents queue is not reachable right now; try again shortly');
  }
  return { jobId: publicJobId('documents', jobId) };
}

/** A document to download: the customer only their own company's (another's is 404). Drawn now if missing. */
export async function documentFile(db: Db, storage: Storage, viewer: SessionUser, shipmentId: number, kind: ShipmentDocumentKind) {
  const customerId = await shipmentCustomer(db, shipmentId);
  if (customerId === null || (viewer.role === 'customer' && viewer.customerId !== customerId)) throw notFound('No such shipment');
  const doc = await ensureShipmentDocument(db, storage, shipmentId, kind);
  const s = await getShipment(db, shipmentId);
  const file = await storage.get(doc.storageKey);
  return { ...file, size: doc.size, sha256: doc.sha256, filename: `${s.number}-${DOCUMENT_FILE_NAMES[kind]}.pdf` };
}
