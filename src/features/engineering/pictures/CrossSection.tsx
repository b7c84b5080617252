/**
 * The coil's section through its axis, to scale: the bore, the winding's layers as bands (or the
 * turns as circles when there are few) up to the built diameter, and the bobbin's outer limit as
 * a dashed line. One scale for both directions; dimensions in the user's units.
 */
import type { UnitFormatters } from '../../../lib/units';

export type SectionGeometry = {
  /** m */
  innerDiameter: number;
  builtDiameter: number;
  limitDiameter: number;
  length: number;
  layers: number;
  turnsPerLayer: number;
  turns: number;
  /** Overall (insulated) wire diameter, m. */
  wireDiameter: number;
};

const W = 560;
const H = 360;
const M = { left: 24, right: 190, top: 22, bottom: 52 };
const COPPER = ['#cf7d47', '#b8632e'];

/** Spreads label positions so no two are closer than `gap` px, keeping their order. */
function spread(ys: number[], gap: number, min: number): number[] {
  const out = [...ys];
  for (let i = 1; i < out.length; i++) if (out[i] - out[i - 1] < gap) out[i] = out[i - 1] + gap;
  // If the last one went too low, nothing to do here: labels sit above the axis with room to spare.
  for (let i = out.length - 2; i >= 0; i--) if (out[i + 1] - out[i] < gap) out[i] = out[i + 1] - gap;
  return out.map((y) => Math.max(min, y));
}

