/** Wire stock: every spool with its reserved and free mass; receiving a new spool. */
import { useQuery } from '@tanstack/react-query';
import { createColumnHelper } from '@tanstack/react-table';
import { useMemo, useState } from 'react';
import type { SpoolRecord } from '../../contracts/stock';
import { Alert } from '../../components/Alert';
import { Button } from '../../components/Button';
import { DataTable } from '../../components/DataTable';
import { Dialog } from '../../components/Dialog';
import { Loading, PageHeader } from '../../components/Panel';
import { errorMessage } from '../../lib/api';
import { formatDay } from '../../lib/format';
import { useHasRole, useUnits } from '../../lib/session';
import { formatNumber } from '../../lib/units';
import { spoolsQuery } from './api';
import { ReceiveSpoolForm } from './ReceiveSpoolForm';

const col = createColumnHelper<SpoolRecord>();
const kg = (x: number) => `${formatNumber(x, 3)}\u00a0kg`;
const sizeLabel = (s: SpoolRecord) => (s.wire.standard === 'AWG' ? `AWG ${s.wire.gauge}` : `${formatNumber(s.wire.diameter * 1000, 3)} mm`);

export function SpoolsPage() {
  const spools = useQuery(spoolsQuery);
  const canReceive = useHasRole('office', 'engineer', 'admin');
  const u = useUnits();
  const [open, setOpen] = useState(false);
  const [notice, setNotice] = useState<string | null>(null);

  const columns = useMemo(
    () => [
      col.accessor((s) => (s.conductor === 'copper' ? 'Copper' : 'Aluminium'), { id: 'conductor', header: 'Conductor', meta: { filter: 'select' } }),
      col.accessor((s) => sizeLabel(s), {
        id: 'size',
        header: 'Size',
        meta: { filter: 'select' },
        sortingFn: (a, b) => {
          const d = (s: SpoolRecord) => (s.wire.standard === 'AWG' ? 0.127e-3 * Math.pow(92, (36 - s.wire.gauge) / 39) : s.wire.diameter);
          return d(a.original) - d(b.original);
        },
        cell: (c) => (
          <span className="font-semibold whitespace-nowrap">
            {c.getValue()}
            {u.prefs.lengthUnit === 'in' && c.row.original.wire.standard === 'metric' && <span className="ml-1 text-xs font-normal text-graphite-500">({u.length(c.row.original.wire.diameter, 4)})</span>}
          </span>
        ),
      }),
      col.accessor('insulationGrade', { header: 'Grade', meta: { align: 'right' } }),
      col.accessor('netMass', { header: 'Net', cell: (c) => kg(c.getValue()), meta: { align: 'right', label: 'Net kg' } }),
      col.accessor('reservedMass', { header: 'Reserved', cell: (c) => kg(c.getValue()), meta: { align: 'right', label: 'Reserved kg' } }),
      col.accessor('freeMass', {
        header: 'Free',
        cell: (c) => <span className={`font-semibold ${c.getValue() <= 0 ? 'text-fault' : ''}`}>{kg(c.getValue())}</span>,
        meta: { align: 'right', label: 'Free kg' },
      }),
      col.accessor('lot', { header: 'Lot', cell: (c) => <span className="whitespace-nowrap">{c.getValue()}</span> }),
      col.accessor('supplier', { header: 'Supplier', meta: { filter: 'select' } }),
      col.accessor('location', { header: 'Location', cell: (c) => c.getValue() || '—' }),
      col.accessor('receivedAt', { header: 'Received', cell: (c) => <span className="whitespace-nowrap">{formatDay(c.getValue())}</span> }),
    ],
    [u],
  );

  return (
    <div>
      <PageHeader
        title="Wire stock"
        lead="Spools of magnet wire on hand. A release reserves wire from the oldest matching lot first; free = net − reserved."
        actions={
          canReceive && (
            <Button variant="primary" onClick={() => setOpen(true)}>
              Receive a spool
            </Button>
          )
        }
      />
      {notice && (
        <div className="mb-3">
          <Alert kind="good" title={notice} />
        </div>
      )}
      {spools.isPending ? (
        <Loading what="Loading the spools" />
      ) : spools.isError ? (
        <Alert kind="fault" title="Could not load the spools">
          {errorMessage(spools.error)}
        </Alert>
      ) : (
        <DataTable
          data={spools.data}
          columns={columns}
          noun="spool"
          csvName="spoolwright-spools"
          caption="Spools in stock"
          getRowId={(s) => String(s.id)}
          initialSorting={[{ id: 'size', desc: false }]}
        />
      )}
      <Dialog open={open} title="Receive a spool" onClose={() => setOpen(false)} wide>
        <ReceiveSpoolForm
          onCancel={() => setOpen(false)}
          onDone={(s) => {
            setOpen(false);
            setNotice(`Received ${sizeLabel(s)} ${s.conductor}, lot ${s.lot}: ${kg(s.netMass)}.`);
          }}
        />
      </Dialog>
    </div>
  );
}
