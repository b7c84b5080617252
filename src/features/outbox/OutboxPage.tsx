import { useQuery } from '@tanstack/react-query';
import { createColumnHelper } from '@tanstack/react-table';
import { useMemo } from 'react';
import type { FailedJob, NotificationRecord } from '../../contracts/jobs';
import { Alert } from '../../components/Alert';
import { Button } from '../../components/Button';
import { DataTable } from '../../components/DataTable';
import { Loading, PageHeader, Panel } from '../../components/Panel';
import { StatusBadge, type StatusKind } from '../../components/Status';
import { errorMessage } from '../../lib/api';
import { formatDateTime } from '../../lib/format';
import { failedJobsQuery, outboxQuery, useRetryJob, useRetryNotification } from './api';

const STATUS: Record<NotificationRecord['status'], { kind: StatusKind; word: string }> = {
  pending: { kind: 'idle', word: 'Waiting' },
  sending: { kind: 'idle', word: 'Sending' },
  sent: { kind: 'good', word: 'Sent' },
  failed: { kind: 'fault', word: 'Failed' },
  skipped: { kind: 'caution', word: 'Not sent' },
};

const KIND_WORDS: Record<string, string> = {
  order_acknowledged: 'Order acknowledged',
  order_released: 'Released to production',
  order_shipped: 'Shipped',
  unit_failed: 'Unit failed test (internal)',
};

const col = createColumnHelper<NotificationRecord>();
const jobCol = createColumnHelper<FailedJob>();

/** The admin's view of outgoing mail and of background jobs that gave up. */
export function OutboxPage() {
  const outbox = useQuery(outboxQuery);
  const jobs = useQuery(failedJobsQuery);
  const retry = useRetryNotification();
  const retryJob = useRetryJob();

  const columns = useMemo(
    () => [
      col.accessor('createdAt', { header: 'Asked for', cell: (c) => formatDateTime(c.getValue()) }),
      col.accessor((n) => KIND_WORDS[n.kind] ?? n.kind, { id: 'kind', header: 'Message', meta: { filter: 'select' } }),
      col.accessor((n) => n.orderNumber ?? '—', { id: 'order', header: 'Order' }),
      col.accessor((n) => n.recipients.map((r) => `${r.name} <${r.email}>`).join(', ') || '—', { id: 'to', header: 'To' }),
      col.accessor((n) => STATUS[n.status].word, {
        id: 'status',
        header: 'Status',
        meta: { filter: 'select' },
        cell: (c) => <StatusBadge kind={STATUS[c.row.original.status].kind}>{c.getValue()}</StatusBadge>,
      }),
      col.accessor('attempts', { header: 'Tries', meta: { align: 'right' } }),
      col.accessor((n) => n.sentAt, { id: 'sentAt', header: 'Sent', cell: (c) => formatDateTime(c.getValue(), '—') }),
      col.accessor((n) => n.lastError ?? n.reason ?? '', { id: 'why', header: 'Last error or reason', cell: (c) => <span className="text-sm text-graphite-600">{c.getValue()}</span> }),
      col.display({
        id: 'actions',
        header: '',
        cell: (c) =>
          ['failed', 'skipped'].includes(c.row.original.status) && c.row.original.recipients.length > 0 ? (
            <Button size="sm" busy={retry.isPending && retry.variables === c.row.original.id} onClick={() => retry.mutate(c.row.original.id)}>
              Send again
            </Button>
          ) : null,
      }),
    ],
    [retry],
  );

  const jobColumns = useMemo(
    () => [
      jobCol.accessor('failedAt', { header: 'Failed', cell: (c) => formatDateTime(c.getValue(), '—') }),
      jobCol.accessor('queue', { header: 'Queue' }),
      jobCol.accessor('id', { header: 'Job' }),
      jobCol.accessor('attempts', { header: 'Tries', meta: { align: 'right' } }),
      jobCol.accessor('error', { header: 'Error', cell: (c) => <span className="text-sm text-fault">{c.getValue()}</span> }),
      jobCol.display({
        id: 'actions',
        header: '',
        cell: (c) => (
          <Button size="sm" busy={retryJob.isPending && retryJob.variables === c.row.original.id} onClick={() => retryJob.mutate(c.row.original.id)}>
            Retry
          </Button>
        ),
      }),
    ],
    [retryJob],
  );

  return (
    <div className="space-y-6">
      <PageHeader
        title="Outbox and background work"
        lead="Every customer e-mail the shop has asked for, whether it went out, and the background jobs that gave up after their last try."
        actions={
          outbox.data?.mailViewerUrl ? (
            <a className="text-copper-700 underline" href={outbox.data.mailViewerUrl} target="_blank" rel="noreferrer">
              Open the local mailbox viewer
            </a>
          ) : null
        }
      />
      {(retry.error || retryJob.error) && <Alert title="Could not retry">{errorMessage(retry.error ?? retryJob.error)}</Alert>}
      <Panel title="E-mail">
        {outbox.isPending ? (
          <Loading what="Loading the outbox" />
        ) : outbox.error ? (
          <Alert title="Cannot load the outbox">{errorMessage(outbox.error)}</Alert>
        ) : (
          <DataTable data={outbox.data.notifications} columns={columns} noun="message" csvName="outbox" getRowId={(n) => String(n.id)} initialSorting={[{ id: 'createdAt', desc: true }]} />
        )}
      </Panel>
      <Panel title="Failed background jobs">
        {jobs.isPending ? (
          <Loading what="Loading jobs" />
        ) : jobs.error ? (
          <Alert title="Cannot reach the job queue">{errorMessage(jobs.error)}</Alert>
        ) : (
          <DataTable data={jobs.data} columns={jobColumns} noun="failed job" csvName="failed-jobs" getRowId={(j) => j.id} empty={<p className="p-4 text-graphite-600">No job has given up. Jobs retry by themselves before they land here.</p>} />
        )}
      </Panel>
    </div>
  );
}
