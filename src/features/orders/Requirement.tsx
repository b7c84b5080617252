/** A line's requirement, read back in the user's units (the API gives SI: metres, °C, N, T, Ω). */
import type { Requirement } from '../../contracts/orders';
import type { UnitFormatters } from '../../lib/units';
import { formatNumber } from '../../lib/units';

const n = (v: number, digits = 2) => formatNumber(v, Number.isInteger(v) ? 0 : digits);

export function describeSupply(r: Requirement) {
  return r.drive.kind === 'voltage' ? `${n(r.drive.volts)}\u00a0V DC` : `${n(r.drive.amps, 3)}\u00a0A DC`;
}

export function describeTarget(r: Requirement) {
  const t = r.target;
  if (t.kind === 'ampereTurns') return `${n(t.ampereTurns, 1)}\u00a0A·turns`;
  if (t.kind === 'pull') return `${n(t.force, 1)}\u00a0N pull at the air gap`;
  return `${n(t.fluxDensity, 4)}\u00a0T ${t.at === 'gap' ? 'in the air gap' : 'at the winding’s centre'}`;
}

export function RequirementFacts({ r, tolerancePercent, u }: { r: Requirement; tolerancePercent: number; u: UnitFormatters }) {
  const m = r.magneticCircuit;
  const w = r.conductor?.wire;
  const wire = w ? (w.standard === 'AWG' ? `AWG ${w.gauge}` : `${formatNumber(w.diameter * 1000, 3)}\u00a0mm${u.prefs.lengthUnit === 'in' ? ` (${u.length(w.diameter)})` : ''}`) : null;
  const conductor = [
    r.conductor?.material ? (r.conductor.material === 'copper' ? 'Copper' : 'Aluminium') : null,
    wire,
    r.conductor?.insulationGrade ? `grade ${r.conductor.insulationGrade}` : null,
  ].filter(Boolean);
  const facts: [string, string][] = [
    ['Supply', describeSupply(r)],
    ['Duty cycle', `${formatNumber(r.dutyCycle * 100, r.dutyCycle * 100 === Math.round(r.dutyCycle * 100) ? 0 : 1)}\u00a0%`],
    ['Ambient', u.temperature(r.ambient)],
    ['Thermal class', `${r.insulationClass} (${u.temperature(r.insulationClass, 0)})`],
    [
      r.fit === 'envelope' ? 'Envelope (fit inside)' : 'Bobbin',
      `ID ${u.length(r.bobbin.innerDiameter)} × OD ${u.length(r.bobbin.outerDiameter)} × traverse ${u.length(r.bobbin.length)}`,
    ],
    ['Target', describeTarget(r)],
    [`Resistance at ${u.temperature(20, 0)}`, r.resistance !== undefined ? `${n(r.resistance)}\u00a0Ω ±\u00a0${n(tolerancePercent, 1)}\u00a0%` : `not stated (tolerance ±\u00a0${n(tolerancePercent, 1)}\u00a0%)`],
    ['Conductor', conductor.length ? conductor.join(', ') : 'engineer’s choice'],
  ];
  if (m) {
    facts.push([
      'Magnetic circuit',
      `µr ${n(m.relativePermeability, 0)}, saturation ${n(m.saturationFluxDensity)}\u00a0T, iron path ${u.length(m.ironPathLength)}, ${m.gapCount} × ${u.length(m.airGap)} gap, pole area ${u.area(m.area)}`,
    ]);
  }
  return (
    <dl className="grid grid-cols-[max-content_1fr] gap-x-4 gap-y-0.5 text-sm">
      {facts.map(([k, v]) => (
        <div key={k} className="contents">
          <dt className="text-graphite-500">{k}</dt>
          <dd className="tabular text-graphite-900">{v}</dd>
        </div>
      ))}
    </dl>
  );
}
