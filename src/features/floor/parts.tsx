/** Small pieces the floor screens share: late / at-risk flags, age in stage, the build sheet's essentials, messages. */
import type { ReactNode } from 'react';
import type { BuildSheetEssentials } from '../../contracts/build-sheet-status';
import { STAGE_LABELS, type Stage } from '../../contracts/stages';
import { PRIORITY_LABELS, type Priority, type WorkOrderDetail, type WorkOrderSummary } from '../../contracts/work-orders';
import { Alert } from '../../components/Alert';
import { StatusShape } from '../../components/Status';
import { isApiError, errorMessage } from '../../lib/api';
import { formatDay } from '../../lib/format';
import { formatNumber, type UnitFormatters } from '../../lib/units';

/** "3 d 4 h", "5 h", "12 min": how long since an instant. */
export function ageSince(iso: string, now = Date.now()): string {
  const ms = Math.max(0, now - new Date(iso).getTime());
  const minutes = Math.floor(ms / 60_000);
  if (minutes < 60) return `${minutes} min`;
  const hours = Math.floor(minutes / 60);
  if (hours < 24) return `${hours} h`;
  const days = Math.floor(hours / 24);
  const rest = hours % 24;
  return rest ? `${days} d ${rest} h` : `${days} d`;
}

export const hours = (h: number) => `${formatNumber(h, h >= 10 ? 0 : 1)}\u00a0h`;

export const priorityLabel = (p: number) => PRIORITY_LABELS[p as Priority] ?? `Priority ${p}`;

/** A clock with a slash: "late". */
function LateIcon() {
  return (
    <svg viewBox="0 0 16 16" className="size-4 shrink-0" aria-hidden focusable="false">
      <circle cx="8" cy="8" r="6.2" fill="none" stroke="currentColor" strokeWidth="1.8" />
      <path d="M8 4.5V8l2.4 1.6" fill="none" stroke="currentColor" strokeWidth="1.8" strokeLinecap="round" />
      <path d="M2 14 14 2" stroke="currentColor" strokeWidth="1.8" strokeLinecap="round" />
    </svg>
  );
}

/** An hourglass: "at risk". */
function RiskIcon() {
  return (
    <svg viewBox="0 0 16 16" className="size-4 shrink-0" aria-hidden focusable="false">
      <path d="M4 1.5h8M4 14.5h8M5 1.5c0 4 6 4.5 6 6.5s-6 2.5-6 6.5M11 1.5c0 4-6 4.5-6 6.5s6 2.5 6 6.5" fill="none" stroke="currentColor" strokeWidth="1.6" strokeLinecap="round" />
    </svg>
  );
}

/** Two bars: "on hold". */
export function HoldIcon({ className = 'size-4' }: { className?: string }) {
  return (
    <svg viewBox="0 0 16 16" className={`shrink-0 ${className}`} aria-hidden focusable="false">
      <rect x="3" y="2.5" width="3.5" height="11" rx="0.8" fill="currentColor" />
      <rect x="9.5" y="2.5" width="3.5" height="11" rx="0.8" fill="currentColor" />
    </svg>
  );
}

/** The late / at-risk words with their own shapes (never colour alone). */
export function DueFlags({ wo, large }: { wo: Pick<WorkOrderSummary, 'late' | 'atRisk' | 'dueDate'>; large?: boolean }) {
  const size = large ? 'text-base px-2.5 py-1' : 'text-sm px-1.5 py-0.5';
  if (wo.late) {
    return (
      <span data-flag="late" className={`inline-flex items-center gap-1 rounded-sm bg-fault font-bold tracking-wide text-white uppercase ${size}`}>
        <LateIcon />
        Late
      </span>
    );
  }
  if (wo.atRisk) {
    return (
      <span data-flag="at-risk" className={`inline-flex items-center gap-1 rounded-sm border-2 border-dashed border-caution bg-caution-soft font-bold text-caution ${size}`}>
        <RiskIcon />
        At risk
      </span>
    );
  }
  return null;
}

/** A stage name with a small mark: hollow ring for flow stages, bars for on hold, a loop arrow for rework. */
export function StageTag({ stage, large }: { stage: Stage; large?: boolean }) {
  const tone =
    stage === 'on_hold'
      ? 'border-caution/50 bg-caution-soft text-caution'
      : stage === 'rework'
        ? 'border-fault/40 bg-fault-soft text-fault'
        : 'border-graphite-300 bg-graphite-50 text-graphite-800';
  return (
    <span data-stage={stage} className={`inline-flex items-center gap-1.5 rounded border font-semibold ${tone} ${large ? 'px-3 py-1 text-lg' : 'px-2 py-0.5 text-sm'}`}>
      {stage === 'on_hold' ? <HoldIcon /> : <StatusShape kind={stage === 'rework' ? 'fault' : 'idle'} />}
      {STAGE_LABELS[stage]}
    </span>
  );
}

export function wireLabel(s: BuildSheetEssentials, u: UnitFormatters): string {
  const size = s.wire.standard === 'AWG' ? `AWG ${s.wire.gauge}` : `${u.length(s.wire.diameter, u.prefs.lengthUnit === 'mm' ? 2 : 4)} metric`;
  return `${size} ${s.conductor}, grade ${s.insulationGrade}`;
}

