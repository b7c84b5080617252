/**
 * A line's progress as a stacked bar: units shipped, tested, in production and awaiting
 * engineering, left to right, so the bar fills from the left as the line moves on. Each part has
 * its own fill — solid, striped, dotted, hollow — as well as its colour, the legend shows the same
 * fills, and the line's plain-words summary is always written beside the bar.
 */
import { PORTAL_PROGRESS, PORTAL_PROGRESS_LABELS, type PortalLine, type PortalProgress } from '../../contracts/shipments';
import { pieces } from '../../lib/format';

/** Left to right: furthest along first. */
const ORDER: PortalProgress[] = [...PORTAL_PROGRESS].reverse();

const FILL: Record<PortalProgress, { style: React.CSSProperties; text: string }> = {
  shipped: { style: { background: '#2d6e4a' }, text: 'text-white' },
  tested: { style: { background: 'repeating-linear-gradient(135deg, #2d6e4a 0 2.5px, #e3f1e8 2.5px 7px)' }, text: 'text-graphite-950' },
  in_production: { style: { background: 'radial-gradient(#9a4f23 1.2px, #f5e3d3 1.6px) 0 0 / 6px 6px' }, text: 'text-graphite-950' },
  awaiting_engineering: { style: { background: '#fff', boxShadow: 'inset 0 0 0 1.5px #8a929a' }, text: 'text-graphite-800' },
};

export function Swatch({ kind }: { kind: PortalProgress }) {
  return <span aria-hidden className="inline-block h-3.5 w-6 shrink-0 rounded-sm border border-graphite-400" style={FILL[kind].style} />;
}

export function ProgressLegend() {
  return (
    <ul className="flex flex-wrap gap-x-4 gap-y-1 text-sm text-graphite-700" aria-label="How the bars read">
      {ORDER.map((k) => (
        <li key={k} className="flex items-center gap-1.5">
          <Swatch kind={k} />
          {PORTAL_PROGRESS_LABELS[k]}
        </li>
      ))}
    </ul>
  );
}

export function ProgressBar({ line }: { line: PortalLine }) {
  const total = ORDER.reduce((n, k) => n + (line.progress[k] ?? 0), 0);
  return (
    <div
      role="img"
      aria-label={`${line.title}: ${line.summary}`}
      className="flex h-5 w-full overflow-hidden rounded border border-graphite-300 bg-graphite-50"
      data-progress={ORDER.map((k) => `${k}:${line.progress[k] ?? 0}`).join(' ')}
    >
      {total > 0 &&
        ORDER.filter((k) => (line.progress[k] ?? 0) > 0).map((k) => {
          const share = (line.progress[k] / total) * 100;
          return (
            <div
              key={k}
              className={`flex items-center justify-center border-r border-white text-xs font-bold last:border-r-0 ${FILL[k].text}`}
              style={{ ...FILL[k].style, width: `${share}%` }}
              title={`${PORTAL_PROGRESS_LABELS[k]}: ${line.progress[k]}`}
            >
              {share >= 12 && <span className="rounded bg-white/85 px-1 leading-tight text-graphite-950">{line.progress[k]}</span>}
            </div>
          );
        })}
    </div>
  );
}

/** One order line: its title, quantity, bar and the plain-words summary. */
export function LineProgress({ line }: { line: PortalLine }) {
  return (
    <li className="flex flex-col gap-1 py-2" data-line-no={line.lineNo}>
      <div className="flex flex-wrap items-baseline justify-between gap-x-3">
        <p className="font-semibold text-graphite-900">
          <span className="mr-1 text-graphite-500">{line.lineNo}.</span>
          {line.title}
          {line.customerPartNumber && <span className="ml-2 inline-block text-sm font-normal whitespace-nowrap text-graphite-600">part {line.customerPartNumber}</span>}
        </p>
        <span className="tabular text-sm font-semibold text-graphite-800">{pieces(line.quantity)}</span>
      </div>
      <ProgressBar line={line} />
      <p className="text-sm text-graphite-800" data-testid="line-summary">
        {line.summary}
      </p>
    </li>
  );
}
