/**
 * The build sheet's numbers as the engine computed them, grouped the way a winder and a checker
 * read them, each warning beside the number it concerns with the caution that matters.
 */
import type { ReactNode } from 'react';
import type { CoilSpec } from '../../contracts/coil';
import { StatusShape } from '../../components/Status';
import { formatNumber, type UnitFormatters } from '../../lib/units';
import type { EngineSheet } from './api';
import * as n from './numbers';
import { wireSizeLabel } from './specModel';
import { CAUTIONS, PULL_CAUTION, placeOf, warningKind, type WarningPlace } from './warnings';

type Warning = EngineSheet['warnings'][number];

function WarningNote({ w, u }: { w: Warning; u: UnitFormatters }) {
  const kind = warningKind(w.code);
  const caution = CAUTIONS[w.code];
  return (
    <div
      role="note"
      data-warning={w.code}
      className={`mt-1 flex gap-2 rounded border px-2 py-1.5 text-sm ${kind === 'fault' ? 'border-fault/40 bg-fault-soft' : 'border-caution/40 bg-caution-soft'}`}
    >
      <StatusShape kind={kind} className={`mt-0.5 size-3.5 ${kind === 'fault' ? 'text-fault' : 'text-caution'}`} />
      <div>
        <p className={`font-semibold ${kind === 'fault' ? 'text-fault' : 'text-caution'}`}>{u.text(w.message)}</p>
        {caution && <p className="text-graphite-800">{caution}</p>}
      </div>
    </div>
  );
}

type Row = { label: ReactNode; value: ReactNode; testId?: string; note?: ReactNode; place?: WarningPlace };

function Group({ title, rows, warnings, u }: { title: string; rows: Row[]; warnings: Warning[]; u: UnitFormatters }) {
  return (
    <section>
      <h3 className="mb-1 text-xs font-bold tracking-wider text-graphite-500 uppercase">{title}</h3>
      <dl className="divide-y divide-graphite-100">
        {rows.map((r, i) => {
          const here = r.place ? warnings.filter((w) => placeOf(w.code) === r.place) : [];
          return (
            <div key={i} className="py-1">
              <div className="flex items-baseline justify-between gap-3">
                <dt className="text-sm text-graphite-600">{r.label}</dt>
                <dd className={`tabular text-right font-semibold ${here.length ? 'text-fault' : 'text-graphite-950'}`} data-testid={r.testId}>
                  {here.length > 0 && <span className="sr-only">Warning: </span>}
                  {r.value}
                </dd>
              </div>
              {r.note && <p className="text-right text-xs text-graphite-500">{r.note}</p>}
              {here.map((w) => (
                <WarningNote key={w.code} w={w} u={u} />
              ))}
            </div>
          );
        })}
      </dl>
    </section>
  );
}