/** Winding width the turns of one layer take: turns per layer × the insulated wire's diameter (ideal close winding). */
export const traverseWidth = (s: BuildSheetEssentials) => s.turnsPerLayer * s.overallDiameter;

export function ohms(v: number): string {
  const digits = v >= 100 ? 1 : v >= 10 ? 2 : 3;
  return `${formatNumber(v, digits)}\u00a0Ω`;
}

/** The build sheet's essentials for the bench, in big type. */
export function BuildEssentials({ sheet, u, size = 'big' }: { sheet: BuildSheetEssentials; u: UnitFormatters; size?: 'big' | 'normal' }) {
  const big = size === 'big';
  const items: { label: string; value: ReactNode; hint?: string }[] = [
    { label: 'Turns', value: formatNumber(sheet.turns, 0), hint: `${sheet.layers} layers × ${sheet.turnsPerLayer} per layer, ${sheet.pattern} winding` },
    { label: 'Wire', value: wireLabel(sheet, u), hint: `bare ${u.length(sheet.bareDiameter, 3)}, overall ${u.length(sheet.overallDiameter, 3)}` },
    {
      label: 'R at 20 °C',
      value: (
        <>
          {ohms(sheet.resistance20)} <span className="whitespace-nowrap">±{formatNumber(sheet.tolerancePercent, 1)}&nbsp;%</span>
        </>
      ),
      hint: `accept ${ohms(sheet.resistance20Min)} … ${ohms(sheet.resistance20Max)}`,
    },
    { label: 'Traverse', value: u.length(traverseWidth(sheet), 1), hint: `${sheet.turnsPerLayer} turns per layer × wire overall diameter` },
  ];
  return (
    <dl className={`grid gap-3 ${big ? 'sm:grid-cols-2' : 'sm:grid-cols-4'}`} data-testid="build-essentials">
      {items.map((it) => (
        <div key={it.label} className="rounded-md border border-graphite-200 bg-graphite-50 px-3 py-2">
          <dt className="text-sm font-semibold tracking-wide text-graphite-600 uppercase">{it.label}</dt>
          <dd className={`font-bold text-graphite-950 tabular-nums ${big ? 'text-3xl leading-tight' : 'text-xl'}`}>{it.value}</dd>
          {it.hint && <dd className="text-sm text-graphite-600">{it.hint}</dd>}
        </div>
      ))}
    </dl>
  );
}

/** The safety note shown whenever a job is in (or enters) testing. */
export function HipotCaution() {
  return (
    <div role="alert" data-testid="hipot-caution" className="flex gap-3 rounded-md border-2 border-fault bg-fault-soft px-4 py-3 text-graphite-950">
      <svg viewBox="0 0 24 24" className="mt-0.5 size-8 shrink-0 text-fault" aria-hidden>
        <path d="M12 2 23 21H1z" fill="currentColor" />
        <path d="M13 7l-3 6h3l-2 5" fill="none" stroke="white" strokeWidth="2" strokeLinejoin="round" strokeLinecap="round" />
      </svg>
      <div>
        <p className="text-lg font-bold">Hi-pot test ahead: lethal voltage</p>
        <p>Only trained staff run it, only in the interlocked fixture, hands clear before the voltage is on. Follow your shop's procedure and local electrical safety codes.</p>
      </div>
    </div>
  );
}

/** A failed write in words; a 409 shows the work order as it is now. */
export function WriteError({ error, what = 'The change was not saved' }: { error: unknown; what?: string }) {
  if (!error) return null;
  if (isApiError(error) && error.status === 409) {
    const cur = error.current;
    const list = Array.isArray(cur) ? (cur as WorkOrderSummary[]) : cur ? [cur as WorkOrderDetail] : [];
    return (
      <div data-testid="conflict">
        <Alert kind="caution" title="Someone else changed this first — nothing was overwritten">
        <p>{error.message}. The board has been refreshed; check the work as it is now and try again.</p>
        {list.length > 0 && (
          <ul className="mt-1 list-disc pl-5">
            {list.map((w) => (
              <li key={w.id}>
                <strong>{w.number}</strong>: now {STAGE_LABELS[w.stage]}
                {w.assignee !== undefined && `, ${w.assignee ? w.assignee.name : 'nobody assigned'}`}
                {`, ${w.station ? w.station.name : 'no station'}`}, due {formatDay(w.dueDate)}
              </li>
            ))}
          </ul>
        )}
        </Alert>
      </div>
    );
  }
  const title = isApiError(error) && error.status === 422 ? 'Not allowed' : what;
  const fieldLines = isApiError(error) ? Object.values(error.fields) : [];
  return (
    <div data-testid="write-error">
      <Alert title={title}>
        <p>{errorMessage(error)}</p>
        {fieldLines.length > 0 && (
          <ul className="mt-1 list-disc pl-5">
            {fieldLines.map((f) => (
              <li key={f}>{f}</li>
            ))}
          </ul>
        )}
      </Alert>
    </div>
  );
}
