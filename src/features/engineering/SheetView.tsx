/**
 * The build sheet's numbers as the engine computed them, grouped the way a winder and a checker
 * read them, each warning beside the number it concerns with the caution that matters, the
 * operating corners, the duty and the switch-off. A record of engine 1 lacks the last three and
 * says so.
 */
import type { ReactNode } from 'react';
import type { CoilSpec } from '../../contracts/coil';
import { StatusShape } from '../../components/Status';
import { formatNumber, type UnitFormatters } from '../../lib/units';
import type { EngineSheet } from './api';
import * as n from './numbers';
import { wireSizeLabel } from './specModel';
import { CAUTIONS, PULL_CAUTION, cautionPlace, placeOf, warningKind, type WarningPlace } from './warnings';

type Warning = EngineSheet['warnings'][number];
type Caution = NonNullable<EngineSheet['cautions']>[number];
type Place = WarningPlace | 'electrical';

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

/** A safety caution from the engine: where someone can get hurt (not a fault of the design). */
function CautionNote({ c, u }: { c: Caution; u: UnitFormatters }) {
  return (
    <p role="note" data-caution={c.code} className="mt-1 flex gap-2 rounded border border-graphite-300 bg-graphite-50 px-2 py-1 text-xs text-graphite-800">
      <StatusShape kind="caution" className="mt-0.5 size-3 text-caution" />
      <span>{u.text(c.message)}</span>
    </p>
  );
}

type Row = { label: ReactNode; value: ReactNode; testId?: string; note?: ReactNode; place?: WarningPlace };

function Group({
  title,
  rows,
  warnings,
  cautions = [],
  u,
  testId,
  wide,
}: {
  title: string;
  rows: Row[];
  warnings: Warning[];
  cautions?: Caution[];
  u: UnitFormatters;
  testId?: string;
  wide?: boolean;
}) {
  return (
    <section data-testid={testId} className={wide ? 'md:col-span-2' : undefined}>
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
      {cautions.map((c) => (
        <CautionNote key={c.code} c={c} u={u} />
      ))}
    </section>
  );
}

const supplyOf = (spec: CoilSpec, v: number) => (spec.drive.kind === 'voltage' ? n.volts(v) : n.amps(v));

