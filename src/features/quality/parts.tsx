/** Pieces the test screens share: a reading's value in its unit, the server's verdict reading by reading, the safety cautions, unit states. */
import type { Reading, TestRecord, WorkOrderTests } from '../../contracts/test-records';
import type { ReactNode } from 'react';
import { StatusBadge, type StatusKind } from '../../components/Status';
import { formatNumber, type UnitFormatters } from '../../lib/units';
import { henries, megohms, milliamps, newtons, ohms, READING_LABELS, seconds, signedOhms, signedPercent, volts } from './format';

/** The value a reading was judged on, in its unit (temperatures in the user's unit). */
export function readingValue(r: Pick<Reading, 'name' | 'value'>, u: UnitFormatters): string {
  switch (r.name) {
    case 'resistance':
      return ohms(r.value);
    case 'hipot':
      return `leakage ${milliamps(r.value)}`;
    case 'insulation_resistance':
      return megohms(r.value);
    case 'inductance':
      return henries(r.value);
    case 'turns':
      return `${formatNumber(r.value, 0)} turns`;
    case 'pull':
      return newtons(r.value);
    case 'heat_run':
      return u.temperature(r.value);
  }
}

/** What the server derived beside the value, in words. */
function derivedText(r: Reading, u: UnitFormatters): string | null {
  const d = r.derived ?? {};
  switch (r.name) {
    case 'resistance':
      return `read ${ohms(d.measured ?? NaN)} at ${u.temperature(d.measuredAt)}; deviation ${signedPercent(d.deviationPercent ?? 0)} (${signedOhms(d.deviationOhms ?? 0)})`;
    case 'hipot':
      return `applied ${volts(d.appliedVoltage ?? NaN)} for ${seconds(d.seconds ?? NaN)}; required ${volts(d.requiredVoltage ?? NaN)}`;
    case 'insulation_resistance':
      return `at ${volts(d.voltage ?? NaN)} DC`;
    case 'inductance':
      return `computed ${henries(d.computed ?? NaN)}, ${signedPercent(d.deviationPercent ?? 0, 1)}`;
    case 'turns':
      return `design ${formatNumber(d.design ?? 0, 0)}, difference ${d.difference && d.difference > 0 ? '+' : ''}${formatNumber(d.difference ?? 0, 0)}`;
    case 'pull':
      return `computed ${newtons(d.computed ?? NaN)}`;
    case 'heat_run':
      return `rise by resistance ${u.temperatureDifference(d.rise)} (predicted ${u.temperatureDifference(d.predictedRise)})${d.heatTransferEffective ? `; h_eff ${formatNumber(d.heatTransferEffective, 1)} W/(m²·K)` : ''}`;
  }
}

export const Verdict = ({ passed }: { passed: boolean }) => <StatusBadge kind={passed ? 'good' : 'fault'}>{passed ? 'Pass' : 'Fail'}</StatusBadge>;

/** The server's verdict on one unit: every reading with its value, limit, result and reason. */
export function VerdictTable({ record, u }: { record: TestRecord; u: UnitFormatters }) {
  return (
    <div className="overflow-x-auto">
      <table className="w-full text-left" data-testid="verdict-readings">
        <thead className="border-b border-graphite-300 text-sm text-graphite-600">
          <tr>
            <th className="py-2 pr-3">Reading</th>
            <th className="py-2 pr-3">Value</th>
            <th className="py-2 pr-3">Limit</th>
            <th className="py-2">Result</th>
          </tr>
        </thead>
        <tbody>
          {record.readings.map((r) => (
            <tr key={r.name} className="border-b border-graphite-100 align-top" data-reading={r.name} data-passed={r.passed}>
              <td className="py-2 pr-3 font-semibold">{READING_LABELS[r.name]}</td>
              <td className="py-2 pr-3 tabular-nums">
                <span className="text-lg font-bold">{readingValue(r, u)}</span>
                <span className="block text-sm text-graphite-600">{derivedText(r, u)}</span>
              </td>
              <td className="py-2 pr-3 text-sm">{r.limit.text}</td>
              <td className="py-2">
                <Verdict passed={r.passed} />
                {r.reason && <p className="mt-1 text-sm font-medium text-fault">{r.reason}</p>}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

type Tone = 'fault' | 'caution';
function Caution({ tone, title, testId, children, icon }: { tone: Tone; title: string; testId: string; children: ReactNode; icon: ReactNode }) {
  const box = tone === 'fault' ? 'border-fault bg-fault-soft' : 'border-caution bg-caution-soft';
  return (
    <div role="note" data-testid={testId} className={`flex gap-3 rounded-md border-2 px-4 py-3 text-graphite-950 ${box}`}>
      {icon}
      <div>
        <p className="text-lg font-bold">{title}</p>
        <div>{children}</div>
      </div>
    </div>
  );
}

/** Hi-pot: lethal voltage. Shown wherever hi-pot readings are entered. */
export function HipotWarning() {
  return (
    <Caution
      tone="fault"
      testId="bench-hipot-caution"
      title="Hi-pot: lethal voltage"
      icon={
        <svg viewBox="0 0 24 24" className="mt-0.5 size-9 shrink-0 text-fault" aria-hidden>
          <path d="M12 2 23 21H1z" fill="currentColor" />
          <path d="M13 7l-3 6h3l-2 5" fill="none" stroke="white" strokeWidth="2" strokeLinejoin="round" strokeLinecap="round" />
        </svg>
      }
    >
      Only trained, authorised staff run a hi-pot test, only with the unit in the interlocked fixture and hands clear before the voltage comes on. Discharge the winding before
      touching it. Your shop's procedure, the tester's manual and local electrical safety codes come first.
    </Caution>
  );
}

/** Heat run: hot surfaces and insulation at temperature. */
export function HotSurfaceWarning() {
  return (
    <Caution
      tone="caution"
      testId="bench-hot-caution"
      title="Heat run: hot surfaces"
      icon={
        <svg viewBox="0 0 24 24" className="mt-0.5 size-9 shrink-0 text-caution" aria-hidden>
          <path d="M12 2 23 21H1z" fill="currentColor" />
          <path d="M9 17c-1-2 1-3 0-5M12 17c-1-2 1-3 0-5M15 17c-1-2 1-3 0-5" fill="none" stroke="white" strokeWidth="1.6" strokeLinecap="round" />
        </svg>
      }
    >
      A coil after a heat run can burn skin and an overheated winding is a fire risk. Use gloves or let it cool, keep it away from anything that burns, and stop the run if
      the winding nears its insulation class. Follow your shop's procedure and local codes.
    </Caution>
  );
}

export const UNIT_STATE_WORDS: Record<WorkOrderTests['units'][number]['state'], { text: string; kind: StatusKind }> = {
  passed: { text: 'Passed', kind: 'good' },
  failed_open: { text: 'Failed, awaiting disposition', kind: 'fault' },
  rework: { text: 'Rework, awaiting retest', kind: 'caution' },
  awaiting_approval: { text: 'Use as is, awaiting engineer', kind: 'caution' },
  use_as_is: { text: 'Used as is (approved)', kind: 'idle' },
  scrapped: { text: 'Scrapped', kind: 'idle' },
};

export function UnitState({ state }: { state: WorkOrderTests['units'][number]['state'] }) {
  const w = UNIT_STATE_WORDS[state];
  return <StatusBadge kind={w.kind}>{w.text}</StatusBadge>;
}