export function SheetView({ sheet, spec, tolerancePercent, u }: { sheet: EngineSheet; spec: CoilSpec; tolerancePercent: number; u: UnitFormatters }) {
  const w = sheet.warnings;
  // A warning with no number of its own is shown above the groups (placed warnings show only once, beside their number).
  const general = w.filter((x) => placeOf(x.code) === 'general' || (placeOf(x.code) === 'magnetic' && sheet.pullForce === undefined && sheet.gapFluxDensity === undefined));
  const tol = tolerancePercent / 100;
  const margin = spec.insulationClass - sheet.windingTemperature;
  const conductor = sheet.wire.conductor === 'copper' ? 'Copper' : 'Aluminium';
  const hasCircuit = sheet.gapFluxDensity !== undefined || sheet.pullForce !== undefined;

  return (
    <div className="flex flex-col gap-4" data-testid="sheet">
      {general.map((x) => (
        <WarningNote key={x.code} w={x} u={u} />
      ))}
      <div className="grid gap-x-6 gap-y-4 md:grid-cols-2">
        <Group
          u={u}
          title="Wire"
          warnings={w}
          rows={[
            { label: 'Magnet wire', value: `${conductor}, ${wireSizeLabel(sheet.wire.size)}, grade ${sheet.wire.grade}`, testId: 'sheet-wire' },
            { label: 'Bare diameter', value: u.length(sheet.wire.bareDiameter, u.prefs.lengthUnit === 'mm' ? 3 : 4) },
            { label: 'Overall diameter', value: u.length(sheet.wire.overallDiameter, u.prefs.lengthUnit === 'mm' ? 3 : 4) },
            { label: 'Wire per unit', value: `${n.wireLength(sheet.wireLength, u)} · ${n.kilograms(sheet.wireMass)}`, note: 'conductor mass, insulation not counted' },
          ]}
        />
        <Group
          u={u}
          title="Winding"
          warnings={w}
          rows={[
            { label: 'Turns', value: formatNumber(sheet.turns, 0), testId: 'sheet-turns' },
            { label: 'Turns per layer × layers', value: `${formatNumber(sheet.turnsPerLayer, 0)} × ${formatNumber(sheet.layers, 0)}` },
            {
              label: 'Built diameter',
              value: u.length(sheet.outerDiameter),
              note: `limit ${u.length(spec.bobbin.outerDiameter)} · bore ${u.length(spec.bobbin.innerDiameter)} · traverse ${u.length(spec.bobbin.length)}`,
              place: 'fit',
            },
            ...(sheet.fillFactor !== undefined ? [{ label: 'Fill factor (bare)', value: n.percent(sheet.fillFactor) }] : []),
          ]}
        />
        <Group
          u={u}
          title="Electrical"
          warnings={w}
          rows={[
            {
              label: `Resistance at ${u.temperature(20, 0)}`,
              value: n.ohms(sheet.resistance20),
              testId: 'sheet-r20',
              note: `±${formatNumber(tolerancePercent, 1)} %: ${n.ohms(sheet.resistance20 * (1 - tol))} to ${n.ohms(sheet.resistance20 * (1 + tol))}`,
            },
            { label: `Resistance hot (${u.temperature(sheet.windingTemperature, 0)})`, value: n.ohms(sheet.resistanceHot) },
            {
              label: 'Current cold → hot',
              value: sheet.currentCold !== undefined ? `${n.amps(sheet.currentCold)} → ${n.amps(sheet.currentHot)}` : n.amps(sheet.currentHot),
              testId: 'sheet-current',
            },
            { label: 'Power cold → hot', value: sheet.powerCold !== undefined ? `${n.watts(sheet.powerCold)} → ${n.watts(sheet.powerHot)}` : n.watts(sheet.powerHot) },
            {
              label: 'A·turns cold → hot',
              value: sheet.ampereTurnsCold !== undefined ? `${n.ampereTurns(sheet.ampereTurnsCold)} → ${n.ampereTurns(sheet.ampereTurnsHot)}` : n.ampereTurns(sheet.ampereTurnsHot),
            },
            { label: 'Current density (hot)', value: n.currentDensity(sheet.currentDensity, u), place: 'currentDensity' },
            { label: hasCircuit ? 'Inductance (with the iron)' : 'Inductance (air core)', value: n.henries(sheet.inductance), note: `time constant L/R ${n.seconds(sheet.timeConstant)}` },
          ]}
        />
        <Group
          u={u}
          title="Thermal"
          warnings={w}
          rows={[
            { label: 'Ambient · duty', value: `${u.temperature(spec.ambient)} · ${n.percent(spec.dutyCycle, 0)}` },
            { label: 'Temperature rise', value: u.temperatureDifference(sheet.temperatureRise) },
            {
              label: `Winding temperature (class ${spec.insulationClass})`,
              value: u.temperature(sheet.windingTemperature),
              testId: 'sheet-temperature',
              note:
                margin >= 0
                  ? `${u.temperatureDifference(margin)} below the class limit of ${u.temperature(spec.insulationClass, 0)}`
                  : `${u.temperatureDifference(-margin)} over the class limit of ${u.temperature(spec.insulationClass, 0)}`,
              place: 'temperature',
            },
            { label: 'Thermal time constant', value: n.seconds(sheet.thermalTimeConstant) },
          ]}
        />
        <Group
          u={u}
          title="Magnetic"
          warnings={w}
          rows={[
            { label: 'Field at the centre (air core)', value: n.millitesla(sheet.centreField), testId: 'sheet-field' },
            ...(hasCircuit
              ? [
                  { label: 'Flux density in the gap', value: sheet.gapFluxDensity !== undefined ? n.tesla(sheet.gapFluxDensity) : '—', place: 'magnetic' as const },
                  {
                    label: 'Pull at the design gap',
                    value: sheet.pullForce !== undefined ? n.newtons(sheet.pullForce) : '—',
                    testId: 'sheet-pull',
                    note: PULL_CAUTION,
                  },
                ]
              : []),
          ]}
        />
      </div>
    </div>
  );
}

/** The constants and rules the engine used, with their sources. */
/** An assumption's value and unit: lengths and temperatures in the user's units, the rest as the engine states them (SI). */
function assumptionValue(a: EngineSheet['assumptions'][number], u: UnitFormatters): [string, string] {
  if (typeof a.value !== 'number') return [a.value, a.unit];
  const split = (s: string): [string, string] => {
    const i = s.lastIndexOf('\u00a0');
    return i < 0 ? [s, ''] : [s.slice(0, i), s.slice(i + 1)];
  };
  if (a.unit === 'm') return split(u.length(a.value, u.prefs.lengthUnit === 'mm' ? 3 : 5));
  if (a.unit === '°C') return split(u.temperature(a.value));
  if (a.unit === 'K') return split(u.temperatureDifference(a.value));
  return [n.sig(a.value, 5), a.unit];
}

export function AssumptionsPanel({ sheet, engineVersion, u }: { sheet: EngineSheet; engineVersion?: string; u: UnitFormatters }) {
  return (
    <details className="rounded-lg border border-graphite-200 bg-white" data-testid="assumptions">
      <summary className="cursor-pointer px-4 py-2.5 font-semibold text-graphite-900">
        Assumptions and sources ({sheet.assumptions.length}){engineVersion ? ` · engine ${engineVersion}` : ''}
      </summary>
      <div className="overflow-x-auto border-t border-graphite-200 px-4 py-3">
        <table className="w-full text-sm">
          <thead>
            <tr className="border-b border-graphite-200 text-left text-graphite-600">
              <th className="py-1 pr-3 font-semibold">What</th>
              <th className="py-1 pr-3 text-right font-semibold">Value</th>
              <th className="py-1 pr-3 font-semibold">Unit</th>
              <th className="py-1 font-semibold">Source</th>
            </tr>
          </thead>
          <tbody>
            {sheet.assumptions.map((a) => {
              const [value, unit] = assumptionValue(a, u);
              return (
                <tr key={a.name} className="border-b border-graphite-100 align-top">
                  <td className="py-1 pr-3">{a.name}</td>
                  <td className={`tabular py-1 pr-3 ${typeof a.value === 'number' ? 'text-right' : ''}`}>{value}</td>
                  <td className="py-1 pr-3">{unit}</td>
                  <td className="py-1 text-graphite-700">{a.source}</td>
                </tr>
              );
            })}
          </tbody>
        </table>
        <p className="mt-2 text-xs text-graphite-500">Lengths and temperatures in your units; every other constant as the engine states it (SI).</p>
      </div>
    </details>
  );
}
