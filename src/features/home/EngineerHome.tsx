import type { SessionUser } from '../../contracts/auth';
import { Panel } from '../../components/Panel';
import { useUnits } from '../../lib/session';
import { EngineeringHomePanel } from '../engineering';
import { formatNumber, fromKelvinDifference, temperatureDifferenceSymbol } from '../../lib/units';
import { AccountPanel, DutiesPanel, HomeFrame } from './parts';

/** IEC 60085 thermal classes (°C) with their letter designations (letters from memory). */
const THERMAL_CLASSES: { celsius: number; letter: string }[] = [
  { celsius: 105, letter: 'A' },
  { celsius: 120, letter: 'E' },
  { celsius: 130, letter: 'B' },
  { celsius: 155, letter: 'F' },
  { celsius: 180, letter: 'H' },
  { celsius: 200, letter: 'N' },
  { celsius: 220, letter: 'R' },
];

/** Annealed copper per IEC 60028: resistivity 1/58 Ω·mm²/m and α = 0.00393 /K, both at 20 °C. */
const COPPER_ALPHA_PER_K = 0.00393;
const COPPER_RESISTIVITY = 1 / 58; // Ω·mm²/m

function ReferencePanel() {
  const u = useUnits();
  // α is "per degree of difference": per K, or per °F (a 1 °F step is 5/9 K).
  const alpha = COPPER_ALPHA_PER_K / fromKelvinDifference(1, u.prefs.temperatureUnit);
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
              </tr>
            </thead>
            <tbody>
              {THERMAL_CLASSES.map((c) => (
                <tr key={c.celsius} className="border-b border-graphite-100">
                  <td className="py-1 font-semibold">{c.celsius}</td>
                  <td className="py-1">{c.letter}</td>
                  <td className="py-1 text-right">{u.temperature(c.celsius, 0)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
        <div>
          <h3 className="mb-1 text-sm font-bold tracking-wide text-graphite-500 uppercase">Annealed copper (IEC 60028)</h3>
          <dl className="grid grid-cols-[max-content_1fr] gap-x-4 gap-y-1.5 text-sm">
            <dt className="text-graphite-600">Resistivity at {u.temperature(20, 0)}</dt>
            <dd className="font-semibold">{formatNumber(COPPER_RESISTIVITY, 6)}&nbsp;Ω·mm²/m</dd>
            <dt className="text-graphite-600">Temperature coefficient α</dt>
            <dd className="font-semibold">
              {formatNumber(alpha, 5)}&nbsp;/{temperatureDifferenceSymbol(u.prefs.temperatureUnit)}
            </dd>
            <dt className="text-graphite-600">Density</dt>
            <dd className="font-semibold">8.89&nbsp;g/cm³</dd>
            <dt className="text-graphite-600">Copper temperature constant</dt>
            <dd className="font-semibold">234.5 (IEC 60034-1)</dd>
          </dl>
          <p className="mt-3 text-sm text-graphite-600">
            Hot resistance by the resistance method: R<sub>2</sub> = R<sub>1</sub> · (234.5 + θ<sub>2</sub>) / (234.5 + θ<sub>1</sub>), θ in °C.
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
