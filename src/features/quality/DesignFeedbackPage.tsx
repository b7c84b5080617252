/**
 * Design feedback (/quality/design): for each released design, the measured R20 and turns
 * against the design, and from heat runs the effective heat-transfer coefficient h_eff (the value
 * that makes the engine's predicted rise match the measured one), with its spread. The shop-wide
 * h_eff can be adopted as the default for new build sheets (engineer, admin); sheets drafted
 * before keep the coefficient they were computed with.
 */
import { useQuery } from '@tanstack/react-query';
import { createColumnHelper } from '@tanstack/react-table';
import { useState } from 'react';
import { ADOPT_TOLERANCE_PERCENT } from '../../contracts/settings';
import type { DesignFeedbackRow } from '../../contracts/test-records';
import { Alert } from '../../components/Alert';
import { Button } from '../../components/Button';
import { DataTable } from '../../components/DataTable';
import { Loading, PageHeader, Panel } from '../../components/Panel';
import { errorMessage, isApiError } from '../../lib/api';
import { formatDateTime } from '../../lib/format';
import { useCurrentUser, useUnits } from '../../lib/session';
import { formatNumber, type UnitFormatters } from '../../lib/units';
import { designFeedbackQuery, useAdoptHeatTransfer } from './api';
import { heatTransfer, ohms, signedPercent } from './format';

const col = createColumnHelper<DesignFeedbackRow>();
const num = (v: number | null, digits: number) => (v === null ? '—' : formatNumber(v, digits));

function columns(u: UnitFormatters) {
  return [
    col.accessor((r) => `${r.orderNumber} · ${r.lineTitle} · v${r.version}`, { id: 'design', header: 'Design (order · line · sheet version)', meta: { filter: 'text' } }),
    col.accessor('units', { header: 'Units tested', meta: { align: 'right' } }),
    col.accessor('computedResistance20', { header: 'R20 computed', meta: { align: 'right', label: 'R20 computed, Ω' }, cell: (c) => ohms(c.getValue()) }),
    col.accessor('meanMeasuredResistance20', { header: 'R20 measured (mean)', meta: { align: 'right', label: 'R20 measured (mean), Ω' }, cell: (c) => (c.getValue() === null ? '—' : ohms(c.getValue()!)) }),
    col.accessor('meanDeviationPercent', { header: 'Mean deviation, %', meta: { align: 'right' }, cell: (c) => (c.getValue() === null ? '—' : signedPercent(c.getValue()!)) }),
    col.accessor('designTurns', { header: 'Turns designed', meta: { align: 'right' }, cell: (c) => num(c.getValue(), 0) }),
    col.accessor('meanMeasuredTurns', { header: 'Turns measured (mean)', meta: { align: 'right' }, cell: (c) => num(c.getValue(), 1) }),
    col.accessor('heatRuns', { header: 'Heat runs', meta: { align: 'right' } }),
    col.accessor('predictedRise', {
      header: 'Rise predicted',
      meta: { align: 'right', label: 'Rise predicted, K', csv: (r) => r.predictedRise },
      cell: (c) => u.temperatureDifference(c.getValue()),
    }),
    col.accessor('meanMeasuredRise', {
      header: 'Rise measured (mean)',
      meta: { align: 'right', label: 'Rise measured (mean), K', csv: (r) => r.meanMeasuredRise },
      cell: (c) => u.temperatureDifference(c.getValue()),
    }),
    col.accessor('heatTransferUsed', { header: 'h used, W/(m²·K)', meta: { align: 'right' }, cell: (c) => num(c.getValue(), 1) }),
    col.accessor((r) => r.heatTransferEffective?.mean ?? null, { id: 'hEff', header: 'h_eff mean, W/(m²·K)', meta: { align: 'right' }, cell: (c) => num(c.getValue(), 2) }),
    col.accessor((r) => r.heatTransferEffective?.spread ?? null, { id: 'hSpread', header: 'h_eff spread (s), W/(m²·K)', meta: { align: 'right' }, cell: (c) => num(c.getValue(), 2) }),
  ];
}

