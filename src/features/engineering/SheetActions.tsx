/**
 * What the engineer does with a saved sheet: approve it (with a written override reason when its
 * warnings call for one), check the wire stock, release it to the floor, and see the work orders
 * a release made. The server decides; these controls say beforehand what it will ask for.
 */
import { useQuery } from '@tanstack/react-query';
import { useState } from 'react';
import {
  BUILD_SHEET_STATUS_LABELS,
  OVERRIDE_REASON_MIN,
  SHORT_STOCK_NOTE_MIN,
  type BuildSheetRecord,
  type BuildSheetStatus,
  type ReleaseResponse,
  type SheetChanges,
} from '../../contracts/build-sheets';
import { STAGE_LABELS } from '../../contracts/stages';
import { Alert } from '../../components/Alert';
import { Button } from '../../components/Button';
import { StatusBadge, type StatusKind } from '../../components/Status';
import { errorMessage, isApiError } from '../../lib/api';
import { formatDateTime, formatDay } from '../../lib/format';
import { useUnits } from '../../lib/session';
import { formatNumber, type UnitFormatters } from '../../lib/units';
import { stockCheckQuery, useApprove, useRelease } from './api';
import * as n from './numbers';
import { wireSizeLabel } from './specModel';

const STATUS_KIND: Record<BuildSheetStatus, StatusKind> = { draft: 'idle', approved: 'caution', released: 'good', superseded: 'idle' };

export function SheetStatusBadge({ status }: { status: BuildSheetStatus }) {
  return <StatusBadge kind={STATUS_KIND[status]}>{BUILD_SHEET_STATUS_LABELS[status]}</StatusBadge>;
}

const textarea =
  'block w-full rounded-md border bg-white px-3 py-2 text-[0.95rem] text-graphite-900 focus:border-copper-500 focus:outline-none focus:ring-2 focus:ring-copper-200';

/** A labelled text area with its message (the server's 422 goes here). */
function NoteField({ id, label, value, onChange, error, hint }: { id: string; label: string; value: string; onChange: (v: string) => void; error?: string; hint: string }) {
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="text-sm font-semibold text-graphite-800">
        {label}
      </label>
      <textarea
        id={id}
        rows={3}
        value={value}
        onChange={(e) => onChange(e.target.value)}
        aria-invalid={error ? true : undefined}
        aria-describedby={`${id}-msg`}
        className={`${textarea} ${error ? 'border-fault' : 'border-graphite-300'}`}
      />
      {error ? (
        <p id={`${id}-msg`} role="alert" className="flex items-start gap-1 text-sm font-medium text-fault" data-testid={`${id}-error`}>
          <span aria-hidden className="mt-[0.3rem] inline-block size-2 shrink-0 rotate-45 bg-fault" />
          {error}
        </p>
      ) : (
        <p id={`${id}-msg`} className="text-sm text-graphite-500">
          {hint}
        </p>
      )}
    </div>
  );
}

export function ApprovePanel({ sheet, lineId, onApproved }: { sheet: BuildSheetRecord; lineId: number; onApproved: (version: number) => void }) {
  const approve = useApprove(lineId);
  const [reason, setReason] = useState('');
  const needsReason = sheet.overrideNeededFor.length > 0;
  const err = approve.error;
  const reasonError = isApiError(err) ? err.fields.overrideReason : undefined;
  const otherError = err && !reasonError ? errorMessage(err) : undefined;

  if (sheet.blockedBy.length > 0) {
    return (
      <Alert kind="fault" title={`Version ${sheet.version} cannot be approved`}>
        It carries {sheet.blockedBy.join(', ')}. Change the choices and save a new version.
      </Alert>
    );
  }
  return (
    <form
      className="flex flex-col gap-3"
      onSubmit={(e) => {
        e.preventDefault();
        approve.mutate({ sheetId: sheet.id, overrideReason: reason.trim() || undefined }, { onSuccess: (r) => onApproved(r.version) });
      }}
      aria-label={`Approve version ${sheet.version}`}
    >
      {needsReason && (
        <>
          <Alert kind="caution" title={`Approving needs a written reason: ${sheet.overrideNeededFor.join(', ')}`}>
            Say why this sheet is acceptable as it stands (at least {OVERRIDE_REASON_MIN} characters). The reason stays on the sheet.
          </Alert>
          <NoteField
            id="override-reason"
            label="Override reason"
            value={reason}
            onChange={setReason}
            error={reasonError}
            hint={`At least ${OVERRIDE_REASON_MIN} characters; kept with the approval.`}
          />
        </>
      )}
      {otherError && <Alert kind="fault" title="Not approved">{otherError}</Alert>}
      <div>
        <Button type="submit" variant="primary" busy={approve.isPending} disabled={!sheet.can.approve}>
          Approve version {sheet.version}
        </Button>
      </div>
    </form>
  );
}

