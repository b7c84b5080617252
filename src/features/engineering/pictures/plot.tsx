/**
 * A small line chart drawn as SVG: axes with tick labels and units, one or more series, and
 * marked positions (vertical lines for places such as the winding's ends or the design gap,
 * horizontal lines for limits such as the insulation class). No chart package: the engine's
 * numbers come in already converted to the user's units.
 */
import { useId, type ReactNode } from 'react';
import { formatNumber } from '../../../lib/units';

export type Point = { x: number; y: number };
export type Series = { id: string; points: Point[]; label: string; dashed?: boolean; colour?: string };
export type Mark = { at: number; label: string; tone?: 'limit' | 'note' };

/** Round tick values covering [lo, hi]: steps of 1, 2 or 5 × 10ⁿ, about `count` of them. */
export function niceTicks(lo: number, hi: number, count = 5): { ticks: number[]; step: number; lo: number; hi: number } {
  if (!Number.isFinite(lo) || !Number.isFinite(hi)) return { ticks: [0, 1], step: 1, lo: 0, hi: 1 };
  if (hi === lo) {
    const pad = Math.abs(hi) > 0 ? Math.abs(hi) * 0.1 : 1;
    lo -= pad;
    hi += pad;
  }
  const raw = (hi - lo) / Math.max(1, count);
  const mag = 10 ** Math.floor(Math.log10(raw));
  const norm = raw / mag;
  const step = (norm <= 1 ? 1 : norm <= 2 ? 2 : norm <= 5 ? 5 : 10) * mag;
  const start = Math.floor(lo / step + 1e-9) * step;
  const end = Math.ceil(hi / step - 1e-9) * step;
  const ticks: number[] = [];
  for (let v = start; v <= end + step * 1e-6; v += step) ticks.push(Math.abs(v) < step * 1e-9 ? 0 : v);
  return { ticks, step, lo: start, hi: end };
}

/** Decimals a tick step needs (0.05 → 2, 20 → 0). */
export const stepDigits = (step: number) => Math.max(0, Math.min(6, -Math.floor(Math.log10(step) + 1e-9)));

type PlotProps = {
  title: string;
  /** Axis names with their units, e.g. "Position along the axis, mm". */
  xLabel: string;
  yLabel: string;
  series: Series[];
  xMarks?: Mark[];
  yMarks?: Mark[];
  /** Force the axis to include these values (0, a limit …). */
  xInclude?: number[];
  yInclude?: number[];
  /** Points drawn as dots (e.g. saturated points), with their legend text. */
  dots?: { points: Point[]; label: string };
  /** Named points (e.g. operating points), drawn as rings with their names. */
  markers?: (Point & { label: string })[];
  footer?: ReactNode;
  /** For tests and screen readers: a sentence saying what the picture shows. */
  summary: string;
  testId?: string;
};

const W = 560;
const H = 300;
const M = { left: 64, right: 18, top: 26, bottom: 50 };

