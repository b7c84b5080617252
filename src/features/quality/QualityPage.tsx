/**
 * The shop's quality (/quality): first-pass yield (first tests passed ÷ first tests) by week, by
 * coil kind and by winding station, with a chart of the weekly yield, and the readings that fail
 * most often. Each table sorts, filters and exports CSV. The server computes every figure.
 */
import { useQuery } from '@tanstack/react-query';
import { createColumnHelper } from '@tanstack/react-table';
import { useId } from 'react';
import type { QualitySummary, ReadingName, YieldRow } from '../../contracts/test-records';
import { Link } from 'react-router';
import { Alert } from '../../components/Alert';
import { buttonClass } from '../../components/Button';
import { DataTable } from '../../components/DataTable';
import { Loading, PageHeader, Panel } from '../../components/Panel';
import { errorMessage } from '../../lib/api';
import { useCurrentUser } from '../../lib/session';
import { formatNumber } from '../../lib/units';
import { qualitySummaryQuery } from './api';
import { READING_LABELS, yieldPercent } from './format';

const ycol = createColumnHelper<YieldRow>();
const yieldColumns = (keyHeader: string) => [
  ycol.accessor('key', { header: keyHeader, meta: { filter: 'text' }, cell: (c) => <span className="font-semibold">{c.getValue()}</span> }),
  ycol.accessor('firstTests', { header: 'First tests', meta: { align: 'right' } }),
  ycol.accessor('firstPassed', { header: 'Passed first time', meta: { align: 'right' } }),
  ycol.accessor('firstPassYield', { header: 'First-pass yield', meta: { align: 'right', csv: (r) => r.firstPassYield }, cell: (c) => yieldPercent(c.getValue()) }),
];
const WEEK_COLUMNS = yieldColumns('Week (ISO)');
const KIND_COLUMNS = yieldColumns('Coil kind');
const STATION_COLUMNS = yieldColumns('Station');

type ReasonRow = QualitySummary['failureReasons'][number] & { label: string; share: number };
const rcol = createColumnHelper<ReasonRow>();
const REASON_COLUMNS = [
  rcol.accessor('label', { header: 'Failing reading' }),
  rcol.accessor('count', { header: 'Failed readings', meta: { align: 'right' } }),
  rcol.accessor('share', { header: 'Share of failed readings', meta: { align: 'right', csv: (r) => r.share }, cell: (c) => `${formatNumber(c.getValue() * 100, 1)} %` }),
];

export function QualityPage() {
  const q = useQuery(qualitySummaryQuery());
  const user = useCurrentUser();
  if (q.isPending) return <Loading what="Loading the quality summary" />;
  if (q.error) return <Alert title="Cannot load the quality summary">{errorMessage(q.error)}</Alert>;
  const s = q.data;
  const totalFailed = s.failureReasons.reduce((a, r) => a + r.count, 0);
  const reasons: ReasonRow[] = s.failureReasons.map((r) => ({ ...r, label: READING_LABELS[r.name as ReadingName] ?? r.name, share: totalFailed ? r.count / totalFailed : 0 }));
  const all = s.byWeek.reduce((a, r) => ({ n: a.n + r.firstTests, p: a.p + r.firstPassed }), { n: 0, p: 0 });
  return (
    <div className="flex flex-col gap-5" data-testid="quality">
      <PageHeader
        title="Quality"
        lead={`First-pass yield: the share of units that passed their first test (retests do not count). Over every test recorded: ${yieldPercent(all.n ? all.p / all.n : null)} of ${all.n} units.`}
        actions={
          user.role === 'engineer' || user.role === 'admin' ? (
            <Link className={buttonClass('secondary', 'md')} to="/quality/design">
              Design feedback
            </Link>
          ) : undefined
        }
      />
      <Panel title="First-pass yield by week">
        <div className="flex flex-col gap-4">
          <WeeklyChart rows={s.byWeek} />
          <DataTable data={s.byWeek} columns={WEEK_COLUMNS} noun="week" csvName="first-pass-yield-by-week" initialSorting={[{ id: 'key', desc: true }]} getRowId={(r) => r.key} />
        </div>
      </Panel>
      <div className="grid gap-5 xl:grid-cols-2">
        <Panel title="By coil kind">
          <DataTable data={s.byCoilKind} columns={KIND_COLUMNS} noun="coil kind" csvName="first-pass-yield-by-coil-kind" getRowId={(r) => r.key} />
        </Panel>
        <Panel title="By winding station">
          <DataTable data={s.byStation} columns={STATION_COLUMNS} noun="station" csvName="first-pass-yield-by-station" getRowId={(r) => r.key} />
        </Panel>
      </div>
      <Panel title="Most common failure reasons">
        <DataTable data={reasons} columns={REASON_COLUMNS} noun="reason" csvName="failure-reasons" initialSorting={[{ id: 'count', desc: true }]} getRowId={(r) => r.name} empty="No reading has failed." />
      </Panel>
    </div>
  );
}

