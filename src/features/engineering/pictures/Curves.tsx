/** The build sheet's curves, from POST /api/coil/profile, in the user's units. */
import type { CoilProfileResponse } from '../../../contracts/coil';
import { Alert } from '../../../components/Alert';
import { formatNumber, fromCelsius, fromMetres, type UnitFormatters } from '../../../lib/units';
import { PULL_CAUTION } from '../warnings';
import { Plot } from './plot';

/** Field along the axis: B in mT against z, the winding's ends marked. */
export function FieldPlot({ field, windingLength, u }: { field: CoilProfileResponse['field']; windingLength: number; u: UnitFormatters }) {
  const L = u.prefs.lengthUnit;
  const points = field.map((p) => ({ x: fromMetres(p.z, L), y: p.B * 1000 }));
  const end = fromMetres(windingLength / 2, L);
  const peak = Math.max(...points.map((p) => p.y));
  return (
    <Plot
      testId="picture-field"
      title="Field along the axis (air core, at operating temperature)"
      xLabel={`Position from the winding’s centre, ${u.lengthSymbol}`}
      yLabel="Flux density B, mT"
      series={[{ id: 'B', points, label: 'B on the axis' }]}
      xMarks={[
        { at: -end, label: 'winding end' },
        { at: end, label: 'winding end' },
      ]}
      yInclude={[0]}
      summary={`Field along the axis: ${formatNumber(peak, 2)} mT at the centre, falling off beyond the winding ends at ±${u.length(windingLength / 2)}.`}
    />
  );
}

/** Pull against gap across the working range, the design gap marked; saturated points shown. */
export function PullPlot({ pull, designGap, u }: { pull: NonNullable<CoilProfileResponse['pull']>; designGap: number; u: UnitFormatters }) {
  const L = u.prefs.lengthUnit;
  const points = pull.points.map((p) => ({ x: fromMetres(p.gap, L), y: p.force }));
  // At zero gap the pull of an ideal circuit can be very large: start the curve where it reads.
  const saturated = pull.points.filter((p) => p.saturated).map((p) => ({ x: fromMetres(p.gap, L), y: p.force }));
  return (
    <Plot
      testId="picture-pull"
      title="Pull against gap (computed, at operating temperature)"
      xLabel={`Air gap, ${u.lengthSymbol}`}
      yLabel="Pull, N"
      series={[{ id: 'F', points, label: 'Pull' }]}
      xMarks={[{ at: fromMetres(designGap, L), label: `design gap ${u.length(designGap)}` }]}
      yInclude={[0]}
      dots={saturated.length ? { points: saturated, label: 'iron saturated at this gap' } : undefined}
      summary={`Pull against gap from ${u.length(pull.points[0]?.gap ?? 0)} to ${u.length(pull.points[pull.points.length - 1]?.gap ?? 0)}, design gap ${u.length(designGap)}.`}
      footer={
        <div className="mt-1">
          <Alert kind="caution" title="Not a lifting rating">
            <p>{pull.caution || PULL_CAUTION}</p>
          </Alert>
        </div>
      }
    />
  );
}

/** Winding temperature from switch-on to steady state, with the insulation class's limit. */
export function WarmUpPlot({
  warmUp,
  insulationClass,
  steady,
  u,
}: {
  warmUp: CoilProfileResponse['warmUp'];
  insulationClass: number;
  steady: number;
  u: UnitFormatters;
}) {
  const T = u.prefs.temperatureUnit;
  const tMax = warmUp.length ? warmUp[warmUp.length - 1].t : 0;
  const [scale, unit] = tMax > 3 * 3600 ? [3600, 'h'] : tMax > 600 ? [60, 'min'] : [1, 's'];
  const points = warmUp.map((p) => ({ x: p.t / scale, y: fromCelsius(p.T, T) }));
  const over = steady > insulationClass;
  return (
    <Plot
      testId="picture-warmup"
      title="Warm-up to steady temperature"
      xLabel={`Time after switch-on, ${unit}`}
      yLabel={`Winding temperature, ${u.temperatureSymbol}`}
      series={[{ id: 'T', points, label: 'Winding (hot spot)' }]}
      yMarks={[
        { at: fromCelsius(insulationClass, T), label: `class ${insulationClass} limit ${u.temperature(insulationClass, 0)}`, tone: 'limit' },
        { at: fromCelsius(steady, T), label: `steady ${u.temperature(steady)}`, tone: over ? 'limit' : 'note' },
      ]}
      xInclude={[0]}
      summary={`Warm-up from ${u.temperature(warmUp[0]?.T)} to a steady ${u.temperature(steady)} against the class limit of ${u.temperature(insulationClass, 0)}.`}
    />
  );
}

/** The iron's B–H curve (or the linear model and its cap) with the corners' operating points. */
export function BHPlot({ bh, u: _u }: { bh: NonNullable<CoilProfileResponse['bh']>; u: UnitFormatters }) {
  const hMax = Math.max(...bh.curve.map((p) => p.H));
  const kilo = hMax >= 5000;
  const x = (H: number) => (kilo ? H / 1000 : H);
  const nominal = bh.points.find((p) => p.corner === 'nominal');
  const names: Record<string, string> = { low: 'low', nominal: 'nominal', high: 'high' };
  return (
    <Plot
      testId="picture-bh"
      title={`Iron: ${bh.model === 'curve' ? 'B–H curve' : 'linear µr, capped at saturation'} and the operating points`}
      xLabel={`Field strength in the iron H, ${kilo ? 'kA/m' : 'A/m'}`}
      yLabel="Flux density B, T"
      series={[{ id: 'bh', points: bh.curve.map((p) => ({ x: x(p.H), y: p.B })), label: bh.model === 'curve' ? 'B–H curve' : 'linear model' }]}
      yMarks={[{ at: bh.knee, label: `${bh.model === 'curve' ? 'knee' : 'saturation'} ${formatNumber(bh.knee, 2)} T`, tone: 'limit' }]}
      markers={bh.points.map((p) => ({ x: x(p.H), y: p.B, label: names[p.corner] }))}
      xInclude={[0]}
      yInclude={[0]}
      summary={`B–H picture: the nominal point at ${formatNumber(nominal?.B ?? 0, 3)} T and ${formatNumber(x(nominal?.H ?? 0), kilo ? 2 : 0)} ${kilo ? 'kA/m' : 'A/m'}, the ${bh.model === 'curve' ? 'knee' : 'saturation'} at ${formatNumber(bh.knee, 2)} T.`}
      footer={<p className="text-xs text-graphite-500">Operating points at the low, nominal and high corners (hot). Past the knee more ampere-turns add little flux, only heat.</p>}
    />
  );
}