export function DesignFeedbackPage() {
  const u = useUnits();
  const q = useQuery(designFeedbackQuery());
  if (q.isPending) return <Loading what="Loading the design feedback" />;
  if (q.error) return <Alert title="Cannot load the design feedback">{errorMessage(q.error)}</Alert>;
  const f = q.data;
  return (
    <div className="flex flex-col gap-5" data-testid="design-feedback">
      <PageHeader title="Design feedback" lead="How the built units compare with their designs: measured against computed, per released build sheet (R20: each unit as it stands now, its latest test; units whose resistance failed are left out as defects, not design error)." />
      <ShopHeatTransfer />
      <Panel title={`Designs (${f.designs.length})`}>
        <DataTable data={f.designs} columns={columns(u)} noun="design" csvName="design-feedback" getRowId={(r) => String(r.buildSheetId)} empty="No released design has test records yet." />
      </Panel>
    </div>
  );
}

function ShopHeatTransfer() {
  const user = useCurrentUser();
  const q = useQuery(designFeedbackQuery());
  const adopt = useAdoptHeatTransfer();
  const [done, setDone] = useState(false);
  if (!q.data) return null;
  const { shop, shopDefault, relation } = q.data;
  const h = shop.heatTransferEffective;
  const proposed = h ? Math.round(h.mean * 10) / 10 : null;
  const current = shopDefault.value ?? shopDefault.engineDefault;
  const canAdopt = user.role === 'engineer' || user.role === 'admin';
  const same = proposed !== null && shopDefault.value !== null && Math.abs(proposed - shopDefault.value) < 0.05;
  const fieldError = isApiError(adopt.error) ? adopt.error.fields.value : undefined;
  return (
    <Panel title="The shop's heat-transfer coefficient">
      <div className="flex flex-col gap-4" data-testid="shop-heat-transfer">
        <dl className="grid gap-3 sm:grid-cols-3">
          <div>
            <dt className="text-sm font-semibold text-graphite-600">Measured, shop-wide (h_eff)</dt>
            <dd className="text-2xl font-bold tabular-nums" data-testid="shop-h-eff">
              {h ? heatTransfer(h.mean) : '—'}
            </dd>
            <dd className="text-sm text-graphite-600">
              {h ? `spread (sample standard deviation) ${h.spread === null ? '— (one run)' : heatTransfer(h.spread)}, from ${shop.heatRuns} heat runs` : 'No heat run recorded yet'}
            </dd>
          </div>
          <div>
            <dt className="text-sm font-semibold text-graphite-600">Default for new build sheets now</dt>
            <dd className="text-2xl font-bold tabular-nums" data-testid="shop-h-default">
              {heatTransfer(current)}
            </dd>
            <dd className="text-sm text-graphite-600">
              {shopDefault.value === null
                ? 'the engine’s default (still air, common practice)'
                : `adopted${shopDefault.adoptedBy ? ` by ${shopDefault.adoptedBy.name}` : ''}${shopDefault.adoptedAt ? `, ${formatDateTime(shopDefault.adoptedAt)}` : ''}`}
            </dd>
          </div>
          <div className="flex flex-col justify-center gap-2">
            {canAdopt ? (
              <>
                <Button
                  variant="primary"
                  size="lg"
                  disabled={proposed === null || same}
                  busy={adopt.isPending}
                  onClick={() => {
                    setDone(false);
                    if (proposed !== null) adopt.mutate({ value: proposed }, { onSuccess: () => setDone(true) });
                  }}
                >
                  {proposed === null ? 'Nothing to adopt yet' : same ? 'Adopted' : `Adopt ${formatNumber(proposed, 1)} W/(m²·K)`}
                </Button>
                <p className="text-sm text-graphite-600">New build sheets (and the engineer's desk) then use it wherever a design names no coefficient. Sheets already drafted keep theirs.</p>
              </>
            ) : (
              <p className="text-sm text-graphite-600">An engineer adopts the measured value as the shop default.</p>
            )}
          </div>
        </dl>
        {done && <Alert kind="good">Adopted: new build sheets use {heatTransfer(current)}.</Alert>}
        {adopt.error && (
          <Alert title="Not adopted">
            {errorMessage(adopt.error)}
            {fieldError && fieldError !== errorMessage(adopt.error) ? ` (${fieldError})` : ''}
          </Alert>
        )}
        <p className="text-sm text-graphite-600">
          {relation} The value adopted must lie within {ADOPT_TOLERANCE_PERCENT} % of the measured mean. A coefficient fitted to still-air bench runs fits coils mounted the same way; an
          enclosure, a fan or a heat-sinking mount changes it.
        </p>
      </div>
    </Panel>
  );
}