/** Low / nominal / high: the pull-in worst case, the rated point and the heating worst case. */
function CornersTable({ sheet, spec, u }: { sheet: EngineSheet; spec: CoilSpec; u: UnitFormatters }) {
  const c = sheet.corners!;
  const limit = sheet.duty?.limitTemperature;
  const withCircuit = c.nominal.pullForce !== undefined;
  const rows: [string, string, typeof c.low][] = [
    ['Low', 'pull-in worst case: low supply, winding hot at the highest ambient', c.low],
    ['Nominal', 'rated supply at the rated ambient', c.nominal],
    ['High', 'heating worst case: high supply at the highest ambient', c.high],
  ];
  return (
    <section className="md:col-span-2" data-testid="sheet-corners">
      <h3 className="mb-1 text-xs font-bold tracking-wider text-graphite-500 uppercase">Operating corners</h3>
      <div className="overflow-x-auto">
        <table className="w-full text-sm">
          <caption className="sr-only">Operating corners: low, nominal and high</caption>
          <thead>
            <tr className="border-b border-graphite-200 text-right text-graphite-600">
              <th className="py-1 pr-2 text-left font-semibold">Corner</th>
              <th className="py-1 pr-2 font-semibold">Supply</th>
              <th className="py-1 pr-2 font-semibold">Ambient</th>
              <th className="py-1 pr-2 font-semibold">Winding</th>
              <th className="py-1 pr-2 font-semibold">R</th>
              <th className="py-1 pr-2 font-semibold">Current</th>
              <th className="py-1 pr-2 font-semibold">Power</th>
              <th className="py-1 pr-2 font-semibold">A·turns</th>
              {withCircuit && <th className="py-1 pr-2 font-semibold">B gap</th>}
              {withCircuit && <th className="py-1 font-semibold">Pull</th>}
            </tr>
          </thead>
          <tbody>
            {rows.map(([name, what, k]) => {
              const hot = limit !== undefined && k.windingTemperature > limit;
              return (
                <tr key={name} className="border-b border-graphite-100 text-right" data-corner={name.toLowerCase()}>
                  <th scope="row" className="py-1 pr-2 text-left font-semibold" title={what}>
                    {name}
                    <span className="hidden text-xs font-normal text-graphite-500 2xl:block">{what}</span>
                  </th>
                  <td className="tabular py-1 pr-2">{supplyOf(spec, k.supply)}</td>
                  <td className="tabular py-1 pr-2">{u.temperature(k.ambient, 0)}</td>
                  <td className={`tabular py-1 pr-2 ${hot || k.runaway ? 'font-semibold text-fault' : ''}`}>
                    {k.runaway ? 'runaway' : u.temperature(k.windingTemperature, 0)}
                  </td>
                  <td className="tabular py-1 pr-2">{n.ohms(k.resistance)}</td>
                  <td className="tabular py-1 pr-2">{n.amps(k.current)}</td>
                  <td className="tabular py-1 pr-2">{n.watts(k.power)}</td>
                  <td className="tabular py-1 pr-2">{n.ampereTurns(k.ampereTurns)}</td>
                  {withCircuit && <td className="tabular py-1 pr-2">{k.gapFluxDensity !== undefined ? n.tesla(k.gapFluxDensity) : '—'}</td>}
                  {withCircuit && <td className="tabular py-1">{k.pullForce !== undefined ? n.newtons(k.pullForce) : '—'}</td>}
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
      <p className="mt-1 text-xs text-graphite-500">
        Low: the pull-in worst case (low supply, winding hot at the highest ambient). High: the heating worst case (high supply at the highest ambient).
        Supply band {formatNumber((spec.supplyTolerance?.low ?? 0.85) * 100, 0)} – {formatNumber((spec.supplyTolerance?.high ?? 1.1) * 100, 0)}&nbsp;% of rated
        {spec.supplyTolerance ? '' : ' (the usual band for control supplies)'}; highest ambient {u.temperature(spec.ambientMax ?? spec.ambient, 0)}. A line’s
        target is met at the low corner; the class is judged at the high corner.
      </p>
    </section>
  );
}

export function SheetView({ sheet, spec, tolerancePercent, u }: { sheet: EngineSheet; spec: CoilSpec; tolerancePercent: number; u: UnitFormatters }) {
  const w = sheet.warnings;
  const cautions = sheet.cautions ?? [];
  const cautionsAt = (place: Place) => cautions.filter((c) => cautionPlace(c.code) === place);
  // A warning with no number of its own is shown above the groups (placed warnings show only once, beside their number).
  const general = w.filter((x) => placeOf(x.code) === 'general' || (placeOf(x.code) === 'magnetic' && sheet.pullForce === undefined && sheet.gapFluxDensity === undefined));
  const tol = tolerancePercent / 100;
  const allowance = sheet.hotSpotAllowance;
  const limit = allowance !== undefined ? spec.insulationClass - allowance : spec.insulationClass;
  const hottest = sheet.corners ? Math.max(sheet.corners.high.windingTemperature, sheet.duty?.peakTemperature ?? -Infinity) : sheet.windingTemperature;
  const margin = limit - hottest;
  const conductor = sheet.wire.conductor === 'copper' ? 'Copper' : 'Aluminium';
  const hasCircuit = sheet.gapFluxDensity !== undefined || sheet.pullForce !== undefined;
  const v2 = sheet.corners !== undefined;
  const partial = sheet.turns > 0 && sheet.windingLength < spec.bobbin.length * (1 - 1e-9);
  const band = sheet.resistanceBand;
  const duty = sheet.duty;
  const off = sheet.switchOff;

  return (
    <div className="flex flex-col gap-4" data-testid="sheet">
      {general.map((x) => (
        <WarningNote key={x.code} w={x} u={u} />
      ))}
      {!v2 && (
        <p className="rounded border border-graphite-300 bg-graphite-50 px-3 py-2 text-sm text-graphite-700" data-testid="sheet-engine1">
          A record of the first engine: it kept the nominal point only (no operating corners, duty, switch-off or resistance band), and its wire mass is the bare
          conductor’s. A new version is computed by the current engine.
        </p>
      )}
      <div className="grid gap-x-6 gap-y-4 md:grid-cols-2">
        <Group
          u={u}
          title="Wire"
          warnings={w}
          rows={[
            { label: 'Magnet wire', value: `${conductor}, ${wireSizeLabel(sheet.wire.size)}, grade ${sheet.wire.grade}`, testId: 'sheet-wire' },
            { label: 'Bare diameter', value: u.length(sheet.wire.bareDiameter, u.prefs.lengthUnit === 'mm' ? 3 : 4) },
            { label: 'Overall diameter', value: u.length(sheet.wire.overallDiameter, u.prefs.lengthUnit === 'mm' ? 3 : 4) },
            {
              label: 'Wire per unit',
              value: `${n.wireLength(sheet.wireLength, u)} · ${n.kilograms(sheet.wireMass)}`,
              testId: 'sheet-wire-mass',
              note: sheet.conductorMass !== undefined ? `insulated wire, as spools are weighed (${conductor.toLowerCase()} ${n.kilograms(sheet.conductorMass)})` : 'conductor mass, insulation not counted (engine 1)',
            },
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
            ...(partial ? [{ label: 'Length the turns occupy', value: u.length(sheet.windingLength), note: 'less than one layer: turns × overall diameter', testId: 'sheet-winding-length' }] : []),
            ...(sheet.fillFactor !== undefined ? [{ label: 'Fill factor (bare)', value: n.percent(sheet.fillFactor) }] : []),
            ...(sheet.packingFactor !== undefined
              ? [{ label: 'Packing (turns per d²)', value: formatNumber(sheet.packingFactor, 3), note: 'close packing allows 1.155' }]
              : []),
          ]}
        />
        <Group
          u={u}
          title="Electrical"
          warnings={w}
          cautions={cautionsAt('electrical')}
          rows={[
            {
              label: `Resistance at ${u.temperature(20, 0)}`,
              value: n.ohms(sheet.resistance20),
              testId: 'sheet-r20',
              note: `line’s ±${formatNumber(tolerancePercent, 1)} %: ${n.ohms(sheet.resistance20 * (1 - tol))} to ${n.ohms(sheet.resistance20 * (1 + tol))}`,
            },
            ...(band
              ? [
                  {
                    label: 'Acceptance band (no tolerance stated)',
                    value: `${n.ohms(band.min)} – ${n.ohms(band.max)}`,
                    testId: 'sheet-band',
                    note: band.basis,
                  },
                ]
              : []),
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
          cautions={cautionsAt('temperature')}
          rows={[
            { label: 'Ambient · duty', value: `${u.temperature(spec.ambient)} · ${n.percent(spec.dutyCycle, 0)}` },
            { label: 'Temperature rise (nominal)', value: u.temperatureDifference(sheet.temperatureRise) },
            {
              label: `Winding temperature, nominal (class ${spec.insulationClass})`,
              value: u.temperature(sheet.windingTemperature),
              testId: 'sheet-temperature',
            },
            ...(sheet.corners
              ? [
                  {
                    label: 'Hottest: high corner or duty peak',
                    value: u.temperature(hottest),
                    testId: 'sheet-temperature-high',
                    note:
                      margin >= 0
                        ? `${u.temperatureDifference(margin)} below ${u.temperature(limit, 0)}: class ${spec.insulationClass} less ${u.temperatureDifference(allowance ?? 0, 0)} hot-spot allowance`
                        : `${u.temperatureDifference(-margin)} over ${u.temperature(limit, 0)}: class ${spec.insulationClass} less ${u.temperatureDifference(allowance ?? 0, 0)} hot-spot allowance`,
                    place: 'temperature' as const,
                  },
                ]
              : [
                  {
                    label: 'Margin to the class',
                    value: u.temperatureDifference(spec.insulationClass - sheet.windingTemperature),
                    place: 'temperature' as const,
                  },
                ]),
            { label: 'Thermal time constant', value: n.seconds(sheet.thermalTimeConstant) },
          ]}
        />
        {sheet.corners && <CornersTable sheet={sheet} spec={spec} u={u} />}
        {duty && (
          <Group
            u={u}
            title={`Duty at the high corner (${supplyOf(spec, duty.supply)}, ${u.temperature(duty.ambient, 0)})`}
            warnings={w}
            testId="sheet-duty"
            rows={[
              {
                label: 'Basis',
                value: duty.basis === 'periodic' ? `${n.duration(duty.onTime ?? 0)} on in ${n.duration(duty.cycleTime ?? 0)}` : duty.basis === 'average' ? 'average power (no cycle time)' : 'continuous',
              },
              { label: 'Peak winding temperature', value: u.temperature(duty.peakTemperature), testId: 'sheet-duty-peak', note: `limit ${u.temperature(duty.limitTemperature, 0)} (class less hot-spot allowance)` },
              {
                label: 'Longest on-time from cold',
                value: duty.maxOnTimeFromCold === null ? 'unlimited' : n.duration(duty.maxOnTimeFromCold),
                testId: 'sheet-duty-ontime',
                note: duty.maxOnTimeFromCold === null ? 'never reaches the limit when left on' : 'energised from the highest ambient until the limit',
              },
            ]}
          />
        )}
        {off && (
          <Group
            u={u}
            title="Switch-off"
            warnings={w}
            cautions={cautionsAt('switchOff')}
            testId="sheet-switch-off"
            rows={[
              {
                label: 'Suppression',
                value: off.kind === 'none' ? 'none' : off.kind === 'diode' ? 'diode' : off.kind === 'diode-zener' ? 'diode and Zener' : 'TVS',
                note: off.assumed ? 'assumed: the sheet names none — state the customer’s' : undefined,
                place: 'switchOff',
              },
              { label: 'Current broken (high supply, cold)', value: n.amps(off.current) },
              { label: 'Stored energy ½LI²', value: n.joules(off.storedEnergy), testId: 'sheet-stored-energy' },
              { label: 'Clamp voltage', value: off.clampVoltage === null ? '—' : n.volts(off.clampVoltage) },
              {
                label: 'Peak across the switch',
                value: off.peakVoltage === null ? 'unlimited (arcs)' : n.volts(off.peakVoltage),
                testId: 'sheet-peak-voltage',
              },
              { label: 'Release time (to 10 %)', value: off.decayTime === null ? '—' : n.seconds(off.decayTime), note: `L/R cold ${n.seconds(off.timeConstant)}` },
            ]}
          />
        )}
        <Group
          u={u}
          title="Magnetic"
          warnings={w}
          cautions={cautionsAt('magnetic')}
          rows={[
            { label: 'Field at the centre (air core)', value: n.millitesla(sheet.centreField), testId: 'sheet-field' },
            ...(hasCircuit
              ? [
                  { label: 'Flux density in the gap', value: sheet.gapFluxDensity !== undefined ? n.tesla(sheet.gapFluxDensity) : '—', place: 'magnetic' as const },
                  ...(sheet.ironOperatingPoint
                    ? [
                        {
                          label: `Iron (${sheet.ironOperatingPoint.model === 'curve' ? 'on its B–H curve' : 'linear µr'})`,
                          value: `${n.ampsPerMetre(sheet.ironOperatingPoint.fieldStrength)} · ${n.tesla(sheet.ironOperatingPoint.fluxDensity)}`,
                        },
                      ]
                    : []),
                  {
                    label: 'Pull at the design gap',
                    value: sheet.pullForce !== undefined ? n.newtons(sheet.pullForce) : '—',
                    testId: 'sheet-pull',
                    note: cautions.length ? undefined : PULL_CAUTION,
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
