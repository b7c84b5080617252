/**
 * The load view: estimated hours per person and per station for the coming days (by due date),
 * drawn as bars against one shift, and the same numbers as a table. The foreman balances the
 * floor from it. The estimate rule is the server's (src/contracts/floor.ts, FloorLoad).
 */
import { useQuery } from '@tanstack/react-query';
import { useState } from 'react';
import type { FloorLoad, FloorLoadRow } from '../../contracts/floor';
import { Alert } from '../../components/Alert';
import { SelectField } from '../../components/Field';
import { Loading, PageHeader, Panel } from '../../components/Panel';
import { errorMessage } from '../../lib/api';
import { formatDay } from '../../lib/format';
import { formatNumber } from '../../lib/units';
import { loadQuery, useFloorLive } from './api';
import { LiveBadge } from './BoardPage';
import { hours } from './parts';

type Row = FloorLoadRow & { id: number | null; name: string };

const weekday = new Intl.DateTimeFormat('en-GB', { weekday: 'short', day: '2-digit', timeZone: 'UTC' });
const dayHead = (d: string) => weekday.format(new Date(`${d}T00:00:00Z`));

function LoadChart({ rows, shift, caption }: { rows: Row[]; shift: number; caption: string }) {
  // The scale follows the named people / stations; the "nobody" row can dwarf them, so its bars
  // stop at the top with a break mark and the hours written above.
  const named = rows.filter((r) => r.id !== null);
  const max = Math.max(shift * 1.25, ...named.flatMap((r) => r.byDay.map((d) => d.hours)));
  const days = rows[0]?.byDay.map((d) => d.date) ?? [];
  const barMax = 96; // px for the tallest bar
  return (
    <figure className="overflow-x-auto" aria-label={caption}>
      <div className="grid min-w-max gap-x-1 gap-y-3" style={{ gridTemplateColumns: `11rem repeat(${days.length}, minmax(3.5rem, 1fr))` }}>
        <div />
        {days.map((d) => (
          <div key={d} className="text-center text-sm font-semibold text-graphite-600">
            {dayHead(d)}
          </div>
        ))}
        {rows.map((r) => (
          <div key={r.id ?? 'none'} className="contents" data-load-row={r.name}>
            <div className="self-end pb-1 text-sm font-semibold text-graphite-900">
              {r.name}
              <span className="block font-normal text-graphite-600">{hours(r.hours)} in all</span>
            </div>
            {r.byDay.map((d) => {
              const over = d.hours > shift;
              const offScale = d.hours > max;
              const h = Math.round((Math.min(d.hours, max) / max) * barMax);
              const shiftLine = Math.round((shift / max) * barMax);
              return (
                <div key={d.date} className="relative flex flex-col items-center justify-end border-b border-graphite-300" style={{ height: barMax + 22 }} title={`${r.name}, ${formatDay(d.date)}: ${hours(d.hours)}`}>
                  <span className={`text-xs font-semibold tabular-nums ${over ? 'text-fault' : 'text-graphite-700'}`}>
                    {d.hours > 0 ? formatNumber(d.hours, 1) : ''}
                    {over && ' !'}
                  </span>
                  <div
                    className={`w-8 rounded-t-sm ${over ? 'bg-fault' : 'bg-copper-500'}`}
                    style={{
                      height: Math.max(d.hours > 0 ? 2 : 0, h),
                      backgroundImage: over ? 'repeating-linear-gradient(45deg, transparent 0 4px, rgb(255 255 255 / 0.45) 4px 7px)' : undefined,
                      clipPath: offScale ? 'polygon(0 6px, 50% 0, 100% 6px, 100% 100%, 0 100%)' : undefined,
                    }}
                    data-off-scale={offScale || undefined}
                  />
                  <span aria-hidden className="pointer-events-none absolute right-0 left-0 border-t border-dashed border-graphite-500" style={{ bottom: shiftLine }} />
                </div>
              );
            })}
          </div>
        ))}
      </div>
      <figcaption className="mt-2 flex flex-wrap gap-4 text-sm text-graphite-600">
        <span className="flex items-center gap-1.5">
          <span aria-hidden className="inline-block h-3 w-5 bg-copper-500" /> hours due that day (overdue work counts on the first day)
        </span>
        <span className="flex items-center gap-1.5">
          <span aria-hidden className="inline-block w-5 border-t border-dashed border-graphite-500" /> one shift ({hours(shift)})
        </span>
        <span className="flex items-center gap-1.5">
          <span aria-hidden className="inline-block h-3 w-5 bg-fault" style={{ backgroundImage: 'repeating-linear-gradient(45deg, transparent 0 4px, rgb(255 255 255 / 0.45) 4px 7px)' }} /> ! more than
          one shift
        </span>
      </figcaption>
    </figure>
  );
}