export function CrossSection({ g, u }: { g: SectionGeometry; u: UnitFormatters }) {
  const rIn = g.innerDiameter / 2;
  const rBuilt = Math.max(g.builtDiameter / 2, rIn);
  const rLim = g.limitDiameter / 2;
  const rMax = Math.max(rBuilt, rLim);
  const aw = W - M.left - M.right;
  const ah = H - M.top - M.bottom;
  const s = Math.min(aw / g.length, ah / (2 * rMax));
  const cx = M.left + aw / 2;
  const cy = M.top + ah / 2;
  const x0 = cx - (g.length * s) / 2;
  const x1 = cx + (g.length * s) / 2;
  const Y = (r: number) => cy - r * s; // upper half
  const Yb = (r: number) => cy + r * s; // lower half

  const layers = Math.max(0, Math.round(g.layers));
  const layerT = layers > 0 ? (rBuilt - rIn) / layers : 0;
  const wirePx = g.wireDiameter * s;
  const drawCircles = layers > 0 && g.turns <= 900 && wirePx >= 3;
  // Bands no thinner than 2 px: several layers per band when they are thin.
  const perBand = layers > 0 ? Math.max(1, Math.ceil(2 / Math.max(layerT * s, 1e-9))) : 1;
  const bands: { r0: number; r1: number; len: number; i: number }[] = [];
  const lastTurns = g.turnsPerLayer > 0 ? g.turns - g.turnsPerLayer * (layers - 1) : 0;
  for (let i = 0; i < layers; i += perBand) {
    const top = Math.min(layers, i + perBand);
    const isLast = top === layers;
    const frac = isLast && g.turnsPerLayer > 0 && perBand === 1 ? Math.max(0, Math.min(1, lastTurns / g.turnsPerLayer)) : 1;
    bands.push({ r0: rIn + i * layerT, r1: rIn + top * layerT, len: frac, i: i / perBand });
  }

  const labels = [
    { key: 'limit', r: rLim, text: `⌀ limit ${u.length(g.limitDiameter)}`, colour: '#545b62' },
    { key: 'built', r: rBuilt, text: `⌀ built ${u.length(g.builtDiameter)}`, colour: rBuilt > rLim * (1 + 1e-9) ? '#a8261f' : '#7c3f1e' },
    { key: 'bore', r: rIn, text: `⌀ bore ${u.length(g.innerDiameter)}`, colour: '#2e3236' },
  ].sort((a, b) => b.r - a.r);
  const ly = spread(labels.map((l) => Y(l.r)), 17, M.top - 4);
  const labelX = x1 + 26;

  const circles: { x: number; y: number }[] = [];
  if (drawCircles) {
    let n = 0;
    for (let layer = 0; layer < layers && n < g.turns; layer++) {
      const r = rIn + (layer + 0.5) * layerT;
      const stagger = layer % 2 === 1 && layerT < g.wireDiameter * 0.95 ? 0.5 : 0;
      for (let k = 0; k < g.turnsPerLayer && n < g.turns; k++, n++) {
        const x = x0 + (k + 0.5 + stagger) * (g.length / (g.turnsPerLayer + stagger)) * s;
        circles.push({ x, y: Y(r) }, { x, y: Yb(r) });
      }
    }
  }

  const summary = `Section of the coil to scale: bore ${u.length(g.innerDiameter)}, built ${u.length(g.builtDiameter)}, limit ${u.length(g.limitDiameter)}, traverse ${u.length(g.length)}, ${layers} layers.`;
  return (
    <figure className="flex flex-col gap-1" data-testid="picture-section">
      <figcaption className="text-sm font-semibold text-graphite-800">Section through the axis (to scale)</figcaption>
      <svg viewBox={`0 0 ${W} ${H}`} className="h-auto w-full max-w-[640px]" role="img" aria-label={summary}>
        <rect x="0" y="0" width={W} height={H} fill="#fbfbfc" />
        {/* bore */}
        <rect x={x0} y={Y(rIn)} width={x1 - x0} height={(Yb(rIn) - Y(rIn))} fill="#eef0f2" />
        {/* winding: bands or turns */}
        {!drawCircles &&
          bands.map((b) =>
            [Y, Yb].map((f, side) => {
              const ya = f(b.r0);
              const yb = f(b.r1);
              return <rect key={`${b.i}-${side}`} x={x0} y={Math.min(ya, yb)} width={(x1 - x0) * b.len} height={Math.abs(yb - ya)} fill={COPPER[b.i % 2]} />;
            }),
          )}
        {drawCircles && circles.map((c, i) => <circle key={i} cx={c.x} cy={c.y} r={Math.max(wirePx / 2 - 0.3, 0.8)} fill="#cf7d47" stroke="#7c3f1e" strokeWidth="0.6" />)}
        {/* bobbin tube and flanges (outline) */}
        <line x1={x0} x2={x1} y1={Y(rIn)} y2={Y(rIn)} stroke="#2e3236" strokeWidth="1.5" />
        <line x1={x0} x2={x1} y1={Yb(rIn)} y2={Yb(rIn)} stroke="#2e3236" strokeWidth="1.5" />
        {[x0, x1].map((x) => (
          <g key={x}>
            <line x1={x} x2={x} y1={Y(rLim)} y2={Y(rIn)} stroke="#2e3236" strokeWidth="1.5" />
            <line x1={x} x2={x} y1={Yb(rIn)} y2={Yb(rLim)} stroke="#2e3236" strokeWidth="1.5" />
          </g>
        ))}
        {/* outer limit */}
        <line x1={x0 - 8} x2={x1 + 8} y1={Y(rLim)} y2={Y(rLim)} stroke="#545b62" strokeWidth="1.5" strokeDasharray="7 4" />
        <line x1={x0 - 8} x2={x1 + 8} y1={Yb(rLim)} y2={Yb(rLim)} stroke="#545b62" strokeWidth="1.5" strokeDasharray="7 4" />
        {/* axis */}
        <line x1={x0 - 14} x2={x1 + 14} y1={cy} y2={cy} stroke="#6b737b" strokeWidth="1" strokeDasharray="14 3 2 3" />
        <text x={x0 - 12} y={cy - 5} fontSize="11" fill="#6b737b">
          axis
        </text>
        {/* diameter labels with leaders */}
        {labels.map((l, i) => (
          <g key={l.key}>
            <polyline points={`${x1 + 2},${Y(l.r)} ${labelX - 6},${ly[i]}`} fill="none" stroke={l.colour} strokeWidth="1" />
            <text x={labelX} y={ly[i]} dy="0.32em" fontSize="13" fontWeight="600" fill={l.colour}>
              {l.text}
            </text>
          </g>
        ))}
        {/* traverse length */}
        <g stroke="#2e3236" strokeWidth="1">
          <line x1={x0} x2={x0} y1={Yb(rMax) + 6} y2={Yb(rMax) + 24} />
          <line x1={x1} x2={x1} y1={Yb(rMax) + 6} y2={Yb(rMax) + 24} />
          <line x1={x0} x2={x1} y1={Yb(rMax) + 18} y2={Yb(rMax) + 18} markerStart="" />
          <path d={`M${x0},${Yb(rMax) + 18} l7,-3.5 v7z M${x1},${Yb(rMax) + 18} l-7,-3.5 v7z`} fill="#2e3236" />
        </g>
        <text x={cx} y={Yb(rMax) + 38} textAnchor="middle" fontSize="13" fontWeight="600" fill="#2e3236">
          traverse {u.length(g.length)}
        </text>
      </svg>
      <p className="text-sm text-graphite-600">
        {layers} {layers === 1 ? 'layer' : 'layers'} of {Math.round(g.turnsPerLayer)} turns
        {drawCircles ? ', each circle one turn' : perBand > 1 ? `, each band ${perBand} layers` : ', each band one layer'}. Dashed: the bobbin’s outer limit.
      </p>
    </figure>
  );
}
