import { useQuery } from '@tanstack/react-query';
import type { SessionUser } from '../../contracts/auth';
import { coilReferenceResponse } from '../../contracts/coil';
import { Alert } from '../../components/Alert';
import { api, errorMessage } from '../../lib/api';
import { Panel } from '../../components/Panel';
import { useUnits } from '../../lib/session';
import { EngineeringHomePanel } from '../engineering';
import { formatNumber, fromKelvinDifference, temperatureDifferenceSymbol } from '../../lib/units';
import { AccountPanel, DutiesPanel, HomeFrame } from './parts';

/** IEC 60085 letter designations of the thermal classes (letters from memory). */
const CLASS_LETTERS: Record<number, string> = { 105: 'A', 120: 'E', 130: 'B', 155: 'F', 180: 'H', 200: 'N', 220: 'R' };

const referenceQuery = {
  queryKey: ['coil', 'reference'],
  queryFn: ({ signal }: { signal: AbortSignal }) => api.get('/coil/reference', { schema: coilReferenceResponse, signal }),
  staleTime: Infinity,
};

/** The engine's own constants (served from server/coil), in the user's units. */
function ReferencePanel() {
  const u = useUnits();
  const ref = useQuery(referenceQuery);
  if (!ref.data) return ref.error ? <Alert title="Cannot load the reference">{errorMessage(ref.error)}</Alert> : null;
  const cu = ref.data.conductors.copper;
  // α is "per degree of difference": per K, or per °F (a 1 °F step is 5/9 K).
  const alpha = cu.alpha20 / fromKelvinDifference(1, u.prefs.temperatureUnit);
  const k = cu.resistanceMethodK;
  return (
    <Panel title="Shop reference">
      <div className="grid gap-5 md:grid-cols-2">
        <div>
          <h3 className="mb-1 text-sm font-bold tracking-wide text-graphite-500 uppercase">Thermal classes (IEC 60085)</h3>
          <table className="w-full text-sm">
            <thead>
              <tr className="border-b border-graphite-200 text-left text-graphite-600">
                <th className="py-1 font-semibold">Class</th>
                <th className="py-1 font-semibold">Letter</th>
                <th className="py-1 text-right font-semibold">Limit</th>
                <th className="py-1 text-right font-semibold">Hot-spot allowance</th>
              </tr>
            </thead>
            <tbody>
              {ref.data.thermalClasses.map((c) => (
                <tr key={c} className="border-b border-graphite-100">
                  <td className="py-1 font-semibold">{c}</td>
                  <td className="py-1">{CLASS_LETTERS[c] ?? '—'}</td>
                  <td className="py-1 text-right">{u.temperature(c, 0)}</td>
                  <td className="py-1 text-right">{u.temperatureDifference(ref.data.hotSpot.allowances[String(c)] ?? 0, 0)}</td>
                </tr>
              ))}
            </tbody>
          </table>
          <p className="mt-2 text-xs text-graphite-500">Hot-spot allowance: {ref.data.hotSpot.source}.</p>
        </div>
        <div>
          <h3 className="mb-1 text-sm font-bold tracking-wide text-graphite-500 uppercase">Annealed copper (IEC 60028)</h3>
          <dl className="grid grid-cols-[max-content_1fr] gap-x-4 gap-y-1.5 text-sm">
            <dt className="text-graphite-600">Resistivity at {u.temperature(20, 0)}</dt>
            <dd className="font-semibold">{formatNumber(cu.resistivity20 * 1e6, 6)}&nbsp;Ω·mm²/m</dd>
            <dt className="text-graphite-600">Temperature coefficient α</dt>
            <dd className="font-semibold">
              {formatNumber(alpha, 5)}&nbsp;/{temperatureDifferenceSymbol(u.prefs.temperatureUnit)}
            </dd>
            <dt className="text-graphite-600">Density</dt>
            <dd className="font-semibold">{formatNumber(cu.density / 1000, 2)}&nbsp;g/cm³</dd>
            <dt className="text-graphite-600">Copper temperature constant</dt>
            <dd className="font-semibold">{formatNumber(k, 1)} (IEEE Std 118; IEC 60034-1 rounds to 235)</dd>
          </dl>
          <p className="mt-3 text-sm text-graphite-600">
            Hot resistance by the resistance method: R<sub>2</sub> = R<sub>1</sub> · ({formatNumber(k, 1)} + θ<sub>2</sub>) / ({formatNumber(k, 1)} + θ<sub>1</sub>), θ in °C — the same line as α, so the
            design and the bench agree. Aluminium (61&nbsp;% IACS): {formatNumber(ref.data.conductors.aluminium.resistanceMethodK, 1)}.
          </p>
        </div>
      </div>
    </Panel>
  );
}

export function EngineerHome({ user }: { user: SessionUser }) {
  return (
    <HomeFrame user={user}>
      <EngineeringHomePanel />
      <ReferencePanel />
      <div className="grid gap-5 lg:grid-cols-2">
        <DutiesPanel user={user} />
        <AccountPanel user={user} />
      </div>
    </HomeFrame>
  );
}
