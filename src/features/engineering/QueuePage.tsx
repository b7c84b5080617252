/** The engineering queue: order lines with no released build sheet, oldest due first. */
import { useQuery } from '@tanstack/react-query';
import { createColumnHelper } from '@tanstack/react-table';
import { useMemo } from 'react';
import { Link } from 'react-router';
import { BUILD_SHEET_STATUS_LABELS, type EngineeringQueueItem } from '../../contracts/build-sheets';
import { Alert } from '../../components/Alert';
import { DataTable } from '../../components/DataTable';
import { Loading, PageHeader } from '../../components/Panel';
import { StatusBadge } from '../../components/Status';
import { errorMessage } from '../../lib/api';
import { formatDay } from '../../lib/format';
import { queueQuery } from './api';
import { linePath } from './paths';
import { SheetStatusBadge } from './SheetActions';

const col = createColumnHelper<EngineeringQueueItem>();



export function QueuePage() {
  const queue = useQuery(queueQuery);
  const columns = useMemo(
    () => [
      col.accessor('dueDate', {
        header: 'Due',
        cell: (c) => (
          <span className="flex items-center gap-2 whitespace-nowrap">
            {formatDay(c.getValue())}
            {c.row.original.late && <StatusBadge kind="fault">Late</StatusBadge>}
          </span>
        ),
        meta: { csv: (r) => r.dueDate },
      }),
      col.accessor((r) => `${r.order.number} / ${r.lineNo}`, {
        id: 'line',
        header: 'Order / line',
        cell: (c) => (
          <Link to={linePath(c.row.original.lineId)} className="font-semibold text-copper-700 hover:underline" data-line-link={c.row.original.lineId}>
            {c.getValue()}
          </Link>
        ),
      }),
      col.accessor('title', { header: 'Coil' }),
      col.accessor((r) => r.customer.name, { id: 'customer', header: 'Customer', meta: { filter: 'select' } }),
      col.accessor('quantity', { header: 'Qty', meta: { align: 'right' } }),
      col.accessor((r) => (r.latestSheet ? BUILD_SHEET_STATUS_LABELS[r.latestSheet.status] : 'Not started'), {
        id: 'sheet',
        header: 'Build sheet',
        meta: { filter: 'select' },
        cell: (c) => {
          const s = c.row.original.latestSheet;
          return s ? (
            <span className="flex items-center gap-1.5">
              <SheetStatusBadge status={s.status} /> <span className="text-xs text-graphite-600">v{s.version}</span>
            </span>
          ) : (
            <StatusBadge kind="idle">Not started</StatusBadge>
          );
        },
      }),
      col.accessor((r) => r.order.purchaseOrder, { id: 'po', header: 'PO' }),
    ],
    [],
  );

  return (
    <div>
      <PageHeader title="Engineering queue" lead="Order lines waiting for a released build sheet, oldest due date first. Open a line to draft, check and release its sheet." />
      {queue.isPending ? (
        <Loading what="Loading the queue" />
      ) : queue.isError ? (
        <Alert kind="fault" title="Could not load the queue">
          {errorMessage(queue.error)}
        </Alert>
      ) : (
        <DataTable
          data={queue.data}
          columns={columns}
          noun="line"
          csvName="spoolwright-engineering-queue"
          caption="Order lines awaiting engineering"
          getRowId={(r) => String(r.lineId)}
          initialSorting={[{ id: 'dueDate', desc: false }]}
          rowClassName={(r) => (r.late ? 'shadow-[inset_3px_0_0_#a8261f]' : '')}
          empty="Nothing waits for engineering."
        />
      )}
    </div>
  );
}
