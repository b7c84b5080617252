/**
 * One row per standard wire size for the current choices (POST /api/coil/sweep): sortable,
 * filterable, exportable. Clicking a row (or its Adopt button) adopts that size.
 */
import { createColumnHelper } from '@tanstack/react-table';
import { useMemo, type MouseEvent } from 'react';
import { DataTable } from '../../components/DataTable';
import { StatusShape } from '../../components/Status';
import { formatNumber, fromCelsius, fromKelvinDifference, type UnitFormatters } from '../../lib/units';
import type { EngineSheet } from './api';
import * as n from './numbers';
import { sameWire, wireSizeLabel, type WireSizeValue } from './specModel';
import { warningKind } from './warnings';

const col = createColumnHelper<EngineSheet>();

/** Short names for the warning badges (the full message is the badge's title and on the sheet). */
const SHORT: Record<string, string> = {
  'thermal-runaway': 'runaway',
  'over-temperature': 'over class',
  'current-density': 'current density',
  saturation: 'saturated',
  'does-not-fit': 'does not fit',
  'no-suppression': 'no suppression',
};

/** The hottest the winding gets: the high corner, or the duty cycle's peak when hotter (engine 2). */
const hottest = (r: EngineSheet) => Math.max(r.corners?.high.windingTemperature ?? r.windingTemperature, r.duty?.peakTemperature ?? -Infinity);
/** The class less the hot-spot allowance. */
const limitOf = (r: EngineSheet, insulationClass: number) => insulationClass - (r.hotSpotAllowance ?? 0);

/** Sort key of a size: thin to thick by bare diameter. */
const sizeKey = (s: EngineSheet) => s.wire.bareDiameter;