export function ReleasePanel({ sheet, lineId, onReleased }: { sheet: BuildSheetRecord; lineId: number; onReleased: (r: ReleaseResponse) => void }) {
  const check = useQuery(stockCheckQuery(sheet.id));
  const release = useRelease(lineId);
  const [note, setNote] = useState('');
  const err = release.error;
  const noteError = isApiError(err) ? (err.fields.shortStockNote ?? err.fields.stock) : undefined;
  const otherError = err && !noteError ? errorMessage(err) : undefined;
  const short = check.data?.short ?? false;

  return (
    <form
      className="flex flex-col gap-3"
      aria-label={`Release version ${sheet.version}`}
      onSubmit={(e) => {
        e.preventDefault();
        release.mutate({ sheetId: sheet.id, shortStockNote: note.trim() || undefined }, { onSuccess: onReleased });
      }}
    >
      <section data-testid="stock-check">
        <h3 className="mb-1 text-sm font-semibold text-graphite-800">Wire stock</h3>
        {check.isPending ? (
          <p className="text-sm text-graphite-500">Checking the spools…</p>
        ) : check.isError ? (
          <Alert kind="fault" title="Could not check the stock">{errorMessage(check.error)}</Alert>
        ) : (
          <div className="flex flex-col gap-2 text-sm">
            <p>
              {check.data.quantity} units × {n.kilograms(check.data.massPerUnit)} + {n.sig(check.data.scrapAllowancePercent, 3)}&nbsp;% scrap allowance ={' '}
              <strong>{n.kilograms(check.data.needed)}</strong> of {check.data.conductor} {wireSizeLabel(check.data.wire)}, grade {check.data.insulationGrade}; free on matching spools{' '}
              <strong>{n.kilograms(check.data.available)}</strong>.
            </p>
            {short ? (
              <Alert kind="caution" title={`Short by ${n.kilograms(check.data.shortfall)}`}>
                The release reserves what there is, oldest lot first. Release anyway only with a note for the floor and purchasing.
              </Alert>
            ) : (
              <Alert kind="good" title="Enough wire in stock" />
            )}
            {check.data.spools.length > 0 && (
              <table className="w-full text-sm">
                <thead>
                  <tr className="border-b border-graphite-200 text-left text-graphite-600">
                    <th className="py-1 pr-2 font-semibold">Lot</th>
                    <th className="py-1 pr-2 font-semibold">Location</th>
                    <th className="py-1 pr-2 text-right font-semibold">Free</th>
                    <th className="py-1 text-right font-semibold">Release takes</th>
                  </tr>
                </thead>
                <tbody>
                  {check.data.spools.map((s) => (
                    <tr key={s.id} className="border-b border-graphite-100">
                      <td className="py-1 pr-2">
                        {s.supplier} {s.lot}
                      </td>
                      <td className="py-1 pr-2">{s.location || '—'}</td>
                      <td className="tabular py-1 pr-2 text-right">{n.kilograms(s.freeMass)}</td>
                      <td className="tabular py-1 text-right">{n.kilograms(s.take)}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
            )}
          </div>
        )}
      </section>
      {short && (
        <NoteField
          id="short-stock-note"
          label="Short-stock note"
          value={note}
          onChange={setNote}
          error={noteError}
          hint={`At least ${SHORT_STOCK_NOTE_MIN} characters: what covers the shortfall. Recorded on the sheet and the work orders.`}
        />
      )}
      {otherError && <Alert kind="fault" title="Not released">{otherError}</Alert>}
      <div>
        <Button type="submit" variant="primary" busy={release.isPending} disabled={!sheet.can.release || check.isPending}>
          {short ? 'Release anyway' : 'Release to the floor'}
        </Button>
      </div>
    </form>
  );
}

export function WorkOrdersCreated({ result }: { result: ReleaseResponse }) {
  return (
    <div className="flex flex-col gap-2" data-testid="work-orders">
      <Alert kind="good" title={`Released: ${result.workOrders.length} work ${result.workOrders.length === 1 ? 'order' : 'orders'} made`}>
        {!result.notification
          ? 'No customer notice for this release.'
          : result.notification.status === 'skipped'
            ? `No customer notice: ${result.notification.reason ?? 'nobody to tell'}.`
            : 'The customer’s notice is queued; the travelers wait for printing.'}
      </Alert>
      <table className="w-full text-sm">
        <thead>
          <tr className="border-b border-graphite-200 text-left text-graphite-600">
            <th className="py-1 pr-2 font-semibold">Work order</th>
            <th className="py-1 pr-2 text-right font-semibold">Quantity</th>
            <th className="py-1 pr-2 font-semibold">Due</th>
            <th className="py-1 font-semibold">Stage</th>
          </tr>
        </thead>
        <tbody>
          {result.workOrders.map((w) => (
            <tr key={w.id} className="border-b border-graphite-100" data-work-order={w.number}>
              <td className="py-1 pr-2 font-semibold">{w.number}</td>
              <td className="tabular py-1 pr-2 text-right">{w.quantity}</td>
              <td className="py-1 pr-2">{formatDay(w.dueDate)}</td>
              <td className="py-1" data-stage={w.stage}>
                {STAGE_LABELS[w.stage]}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      {result.stock.short && (
        <p className="text-sm text-caution">
          Released short of wire by {n.kilograms(result.stock.shortfall)}.
        </p>
      )}
    </div>
  );
}

/** A figure of a sheet in its unit: temperatures in the user's, the rest as numbers.ts writes them. */
function figure(value: number | null, unit: string, u: UnitFormatters): string {
  if (value === null) return '—';
  switch (unit) {
    case '°C':
      return u.temperature(value, 0);
    case 'Ω':
      return n.ohms(value);
    case 'kg':
      return n.kilograms(value);
    case 'W':
      return n.watts(value);
    case 'A·turns':
      return n.ampereTurns(value);
    case 'N':
      return n.newtons(value);
    case 'H':
      return n.henries(value);
    default:
      return `${formatNumber(value, 0)} ${unit}`;
  }
}

/** What a version changed against the one before it: engine, spec fields, figures, warnings. */
export function SheetChangesNote({ changes, u }: { changes: SheetChanges; u: UnitFormatters }) {
  const nothing = !changes.engineChanged && changes.figures.length === 0 && changes.specChanged.length === 0;
  return (
    <div className="rounded border border-graphite-200 bg-graphite-50 px-3 py-2 text-xs text-graphite-700" data-testid="sheet-changes">
      <p className="font-semibold text-graphite-800">
        Against version {changes.fromVersion}
        {changes.engineChanged ? `: computed by engine ${changes.toEngine} (version ${changes.fromVersion} by ${changes.fromEngine})` : ''}
        {nothing ? ': the same coil and the same figures' : ''}
      </p>
      {changes.specChanged.length > 0 && <p>Choices changed: {changes.specChanged.join(', ')}</p>}
      {changes.figures.length > 0 && (
        <ul className="mt-0.5 grid gap-x-4 sm:grid-cols-2">
          {changes.figures.map((f) => (
            <li key={f.key} data-figure={f.key}>
              {f.label}: {figure(f.before, f.unit, u)} → <strong>{figure(f.after, f.unit, u)}</strong>
            </li>
          ))}
        </ul>
      )}
      {(changes.warningsAdded.length > 0 || changes.warningsRemoved.length > 0) && (
        <p>
          {changes.warningsAdded.length > 0 && `New warnings: ${changes.warningsAdded.join(', ')}. `}
          {changes.warningsRemoved.length > 0 && `Warnings gone: ${changes.warningsRemoved.join(', ')}.`}
        </p>
      )}
    </div>
  );
}

/** Every version of the line's sheet, newest first: status, who and when. */
export function VersionHistory({ sheets, selectedId, onSelect }: { sheets: BuildSheetRecord[]; selectedId: number | null; onSelect: (s: BuildSheetRecord) => void }) {
  const u = useUnits();
  if (sheets.length === 0) return <p className="text-sm text-graphite-500">No version saved yet.</p>;
  return (
    <ol className="flex flex-col divide-y divide-graphite-100" data-testid="history">
      {sheets.map((s) => (
        <li key={s.id} className={`flex flex-col gap-0.5 py-2 ${s.id === selectedId ? 'bg-copper-50' : ''}`} data-version={s.version} data-status={s.status}>
          <div className="flex flex-wrap items-center gap-2">
            <span className="font-semibold">Version {s.version}</span>
            <SheetStatusBadge status={s.status} />
            <span className="text-sm text-graphite-600">
              {s.result.wire.conductor} {wireSizeLabel(s.result.wire.size)} · {formatNumber(s.result.turns, 0)} turns · {n.ohms(s.result.resistance20)} · {u.temperature(s.result.windingTemperature, 0)} · engine {s.engineVersion}
            </span>
            <Button size="sm" variant="quiet" className="ml-auto" onClick={() => onSelect(s)} aria-label={`Load version ${s.version} into the form`}>
              Load
            </Button>
          </div>
          <p className="text-xs text-graphite-600">
            Drafted by {s.draftedBy?.name ?? '—'}, {formatDateTime(s.draftedAt)}
            {s.approvedAt && ` · approved by ${s.approvedBy?.name ?? '—'}, ${formatDateTime(s.approvedAt)}`}
            {s.releasedAt && ` · released by ${s.releasedBy?.name ?? '—'}, ${formatDateTime(s.releasedAt)}`}
            {s.supersededAt && ` · superseded ${formatDateTime(s.supersededAt)}`}
          </p>
          {s.changes && (s.changes.engineChanged || s.changes.figures.length > 0) && <SheetChangesNote changes={s.changes} u={u} />}
          {s.overrideReason && <p className="text-xs text-graphite-700">Override: {s.overrideReason}</p>}
          {s.shortStockNote && <p className="text-xs text-graphite-700">Short stock: {s.shortStockNote}</p>}
        </li>
      ))}
    </ol>
  );
}
