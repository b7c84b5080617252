/**
 * Files a notice carries, fetched by the mail processor while it holds the outbox row's lock:
 * the shipment notice attaches the certificate of conformance, drawing and storing it first
 * when the documents job has not yet (the same idempotent function the job uses).
 */
import type { Deps } from '../../server/deps';
import type { NotificationRow } from '../../server/notifications/service';
import { DOCUMENT_FILE_NAMES, ensureShipmentDocument } from '../../server/shipments/documents';
import type { MailAttachment } from './templates';

export async function mailAttachments(deps: Deps, row: NotificationRow): Promise<MailAttachment[]> {
  if (row.kind === 'shipment_sent') {
    const doc = await ensureShipmentDocument(deps.db, deps.storage, Number(row.payload.shipmentId), 'certificate');
    const content = await deps.storage.getBuffer(doc.storageKey);
    return [{ filename: `${row.payload.shipmentNumber}-${DOCUMENT_FILE_NAMES.certificate}.pdf`, content, contentType: 'application/pdf' }];
  }
  return [];
}
