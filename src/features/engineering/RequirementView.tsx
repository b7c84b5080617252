/** The customer's requirement for a line, in the user's units (the API gives SI). */
import type { OrderLineDetail } from '../../contracts/build-sheets';
import type { Requirement } from '../../contracts/orders';
import { formatDay } from '../../lib/format';
import { formatNumber, type UnitFormatters } from '../../lib/units';
import * as n from './numbers';
import { wireSizeLabel } from './specModel';

function target(r: Requirement): string {
  const t = r.target;
  if (t.kind === 'ampereTurns') return `${n.ampereTurns(t.ampereTurns)} (low corner: low supply, winding hot)`;
  if (t.kind === 'pull') return `${n.newtons(t.force)} pull at the air gap`;
  return `${n.millitesla(t.fluxDensity)} ${t.at === 'gap' ? 'in the air gap' : 'at the winding’s centre'}`;
}

export function RequirementView({ line, u }: { line: OrderLineDetail; u: UnitFormatters }) {
  const r = line.requirement;
  const m = r.magneticCircuit;
  const c = r.conductor;
  const conductor = [c?.material && (c.material === 'copper' ? 'Copper' : 'Aluminium'), c?.wire && wireSizeLabel(c.wire), c?.insulationGrade && `grade ${c.insulationGrade}`].filter(Boolean).join(', ');
  const rows: [string, string][] = [
    ['Quantity · due', `${formatNumber(line.quantity, 0)} units · ${formatDay(line.order.dueDate)}`],
    ['Target', target(r)],
    ['Supply', r.drive.kind === 'voltage' ? `${n.volts(r.drive.volts)} DC` : `${n.amps(r.drive.amps)} DC`],
    ['Duty · ambient', `${n.percent(r.dutyCycle, 0)} · ${u.temperature(r.ambient)}`],
    ['Thermal class', `${r.insulationClass} (${u.temperature(r.insulationClass, 0)})`],
    [
      r.fit === 'envelope' ? 'Envelope (must fit inside)' : 'Bobbin',
      `bore ⌀ ${u.length(r.bobbin.innerDiameter)}, limit ⌀ ${u.length(r.bobbin.outerDiameter)}, traverse ${u.length(r.bobbin.length)}`,
    ],
    [`Resistance at ${u.temperature(20, 0)}`, r.resistance !== undefined ? `${n.ohms(r.resistance)} ±${formatNumber(line.tolerancePercent, 1)} %` : `not stated (±${formatNumber(line.tolerancePercent, 1)} %)`],
    ['Conductor', conductor || 'engineer’s choice'],
  ];
  if (m) {
    rows.push([
      'Magnetic circuit',
      `µr ${formatNumber(m.relativePermeability, 0)}, saturation ${n.tesla(m.saturationFluxDensity)}, iron path ${u.length(m.ironPathLength)}, ${m.gapCount} × ${u.length(m.airGap)} gap, pole area ${u.area(m.area)}`,
    ]);
  }
  return (
    <div className="flex flex-col gap-3" data-testid="requirement">
      <dl className="grid grid-cols-[max-content_1fr] gap-x-4 gap-y-1 text-sm">
        {rows.map(([k, v]) => (
          <div key={k} className="contents">
            <dt className="text-graphite-500">{k}</dt>
            <dd className="tabular text-graphite-900">{v}</dd>
          </div>
        ))}
      </dl>
      {(line.terminationNotes || line.leadNotes) && (
        <p className="text-sm text-graphite-700">
          {line.terminationNotes && <>Termination: {line.terminationNotes}. </>}
          {line.leadNotes && <>Leads: {line.leadNotes}.</>}
        </p>
      )}
      {line.starting.notes.length > 0 && (
        <details className="text-sm">
          <summary className="cursor-pointer font-semibold text-graphite-700">How the starting sheet was filled ({line.starting.notes.length})</summary>
          <ul className="mt-1 list-disc pl-5 text-graphite-700">
            {line.starting.notes.map((x) => (
              <li key={x}>{x}</li>
            ))}
          </ul>
        </details>
      )}
    </div>
  );
}
