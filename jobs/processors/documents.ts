import type { Job } from 'bullmq';
import type { Deps } from '../../server/deps';
import { documentUrl } from '../../server/shipments/service';
import { ensureShipmentDocuments, type DocumentsJobData } from '../../server/shipments/documents';

/** Draws and stores a shipment's packing list and certificate (idempotent: stored ones are kept unless `force`). */
export function documentsProcessor(deps: Deps) {
  return async (job: Job<DocumentsJobData>) => {
    const { shipmentId, force } = job.data;
    const docs = await ensureShipmentDocuments(deps.db, deps.storage, shipmentId, force);
    await job.updateProgress(100);
    return { documents: docs.map((d) => ({ kind: d.kind, sha256: d.sha256, pages: d.pages, downloadUrl: documentUrl(shipmentId, d.kind) })) };
  };
}
