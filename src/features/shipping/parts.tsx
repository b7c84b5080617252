/** Small pieces the shipping screens share. */
import type { ReactNode } from 'react';
import { SHIPMENT_DOCUMENT_LABELS, type ShipmentDocumentInfo } from '../../contracts/shipments';
import { StatusBadge, type StatusKind } from '../../components/Status';
import { formatBytes, formatDateTime } from '../../lib/format';
import { documentHref } from './api';

export function Fact({ label, children }: { label: string; children: ReactNode }) {
  return (
    <div>
      <dt className="text-xs font-semibold tracking-wide text-graphite-500 uppercase">{label}</dt>
      <dd className="font-semibold text-graphite-900">{children}</dd>
    </div>
  );
}

/** A shipment's documents: each with its state, and a download link once it is drawn. */
export function DocumentList({ shipmentId, documents }: { shipmentId: number; documents: ShipmentDocumentInfo[] }) {
  return (
    <ul className="flex flex-col divide-y divide-graphite-100" aria-label="Documents">
      {documents.map((d) => (
        <li key={d.kind} className="flex items-center justify-between gap-3 py-2" data-document={d.kind} data-state={d.state}>
          <div>
            <p className="font-semibold text-graphite-900">{SHIPMENT_DOCUMENT_LABELS[d.kind]}</p>
            <p className="text-sm text-graphite-600">
              {d.state === 'ready'
                ? [d.pages ? `${d.pages} ${d.pages === 1 ? 'page' : 'pages'}` : null, d.size ? formatBytes(d.size) : null, d.createdAt ? `drawn ${formatDateTime(d.createdAt)}` : null]
                    .filter(Boolean)
                    .join(' · ')
                : 'Being drawn by the document worker…'}
            </p>
          </div>
          {d.state === 'ready' ? (
            <a
              href={d.downloadUrl ?? documentHref(shipmentId, d.kind)}
              className="inline-flex items-center gap-1.5 rounded-md border border-graphite-300 bg-white px-3 py-1.5 font-semibold whitespace-nowrap text-copper-700 hover:bg-graphite-50"
              aria-label={`Download the ${SHIPMENT_DOCUMENT_LABELS[d.kind].toLowerCase()} (PDF)`}
              download
            >
              <svg viewBox="0 0 16 16" className="size-4" aria-hidden>
                <path d="M8 2v8m0 0L5 7m3 3 3-3M3 12.5h10" fill="none" stroke="currentColor" strokeWidth="1.6" strokeLinecap="round" strokeLinejoin="round" />
              </svg>
              Download PDF
            </a>
          ) : (
            <span className="inline-flex items-center gap-2 text-sm font-semibold text-graphite-600" role="status">
              <span aria-hidden className="size-4 animate-spin rounded-full border-2 border-copper-500 border-r-transparent" />
              Pending
            </span>
          )}
        </li>
      ))}
    </ul>
  );
}

/** The customer notice's outbox status in words, shape and colour. */
const NOTICE: Record<string, { kind: StatusKind; word: string }> = {
  pending: { kind: 'idle', word: 'Waiting to be sent' },
  sending: { kind: 'idle', word: 'Sending' },
  sent: { kind: 'good', word: 'Sent' },
  failed: { kind: 'fault', word: 'Failed' },
  skipped: { kind: 'caution', word: 'Not sent' },
};

export function NoticeStatus({ status }: { status: string }) {
  const s = NOTICE[status] ?? { kind: 'idle' as const, word: status };
  return <StatusBadge kind={s.kind}>{s.word}</StatusBadge>;
}