export function SweepTable({
  rows,
  insulationClass,
  current,
  onAdopt,
  u,
  disabled,
}: {
  rows: EngineSheet[];
  insulationClass: number;
  current: WireSizeValue | null;
  onAdopt: (size: WireSizeValue) => void;
  u: UnitFormatters;
  disabled?: boolean;
}) {
  const T = u.prefs.temperatureUnit;
  const withPull = rows.some((r) => r.pullForce !== undefined);
  const columns = useMemo(
    () => [
      col.accessor((r) => sizeKey(r), {
        id: 'size',
        header: 'Wire',
        cell: (c) => (
          <span className="font-semibold whitespace-nowrap" data-size={wireSizeLabel(c.row.original.wire.size)}>
            {wireSizeLabel(c.row.original.wire.size)}
          </span>
        ),
        meta: { label: 'Wire', csv: (r) => wireSizeLabel(r.wire.size) },
      }),
      col.accessor('turns', { header: 'Turns', cell: (c) => formatNumber(c.getValue(), 0), meta: { align: 'right' } }),
      col.accessor('resistance20', {
        header: `R at ${u.temperature(20, 0)}, Ω`,
        cell: (c) => n.sig(c.getValue(), 4),
        meta: { align: 'right', label: 'R20 ohm' },
      }),
      col.accessor('currentHot', { header: 'I hot, A', cell: (c) => n.sig(c.getValue(), 3), meta: { align: 'right' } }),
      col.accessor('powerHot', { header: 'P hot, W', cell: (c) => n.sig(c.getValue(), 3), meta: { align: 'right' } }),
      col.accessor('ampereTurnsHot', { header: 'A·turns hot', cell: (c) => formatNumber(Math.round(c.getValue()), 0), meta: { align: 'right', label: 'A·turns hot (nominal)' } }),
      withPull
        ? col.accessor((r) => r.corners?.low.pullForce ?? r.pullForce ?? 0, { id: 'lowPull', header: 'Pull low, N', cell: (c) => n.sig(c.getValue(), 3), meta: { align: 'right', label: 'Pull at the low corner N' } })
        : col.accessor((r) => r.corners?.low.ampereTurns ?? r.ampereTurnsHot, {
            id: 'lowAT',
            header: 'A·turns low',
            cell: (c) => formatNumber(Math.round(c.getValue()), 0),
            meta: { align: 'right', label: 'A·turns at the low corner' },
          }),
      col.accessor((r) => fromCelsius(r.windingTemperature, T), {
        id: 'temperature',
        header: `Winding, ${u.temperatureSymbol}`,
        // With thermal runaway the engine stops at its limit: that is no working point, so say so.
        cell: (c) => (c.row.original.thermalRunaway ? <span className="font-semibold text-fault">runaway</span> : formatNumber(c.getValue(), 0)),
        meta: { align: 'right', label: `Winding nominal ${u.temperatureSymbol}`, csv: (r) => (r.thermalRunaway ? 'runaway' : Number(fromCelsius(r.windingTemperature, T).toFixed(1))) },
      }),
      col.accessor((r) => fromCelsius(hottest(r), T), {
        id: 'high',
        header: `High, ${u.temperatureSymbol}`,
        cell: (c) => (c.row.original.corners?.high.runaway ? <span className="font-semibold text-fault">runaway</span> : formatNumber(c.getValue(), 0)),
        meta: { align: 'right', label: `Winding high corner or duty peak ${u.temperatureSymbol}`, csv: (r) => Number(fromCelsius(hottest(r), T).toFixed(1)) },
      }),
      col.accessor((r) => fromKelvinDifference(limitOf(r, insulationClass) - hottest(r), T), {
        id: 'margin',
        header: `Margin, ${u.temperatureDifferenceSymbol}`,
        cell: (c) => {
          const v = c.getValue();
          if (c.row.original.thermalRunaway || c.row.original.corners?.high.runaway) return <span className="font-semibold text-fault">none</span>;
          return (
            <span className={`inline-flex items-center gap-1 ${v < 0 ? 'font-semibold text-fault' : ''}`}>
              {v < 0 && <StatusShape kind="fault" className="size-3" />}
              {v < 0 ? `${formatNumber(-v, 0)} over` : formatNumber(v, 0)}
            </span>
          );
        },
        meta: { align: 'right', label: `Margin to class less hot-spot ${u.temperatureDifferenceSymbol}`, csv: (r) => Number(fromKelvinDifference(limitOf(r, insulationClass) - hottest(r), T).toFixed(1)) },
      }),
      withPull
        ? col.accessor((r) => r.pullForce ?? 0, { id: 'pull', header: 'Pull, N', cell: (c) => n.sig(c.getValue(), 3), meta: { align: 'right', label: 'Pull nominal N' } })
        : col.accessor((r) => r.centreField * 1000, { id: 'field', header: 'Centre B, mT', cell: (c) => n.sig(c.getValue(), 3), meta: { align: 'right' } }),
      col.accessor('wireMass', { header: 'Wire, kg', cell: (c) => formatNumber(c.getValue(), 3), meta: { align: 'right', label: 'Insulated wire mass kg' } }),
      col.accessor((r) => r.warnings.map((w) => w.code).join(', '), {
        id: 'warnings',
        header: 'Warnings',
        cell: (c) => (
          <span className="flex min-w-44 flex-wrap gap-1">
            {c.row.original.warnings
              // Runaway says more than over-temperature; one badge for the pair.
              .filter((w, _i, all) => !(w.code === 'over-temperature' && all.some((x) => x.code === 'thermal-runaway')))
              .map((w) => (
                <span key={w.code} title={u.text(w.message)} className={`inline-flex items-center gap-1 rounded border px-1 text-xs font-semibold whitespace-nowrap ${warningKind(w.code) === 'fault' ? 'border-fault/40 bg-fault-soft text-fault' : 'border-caution/40 bg-caution-soft text-caution'}`}>
                  <StatusShape kind={warningKind(w.code)} className="size-2.5" />
                  {SHORT[w.code] ?? w.code}
                </span>
              ))}
          </span>
        ),
        meta: { filter: 'select' },
      }),
      col.display({
        id: 'adopt',
        header: () => <span className="sr-only">Adopt</span>,
        cell: (c) => {
          const size = c.row.original.wire.size;
          const isCurrent = current !== null && sameWire(size, current);
          return isCurrent ? (
            <span className="text-xs font-bold text-copper-700 uppercase">in use</span>
          ) : (
            <button
              type="button"
              data-adopt
              disabled={disabled}
              onClick={() => onAdopt(size)}
              className="rounded border border-graphite-300 px-2 py-0.5 text-xs font-semibold hover:bg-white disabled:text-graphite-400"
              aria-label={`Adopt ${wireSizeLabel(size)}`}
            >
              Adopt
            </button>
          );
        },
      }),
    ],
    [u, T, insulationClass, withPull, current, onAdopt, disabled, rows],
  );

  // A click anywhere on a row adopts its size (the Adopt button is the keyboard way to the same).
  const onRowClick = (ev: MouseEvent<HTMLDivElement>) => {
    const target = ev.target as HTMLElement;
    if (target.closest('button, a, input, select, label, thead')) return;
    target.closest('tbody tr')?.querySelector<HTMLButtonElement>('button[data-adopt]')?.click();
  };
  const adoptable = (r: EngineSheet) => (current !== null && sameWire(r.wire.size, current) ? 'bg-copper-100 font-semibold' : disabled ? '' : 'cursor-pointer');

  return (
    // eslint-disable-next-line jsx-a11y/click-events-have-key-events, jsx-a11y/no-static-element-interactions
    <div onClick={onRowClick} data-testid="sweep">
      <DataTable
        data={rows}
        columns={columns}
        noun="wire size"
        csvName="spoolwright-wire-sweep"
        caption="Designs for each wire size"
        getRowId={(r) => wireSizeLabel(r.wire.size)}
        rowClassName={adoptable}
        empty="No wire size gives a winding on this bobbin."
      />
    </div>
  );
}