export function Plot({ title, xLabel, yLabel, series, xMarks = [], yMarks = [], xInclude = [], yInclude = [], dots, markers = [], footer, summary, testId }: PlotProps) {
  const clip = useId();
  const all = series.flatMap((s) => s.points).concat(dots?.points ?? [], markers);
  const xs = all.map((p) => p.x).concat(xInclude, xMarks.map((m) => m.at));
  const ys = all.map((p) => p.y).concat(yInclude, yMarks.map((m) => m.at));
  const xt = niceTicks(Math.min(...xs), Math.max(...xs), 6);
  const yt = niceTicks(Math.min(...ys), Math.max(...ys), 5);
  const pw = W - M.left - M.right;
  const ph = H - M.top - M.bottom;
  const sx = (x: number) => M.left + ((x - xt.lo) / (xt.hi - xt.lo)) * pw;
  const sy = (y: number) => M.top + ph - ((y - yt.lo) / (yt.hi - yt.lo)) * ph;
  const xd = stepDigits(xt.step);
  const yd = stepDigits(yt.step);
  const path = (pts: Point[]) => pts.map((p, i) => `${i ? 'L' : 'M'}${sx(p.x).toFixed(1)},${sy(p.y).toFixed(1)}`).join('');

  return (
    <figure className="flex flex-col gap-1" data-testid={testId}>
      <figcaption className="text-sm font-semibold text-graphite-800">{title}</figcaption>
      <svg viewBox={`0 0 ${W} ${H}`} className="h-auto w-full max-w-[640px] select-none" role="img" aria-label={summary}>
        <defs>
          <clipPath id={clip}>
            <rect x={M.left} y={M.top} width={pw} height={ph} />
          </clipPath>
        </defs>
        <rect x={M.left} y={M.top} width={pw} height={ph} fill="#fbfbfc" stroke="#d3d7db" />
        {/* grid and ticks */}
        {yt.ticks.map((t) => (
          <g key={`y${t}`}>
            <line x1={M.left} x2={M.left + pw} y1={sy(t)} y2={sy(t)} stroke="#e9ebed" />
            <text x={M.left - 6} y={sy(t)} dy="0.32em" textAnchor="end" fontSize="12" fill="#42474d">
              {formatNumber(t, yd)}
            </text>
          </g>
        ))}
        {xt.ticks.map((t) => (
          <g key={`x${t}`}>
            <line x1={sx(t)} x2={sx(t)} y1={M.top} y2={M.top + ph} stroke="#e9ebed" />
            <line x1={sx(t)} x2={sx(t)} y1={M.top + ph} y2={M.top + ph + 4} stroke="#6b737b" />
            <text x={sx(t)} y={M.top + ph + 17} textAnchor="middle" fontSize="12" fill="#42474d">
              {formatNumber(t, xd)}
            </text>
          </g>
        ))}
        <line x1={M.left} x2={M.left + pw} y1={M.top + ph} y2={M.top + ph} stroke="#6b737b" />
        <line x1={M.left} x2={M.left} y1={M.top} y2={M.top + ph} stroke="#6b737b" />
        <text x={M.left + pw / 2} y={H - 8} textAnchor="middle" fontSize="13" fontWeight="600" fill="#2e3236">
          {xLabel}
        </text>
        <text transform={`translate(15 ${M.top + ph / 2}) rotate(-90)`} textAnchor="middle" fontSize="13" fontWeight="600" fill="#2e3236">
          {yLabel}
        </text>

        <g clipPath={`url(#${clip})`}>
          {yMarks.map((m) => (
            <line key={`ym${m.label}`} x1={M.left} x2={M.left + pw} y1={sy(m.at)} y2={sy(m.at)} stroke={m.tone === 'limit' ? '#a8261f' : '#545b62'} strokeWidth="1.5" strokeDasharray="6 4" />
          ))}
          {xMarks.map((m) => (
            <line key={`xm${m.label}${m.at}`} x1={sx(m.at)} x2={sx(m.at)} y1={M.top} y2={M.top + ph} stroke={m.tone === 'limit' ? '#a8261f' : '#545b62'} strokeWidth="1.25" strokeDasharray="4 3" />
          ))}
          {series.map((s) => (
            <path key={s.id} d={path(s.points)} fill="none" stroke={s.colour ?? '#b8632e'} strokeWidth="2.5" strokeDasharray={s.dashed ? '5 4' : undefined} strokeLinejoin="round" />
          ))}
          {dots?.points.map((p, i) => (
            <rect key={i} x={sx(p.x) - 3.5} y={sy(p.y) - 3.5} width="7" height="7" fill="#a8261f" transform={`rotate(45 ${sx(p.x)} ${sy(p.y)})`} />
          ))}
        </g>
        {markers.map((m, i) => (
          <g key={`mk${i}`} data-marker={m.label}>
            <circle cx={sx(m.x)} cy={sy(m.y)} r="5.5" fill="#fbfbfc" stroke="#1f2326" strokeWidth="2" />
            <circle cx={sx(m.x)} cy={sy(m.y)} r="2" fill="#1f2326" />
            {/* Names fan out (below-right, right, above-left …) so close points stay readable. */}
            <text
              x={sx(m.x) + [10, 12, -10][i % 3]}
              y={sy(m.y) + [16, 4, -9][i % 3]}
              textAnchor={i % 3 === 2 ? 'end' : 'start'}
              fontSize="12"
              fontWeight="600"
              fill="#1f2326"
              paintOrder="stroke"
              stroke="#fbfbfc"
              strokeWidth="3"
            >
              {m.label}
            </text>
          </g>
        ))}
        {/* mark labels outside the clip, kept inside the frame */}
        {yMarks.map((m, i) => {
          const y = sy(m.at);
          // Above its line, unless the frame's top is too close or another mark's label sits just above.
          const crowded = yMarks.some((o, j) => j !== i && sy(o.at) < y && y - sy(o.at) < 18);
          const above = y - M.top > 16 && !crowded;
          return (
            <text key={`yl${m.label}`} x={M.left + pw - 4} y={above ? y - 5 : y + 14} textAnchor="end" fontSize="12" fontWeight="600" fill={m.tone === 'limit' ? '#a8261f' : '#2e3236'} paintOrder="stroke" stroke="#fbfbfc" strokeWidth="3">
              {m.label}
            </text>
          );
        })}
        {xMarks.map((m, i) => {
          const x = sx(m.at);
          const anchor = x > M.left + pw * 0.75 ? 'end' : x < M.left + pw * 0.25 ? 'start' : 'middle';
          return (
            <text key={`xl${m.label}${i}`} x={x + (anchor === 'start' ? 3 : anchor === 'end' ? -3 : 0)} y={M.top - 8 + (i % 2) * 0} textAnchor={anchor} fontSize="12" fontWeight="600" fill={m.tone === 'limit' ? '#a8261f' : '#2e3236'}>
              {m.label}
            </text>
          );
        })}
      </svg>
      {(series.length > 1 || dots) && (
        <ul className="flex flex-wrap gap-x-4 gap-y-1 text-sm text-graphite-700">
          {series.map((s) => (
            <li key={s.id} className="flex items-center gap-1.5">
              <svg viewBox="0 0 24 8" className="h-2 w-6" aria-hidden>
                <line x1="0" x2="24" y1="4" y2="4" stroke={s.colour ?? '#b8632e'} strokeWidth="3" strokeDasharray={s.dashed ? '5 4' : undefined} />
              </svg>
              {s.label}
            </li>
          ))}
          {dots && dots.points.length > 0 && (
            <li className="flex items-center gap-1.5">
              <svg viewBox="0 0 10 10" className="size-2.5" aria-hidden>
                <rect x="1.5" y="1.5" width="7" height="7" fill="#a8261f" transform="rotate(45 5 5)" />
              </svg>
              {dots.label}
            </li>
          )}
        </ul>
      )}
      {footer}
    </figure>
  );
}