function LoadTable({ rows, capacity, what }: { rows: Row[]; capacity: number; what: string }) {
  return (
    <div className="overflow-x-auto">
      <table className="w-full text-left text-[0.95rem]">
        <thead className="border-b border-graphite-300 text-sm text-graphite-600">
          <tr>
            <th className="py-2 pr-3">{what}</th>
            <th className="py-2 pr-3 text-right">Work orders</th>
            <th className="py-2 pr-3 text-right">Winding</th>
            <th className="py-2 pr-3 text-right">Other stages</th>
            <th className="py-2 pr-3 text-right">Total</th>
            <th className="py-2 text-right">Of capacity ({hours(capacity)})</th>
          </tr>
        </thead>
        <tbody>
          {rows.map((r) => {
            const pct = capacity > 0 ? (r.hours / capacity) * 100 : 0;
            return (
              <tr key={r.id ?? 'none'} className="border-b border-graphite-100">
                <td className="py-2 pr-3 font-semibold">{r.name}</td>
                <td className="py-2 pr-3 text-right tabular-nums">{r.workOrders}</td>
                <td className="py-2 pr-3 text-right tabular-nums">{hours(r.windingHours)}</td>
                <td className="py-2 pr-3 text-right tabular-nums">{hours(r.otherHours)}</td>
                <td className="py-2 pr-3 text-right font-semibold tabular-nums">{hours(r.hours)}</td>
                <td className={`py-2 text-right tabular-nums ${pct > 100 ? 'font-bold text-fault' : ''}`}>
                  {r.id === null ? '—' : `${formatNumber(pct, 0)} %${pct > 100 ? ' over' : ''}`}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}

function rowsOf(list: FloorLoad['people'], unassigned: FloorLoadRow, noneName: string): Row[] {
  const rows: Row[] = list.map((r) => ({ ...r }));
  if (unassigned.hours > 0 || unassigned.workOrders > 0) rows.push({ ...unassigned, id: null, name: noneName });
  return rows;
}

export function LoadPage() {
  const [days, setDays] = useState(7);
  const live = useFloorLive();
  const load = useQuery(loadQuery(days, live.pollMs));
  const d = load.data;
  return (
    <div className="flex flex-col gap-5" data-testid="load-view">
      <PageHeader
        title="Load"
        lead={d ? `Estimated hours of open work due ${formatDay(d.from)} – ${formatDay(d.to)}, per person and per station.` : 'Estimated hours per person and per station.'}
        actions={
          <div className="flex items-end gap-3">
            <LiveBadge state={live.state} />
            <SelectField label="Days ahead" value={String(days)} onChange={(e) => setDays(Number(e.target.value))} className="h-12" wrapperClassName="w-36">
              {[5, 7, 10, 14, 21, 28].map((n) => (
                <option key={n} value={n}>
                  {n} days
                </option>
              ))}
            </SelectField>
          </div>
        }
      />
      {load.isPending && <Loading what="Working out the load" />}
      {load.error && <Alert title="Cannot load the estimate">{errorMessage(load.error)}</Alert>}
      {d && (
        <>
          <Panel title="People">
            <div className="flex flex-col gap-4">
              <LoadChart rows={rowsOf(d.people, d.unassignedPeople, 'Nobody assigned')} shift={d.settings.shiftHoursPerDay} caption="Hours per person per day" />
              <LoadTable rows={rowsOf(d.people, d.unassignedPeople, 'Nobody assigned')} capacity={d.capacityHours} what="Person" />
            </div>
          </Panel>
          <Panel title="Stations">
            <div className="flex flex-col gap-4">
              <LoadChart rows={rowsOf(d.stations, d.unassignedStations, 'No station')} shift={d.settings.shiftHoursPerDay} caption="Hours per station per day" />
              <LoadTable rows={rowsOf(d.stations, d.unassignedStations, 'No station')} capacity={d.capacityHours} what="Station" />
            </div>
          </Panel>
          <p className="text-sm text-graphite-600">
            How it is estimated: winding = quantity × turns ÷ spindle speed + the station's set-up time (default winder {formatNumber(d.settings.defaultSpindleRpm, 0)} rev/min,{' '}
            {formatNumber(d.settings.defaultSetupSeconds / 60, 0)} min set-up); other stages use the shop's standard minutes per unit and per batch. A shift is {hours(d.settings.shiftHoursPerDay)}.
          </p>
        </>
      )}
    </div>
  );
}