const W = 760;
const H = 260;
const PAD = { left: 56, right: 16, top: 16, bottom: 56 };

/** Bars of each week's first-pass yield (0–100 %), with the count of first tests under each bar. */
function WeeklyChart({ rows }: { rows: YieldRow[] }) {
  const titleId = useId();
  const weeks = rows.slice(-16);
  if (weeks.length === 0) return <p className="text-graphite-600">No tests recorded yet.</p>;
  const x0 = PAD.left;
  const x1 = W - PAD.right;
  const y0 = PAD.top;
  const y1 = H - PAD.bottom;
  const slot = (x1 - x0) / weeks.length;
  const bar = Math.min(48, slot * 0.6);
  const yOf = (f: number) => y1 - f * (y1 - y0);
  const summary = weeks.map((w) => `${w.key}: ${yieldPercent(w.firstPassYield)} of ${w.firstTests}`).join('; ');
  return (
    <figure data-testid="weekly-yield-chart" data-weeks={weeks.length}>
      <svg viewBox={`0 0 ${W} ${H}`} className="w-full max-w-4xl" role="img" aria-labelledby={titleId}>
        <title id={titleId}>First-pass yield by week. {summary}</title>
        {[0, 0.25, 0.5, 0.75, 1].map((f) => (
          <g key={f}>
            <line x1={x0} x2={x1} y1={yOf(f)} y2={yOf(f)} className={f === 0 ? 'stroke-graphite-500' : 'stroke-graphite-200'} />
            <text x={x0 - 8} y={yOf(f) + 4} textAnchor="end" className="fill-graphite-700 text-[12px]">
              {f * 100}
            </text>
          </g>
        ))}
        <line x1={x0} x2={x0} y1={y0} y2={y1} className="stroke-graphite-500" />
        <text transform={`translate(16 ${(y0 + y1) / 2}) rotate(-90)`} textAnchor="middle" className="fill-graphite-800 text-[13px] font-semibold">
          First-pass yield, %
        </text>
        <text x={(x0 + x1) / 2} y={H - 6} textAnchor="middle" className="fill-graphite-800 text-[13px] font-semibold">
          ISO week (first tests in the week)
        </text>
        {weeks.map((w, i) => {
          const cx = x0 + slot * (i + 0.5);
          const f = w.firstPassYield ?? 0;
          return (
            <g key={w.key} data-week={w.key}>
              <rect x={cx - bar / 2} y={yOf(f)} width={bar} height={y1 - yOf(f)} className="fill-copper-500" />
              <text x={cx} y={yOf(f) - 5} textAnchor="middle" className="fill-graphite-900 text-[12px] font-semibold tabular-nums">
                {w.firstPassYield === null ? '—' : formatNumber(f * 100, f === 1 ? 0 : 1)}
              </text>
              <text x={cx} y={y1 + 15} textAnchor="middle" className="fill-graphite-700 text-[11px] tabular-nums">
                {w.key.slice(5)}
              </text>
              <text x={cx} y={y1 + 29} textAnchor="middle" className="fill-graphite-500 text-[11px] tabular-nums">
                n={w.firstTests}
              </text>
            </g>
          );
        })}
      </svg>
    </figure>
  );
}
