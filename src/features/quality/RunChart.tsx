/**
 * The run chart of a batch: each unit's resistance deviation from the design's R20, in %, in
 * serial order, against the line's ± tolerance band. A first test is a filled mark; a retest a
 * hollow one at the same unit. Passing marks are circles, failing marks are crossed squares in
 * the fault colour — shape and colour, so it reads in black and white too.
 */
import { useId } from 'react';
import type { TestRecord } from '../../contracts/test-records';
import { formatNumber } from '../../lib/units';
import { signedPercent } from './format';

const W = 760;
const H = 300;
const PAD = { left: 64, right: 20, top: 20, bottom: 62 };

/** Round steps of 1, 2 or 5 × 10ⁿ covering ±range. */
function ticks(range: number): number[] {
  const raw = range / 3;
  const mag = 10 ** Math.floor(Math.log10(raw));
  const n = raw / mag;
  const step = (n <= 1 ? 1 : n <= 2 ? 2 : n <= 5 ? 5 : 10) * mag;
  const out: number[] = [];
  for (let v = -Math.floor(range / step) * step; v <= range + 1e-9; v += step) out.push(Math.abs(v) < step / 1e6 ? 0 : v);
  return out;
}

export function RunChart({ records, tolerancePercent }: { records: TestRecord[]; tolerancePercent: number }) {
  const titleId = useId();
  // Units in serial order (natural: "-2" before "-10"); each unit's records oldest first.
  const serials = [...new Set(records.map((r) => r.serial))].sort((a, b) => a.localeCompare(b, 'en', { numeric: true }));
  const maxDev = Math.max(0, ...records.map((r) => Math.abs(r.deviationPercent)));
  const range = Math.max(tolerancePercent * 2, maxDev * 1.12, 1);
  const x0 = PAD.left;
  const x1 = W - PAD.right;
  const y0 = PAD.top;
  const y1 = H - PAD.bottom;
  const step = serials.length > 1 ? (x1 - x0 - 30) / (serials.length - 1) : 0;
  const xOf = (i: number) => (serials.length > 1 ? x0 + 15 + i * step : (x0 + x1) / 2);
  const yOf = (p: number) => y0 + ((range - p) / (2 * range)) * (y1 - y0);
  const labelEvery = Math.max(1, Math.ceil(serials.length / 16));
  const outside = records.filter((r) => Math.abs(r.deviationPercent) > r.tolerancePercent + 1e-9).length;
  const summary =
    records.length === 0
      ? 'No units tested yet.'
      : `${serials.length} units; ${outside} of ${records.length} readings outside ±${formatNumber(tolerancePercent, 1)} %. Deviations from ${signedPercent(Math.min(...records.map((r) => r.deviationPercent)))} to ${signedPercent(Math.max(...records.map((r) => r.deviationPercent)))}.`;

  return (
    <figure className="flex flex-col gap-1" data-testid="run-chart" data-points={records.length} data-outside={outside}>
      <svg viewBox={`0 0 ${W} ${H}`} className="w-full max-w-4xl" role="img" aria-labelledby={titleId}>
        <title id={titleId}>Run chart of resistance deviation. {summary}</title>
        {/* the tolerance band */}
        <rect x={x0} y={yOf(tolerancePercent)} width={x1 - x0} height={yOf(-tolerancePercent) - yOf(tolerancePercent)} className="fill-ok-soft" data-testid="tolerance-band" />
        {[tolerancePercent, -tolerancePercent].map((t) => (
          <g key={t}>
            <line x1={x0} x2={x1} y1={yOf(t)} y2={yOf(t)} className="stroke-ok" strokeDasharray="6 4" strokeWidth={1.5} />
            <text x={x1 - 4} y={yOf(t) + (t > 0 ? -5 : 14)} textAnchor="end" className="fill-ok text-[12px] font-semibold">
              {t > 0 ? '+' : '−'}
              {formatNumber(Math.abs(t), 1)} % tolerance
            </text>
          </g>
        ))}
        {/* axes, ticks, labels */}
        {ticks(range).map((v) => (
          <g key={v}>
            <line x1={x0 - 5} x2={x1} y1={yOf(v)} y2={yOf(v)} className={v === 0 ? 'stroke-graphite-500' : 'stroke-graphite-200'} strokeWidth={v === 0 ? 1.2 : 1} />
            <text x={x0 - 8} y={yOf(v) + 4} textAnchor="end" className="fill-graphite-700 text-[12px] tabular-nums">
              {v > 0 ? '+' : v < 0 ? '−' : ''}
              {formatNumber(Math.abs(v), Math.abs(v) < 1 && v !== 0 ? 1 : 0)}
            </text>
          </g>
        ))}
        <line x1={x0} x2={x0} y1={y0} y2={y1} className="stroke-graphite-500" />
        <line x1={x0} x2={x1} y1={y1} y2={y1} className="stroke-graphite-500" />
        <text transform={`translate(16 ${(y0 + y1) / 2}) rotate(-90)`} textAnchor="middle" className="fill-graphite-800 text-[13px] font-semibold">
          R20 deviation from nominal, %
        </text>
        <text x={(x0 + x1) / 2} y={H - 8} textAnchor="middle" className="fill-graphite-800 text-[13px] font-semibold">
          Unit, in serial order
        </text>
        {serials.map((s, i) =>
          i % labelEvery === 0 ? (
            <text key={s} x={xOf(i)} y={y1 + 16} textAnchor="middle" className="fill-graphite-700 text-[11px] tabular-nums">
              {s.split('-').pop()}
            </text>
          ) : null,
        )}
        {/* one line through the first tests, so drift shows */}
        <polyline
          fill="none"
          className="stroke-graphite-400"
          strokeWidth={1}
          points={serials
            .map((s, i) => {
              const first = records.find((r) => r.serial === s && r.firstTest) ?? records.find((r) => r.serial === s);
              return first ? `${xOf(i)},${yOf(first.deviationPercent)}` : '';
            })
            .join(' ')}
        />
        {records.map((r) => {
          const i = serials.indexOf(r.serial);
          const x = xOf(i);
          const y = yOf(r.deviationPercent);
          const out = Math.abs(r.deviationPercent) > r.tolerancePercent + 1e-9;
          const tone = out ? 'text-fault' : 'text-ok';
          const label = `${r.serial}${r.firstTest ? '' : ' (retest)'}: ${signedPercent(r.deviationPercent)}, ${out ? 'outside' : 'inside'} the band`;
          return (
            <g key={r.id} className={tone} data-point={r.serial} data-outside={out} data-retest={!r.firstTest}>
              <title>{label}</title>
              {out ? (
                <g>
                  <rect x={x - 6} y={y - 6} width={12} height={12} fill={r.firstTest ? 'currentColor' : 'white'} stroke="currentColor" strokeWidth={2} />
                  <path d={`M${x - 3.5} ${y - 3.5}l7 7M${x + 3.5} ${y - 3.5}l-7 7`} stroke={r.firstTest ? 'white' : 'currentColor'} strokeWidth={2} strokeLinecap="round" />
                </g>
              ) : (
                <circle cx={x} cy={y} r={5.5} fill={r.firstTest ? 'currentColor' : 'white'} stroke="currentColor" strokeWidth={2} />
              )}
            </g>
          );
        })}
      </svg>
      <figcaption className="flex flex-wrap items-center gap-x-4 gap-y-1 text-sm text-graphite-700">
        <span className="inline-flex items-center gap-1.5">
          <svg viewBox="0 0 14 14" className="size-3.5 text-ok" aria-hidden>
            <circle cx="7" cy="7" r="5" fill="currentColor" />
          </svg>
          inside the band
        </span>
        <span className="inline-flex items-center gap-1.5">
          <svg viewBox="0 0 14 14" className="size-3.5 text-fault" aria-hidden>
            <rect x="1.5" y="1.5" width="11" height="11" fill="currentColor" />
            <path d="M4.5 4.5l5 5M9.5 4.5l-5 5" stroke="white" strokeWidth="1.8" />
          </svg>
          outside the band
        </span>
        <span className="inline-flex items-center gap-1.5">
          <svg viewBox="0 0 14 14" className="size-3.5 text-graphite-600" aria-hidden>
            <circle cx="7" cy="7" r="5" fill="white" stroke="currentColor" strokeWidth="1.8" />
          </svg>
          hollow: a retest
        </span>
        <span>{summary}</span>
      </figcaption>
    </figure>
  );
}
