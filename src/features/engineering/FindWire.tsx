/** *Find wire*: the engine's solver against the line's target — ranked sizes, and why the others fail. */
import type { CoilTarget } from '../../contracts/coil';
import { Alert } from '../../components/Alert';
import { Button } from '../../components/Button';
import { errorMessage } from '../../lib/api';
import { formatNumber, type UnitFormatters } from '../../lib/units';
import type { SolveResponse } from './api';
import * as n from './numbers';
import { wireSizeLabel, type WireSizeValue } from './specModel';

export function describeTarget(t: CoilTarget): string {
  const parts: string[] = [];
  if (t.ampereTurns !== undefined) parts.push(`at least ${n.ampereTurns(t.ampereTurns)} at the low corner`);
  if (t.pullForce !== undefined) parts.push(`at least ${n.newtons(t.pullForce)} pull at the design gap`);
  if (t.gapFluxDensity !== undefined) parts.push(`at least ${n.tesla(t.gapFluxDensity)} in the gap`);
  return parts.join(', ');
}

export function FindWireResults({
  result,
  error,
  onAdopt,
  u,
  disabled,
}: {
  result: SolveResponse | undefined;
  error: unknown;
  onAdopt: (size: WireSizeValue) => void;
  u: UnitFormatters;
  disabled?: boolean;
}) {
  if (error) return <Alert kind="fault" title="Find wire did not run">{errorMessage(error)}</Alert>;
  if (!result) return null;
  return (
    <div className="flex flex-col gap-3" data-testid="find-wire">
      {result.candidates.length === 0 ? (
        <Alert kind="caution" title="No standard size meets the target on this bobbin">
          Change the bobbin, the drive, the duty or the class — the reasons below say what stands in the way.
        </Alert>
      ) : (
        <div className="overflow-x-auto">
          <table className="w-full text-sm">
            <caption className="mb-1 text-left text-sm text-graphite-600">Sizes that meet the target at the low corner and stay within their class at the high corner, least power first.</caption>
            <thead>
              <tr className="border-b border-graphite-200 text-left text-graphite-600">
                <th className="py-1 pr-2 font-semibold">Rank</th>
                <th className="py-1 pr-2 font-semibold">Wire</th>
                <th className="py-1 pr-2 text-right font-semibold">Turns</th>
                <th className="py-1 pr-2 text-right font-semibold">{result.candidates[0]?.corners?.low.pullForce !== undefined ? 'Pull low' : 'A·turns low'}</th>
                <th className="py-1 pr-2 text-right font-semibold">P hot</th>
                <th className="py-1 pr-2 text-right font-semibold">Winding high</th>
                <th className="py-1 pr-2 text-right font-semibold">Wire</th>
                <th className="py-1" />
              </tr>
            </thead>
            <tbody>
              {result.candidates.map((c, i) => (
                <tr key={wireSizeLabel(c.wire.size)} className={`border-b border-graphite-100 ${i === 0 ? 'bg-copper-50' : ''}`} data-candidate={wireSizeLabel(c.wire.size)}>
                  <td className="py-1 pr-2 font-semibold">{i === 0 ? '1 · best' : i + 1}</td>
                  <td className="py-1 pr-2 font-semibold whitespace-nowrap">{wireSizeLabel(c.wire.size)}</td>
                  <td className="tabular py-1 pr-2 text-right">{formatNumber(c.turns, 0)}</td>
                  <td className="tabular py-1 pr-2 text-right whitespace-nowrap">
                    {c.corners?.low.pullForce !== undefined ? n.newtons(c.corners.low.pullForce) : formatNumber(Math.round(c.corners?.low.ampereTurns ?? c.ampereTurnsHot), 0)}
                  </td>
                  <td className="tabular py-1 pr-2 text-right whitespace-nowrap">{n.watts(c.powerHot)}</td>
                  <td className="tabular py-1 pr-2 text-right whitespace-nowrap">{u.temperature(c.corners?.high.windingTemperature ?? c.windingTemperature, 0)}</td>
                  <td className="tabular py-1 pr-2 text-right whitespace-nowrap">{n.kilograms(c.wireMass)}</td>
                  <td className="py-1 text-right">
                    <Button size="sm" variant={i === 0 ? 'primary' : 'secondary'} onClick={() => onAdopt(c.wire.size)} disabled={disabled} aria-label={`Adopt ${wireSizeLabel(c.wire.size)}`}>
                      Adopt
                    </Button>
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
      {result.rejected.length > 0 && (
        <details className="rounded border border-graphite-200" open={result.candidates.length === 0}>
          <summary className="cursor-pointer px-3 py-1.5 text-sm font-semibold text-graphite-800">
            {result.rejected.length} {result.rejected.length === 1 ? 'size' : 'sizes'} rejected — why
          </summary>
          <ul className="max-h-72 divide-y divide-graphite-100 overflow-y-auto px-3 py-1 text-sm" data-testid="rejected">
            {result.rejected.map((r) => (
              <li key={wireSizeLabel(r.wire.size)} className="flex gap-3 py-1">
                <span className="w-20 shrink-0 font-semibold">{wireSizeLabel(r.wire.size)}</span>
                <span className="flex flex-col text-graphite-700">
                  {r.reasons.map((x) => (
                    <span key={x}>{x}</span>
                  ))}
                </span>
              </li>
            ))}
          </ul>
        </details>
      )}
    </div>
  );
}
