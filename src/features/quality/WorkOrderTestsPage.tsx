/**
 * One work order's tests (/work-orders/:id/tests): every record with its readings, derived
 * values and the server's verdict (sortable, filterable, CSV); the run chart of resistance
 * deviation in serial order against the tolerance band; first-pass yield; and the
 * nonconformances with the foreman's disposition and the engineer's approval of use-as-is.
 */
import { zodResolver } from '@hookform/resolvers/zod';
import { useQuery } from '@tanstack/react-query';
import { createColumnHelper } from '@tanstack/react-table';
import { useMemo, useState } from 'react';
import { useForm, useWatch, type Path } from 'react-hook-form';
import { Link, useParams } from 'react-router';
import { STAGE_LABELS } from '../../contracts/stages';
import { dispositionRequest, type DispositionRequest, type Nonconformance, type TestRecord } from '../../contracts/test-records';
import { Alert } from '../../components/Alert';
import { Button, buttonClass } from '../../components/Button';
import { SelectField, TextField } from '../../components/Field';
import { DataTable } from '../../components/DataTable';
import { Loading, PageHeader, Panel } from '../../components/Panel';
import { StatusBadge } from '../../components/Status';
import { errorMessage, isApiError } from '../../lib/api';
import { formatDateTime, plural } from '../../lib/format';
import { applyServerErrors } from '../../lib/forms';
import { useCurrentUser, useUnits } from '../../lib/session';
import { formatNumber, fromCelsius, type UnitFormatters } from '../../lib/units';
import { benchWorkOrderQuery, useApprove, useDisposition, workOrderTestsQuery } from './api';
import { henries, megohms, milliamps, ohms, READING_LABELS, signedOhms, signedPercent, yieldPercent } from './format';
import { UNIT_STATE_WORDS } from './parts';
import { RunChart } from './RunChart';

export function WorkOrderTestsPage() {
  const { id: raw } = useParams();
  const id = Number(raw);
  const valid = Number.isInteger(id) && id > 0;
  const u = useUnits();
  const user = useCurrentUser();
  const wo = useQuery({ ...benchWorkOrderQuery(valid ? id : 0), enabled: valid });
  const q = useQuery({ ...workOrderTestsQuery(valid ? id : 0), enabled: valid });
  if (!valid) return <Alert title="No such work order">The address does not name a work order.</Alert>;
  if (q.isPending || wo.isPending) return <Loading what="Loading the tests" />;
  if (q.error || wo.error) {
    const err = q.error ?? wo.error;
    return <Alert title={isApiError(err) && err.status === 404 ? 'No such work order' : 'Cannot load the tests'}>{errorMessage(err)}</Alert>;
  }
  const t = q.data;
  const w = wo.data;
  const tolerance = w.buildSheet?.tolerancePercent ?? t.records[0]?.tolerancePercent ?? w.line.tolerancePercent;
  const first = t.records.filter((r) => r.firstTest);
  const canBench = user.role === 'floor' || user.role === 'foreman' || user.role === 'admin';

  return (
    <div className="flex flex-col gap-5" data-testid="work-order-tests">
      <PageHeader
        title={`Tests of ${t.number}`}
        lead={
          <>
            {w.order.customer.name} · line {w.line.lineNo}: {w.line.title} · {STAGE_LABELS[w.stage]} ·{' '}
            <Link className="font-semibold text-copper-700 underline" to={`/work-orders/${w.id}`}>
              the work order
            </Link>
          </>
        }
        actions={
          canBench ? (
            <Link className={buttonClass('primary', 'lg')} to={`/test-bench?wo=${w.id}`}>
              Test units at the bench
            </Link>
          ) : undefined
        }
      />

      <dl className="grid grid-cols-2 gap-3 rounded-lg border border-graphite-200 bg-white p-4 sm:grid-cols-5">
        {[
          ['First-pass yield', yieldPercent(t.firstPassYield), `${first.filter((r) => r.passed).length} of ${first.length} first tests passed`],
          ['Units tested', `${t.units.length} of ${t.goodQuantity}`, t.scrapped ? `quantity ${t.quantity}, ${t.scrapped} scrapped` : `quantity ${t.quantity}`],
          ['Records', String(t.records.length), plural(t.records.length - first.length, 'retest')],
          ['Open failures', String(t.openNonconformances), 'nonconformances not yet settled'],
          ['Packing gate', t.gate.state === 'clear' ? 'Clear' : `${t.gate.outstanding} outstanding`, t.gate.state === 'clear' ? 'every unit settled' : 'units untested or failed'],
        ].map(([k, v, hint]) => (
          <div key={k}>
            <dt className="text-sm font-semibold text-graphite-600">{k}</dt>
            <dd className="text-2xl font-bold text-graphite-950 tabular-nums" data-testid={k === 'First-pass yield' ? 'first-pass-yield' : undefined}>
              {v}
            </dd>
            <dd className="text-sm text-graphite-600">{hint}</dd>
          </div>
        ))}
      </dl>

      <Panel title="Run chart: resistance deviation in serial order">
        {t.records.length === 0 ? <p className="text-graphite-600">No unit tested yet.</p> : <RunChart records={t.records} tolerancePercent={tolerance} />}
      </Panel>

      <Panel title={`Nonconformances (${t.nonconformances.length})`}>
        {t.nonconformances.length === 0 ? (
          <p className="text-graphite-600">No unit has failed.</p>
        ) : (
          <ul className="flex flex-col gap-4" data-testid="nonconformances">
            {[...t.nonconformances].reverse().map((nc) => (
              <NonconformanceItem key={nc.id} nc={nc} role={user.role} />
            ))}
          </ul>
        )}
      </Panel>

      <Panel title="Every test record">
        <RecordsTable records={t.records} units={t.units} u={u} number={t.number} />
      </Panel>
    </div>
  );
}

// ── The records table ──────────────────────────────────────────────────────────────────────

type Row = TestRecord & { unitState: string };
const reading = (r: TestRecord, name: TestRecord['readings'][number]['name']) => r.readings.find((x) => x.name === name);
const col = createColumnHelper<Row>();
const nw = (text: string) => <span className="whitespace-nowrap">{text}</span>;

function RecordsTable({ records, units, u, number }: { records: TestRecord[]; units: { serial: string; latestRecordId: number; state: keyof typeof UNIT_STATE_WORDS }[]; u: UnitFormatters; number: string }) {
  const rows = useMemo<Row[]>(
    () =>
      records.map((r) => {
        const unit = units.find((x) => x.latestRecordId === r.id);
        return { ...r, unitState: unit ? UNIT_STATE_WORDS[unit.state].text : 'superseded by a retest' };
      }),
    [records, units],
  );
  const T = u.temperatureSymbol;
  const tu = u.prefs.temperatureUnit;
  const columns = useMemo(
    () => [
      col.accessor('serial', { header: 'Serial', meta: { filter: 'text' }, cell: (c) => <span className="font-semibold whitespace-nowrap tabular-nums">{c.getValue()}</span> }),
      col.accessor((r) => (r.firstTest ? 'first' : 'retest'), { id: 'kind', header: 'Test', meta: { filter: 'select' } }),
      col.accessor('testedAt', { header: 'Tested', cell: (c) => nw(formatDateTime(c.getValue())), meta: { csv: (r) => r.testedAt } }),
      col.accessor((r) => r.testedBy?.name ?? '', { id: 'by', header: 'By', cell: (c) => nw(c.getValue()) }),
      col.accessor('resistance', { header: 'R read', meta: { align: 'right', label: 'R read, Ω' }, cell: (c) => nw(ohms(c.getValue())) }),
      col.accessor((r) => fromCelsius(r.temperature, tu), { id: 'temperature', header: `At, ${T}`, meta: { align: 'right' }, cell: (c) => formatNumber(c.getValue(), 1) }),
      col.accessor('resistance20', { header: 'R20', meta: { align: 'right', label: 'R20, Ω' }, cell: (c) => nw(ohms(c.getValue())) }),
      col.accessor('deviationPercent', { header: 'Deviation', meta: { align: 'right', label: 'Deviation, %' }, cell: (c) => nw(signedPercent(c.getValue())) }),
      col.accessor('deviationOhms', { header: 'Deviation (Ω)', meta: { align: 'right', label: 'Deviation, Ω' }, cell: (c) => nw(signedOhms(c.getValue())) }),
      col.accessor((r) => reading(r, 'hipot')?.derived?.appliedVoltage ?? null, { id: 'hipotV', header: 'Hi-pot, V', meta: { align: 'right' }, cell: (c) => (c.getValue() === null ? '—' : formatNumber(c.getValue()!, 0)) }),
      col.accessor((r) => reading(r, 'hipot')?.value ?? null, { id: 'leakage', header: 'Leakage', meta: { align: 'right', label: 'Leakage, A' }, cell: (c) => (c.getValue() === null ? '—' : nw(milliamps(c.getValue()!))) }),
      col.accessor((r) => r.entered.hipot?.breakdown ?? null, { id: 'breakdown', header: 'Breakdown', cell: (c) => (c.getValue() === null ? '—' : c.getValue() ? 'yes' : 'no') }),
      col.accessor((r) => reading(r, 'insulation_resistance')?.value ?? null, { id: 'ir', header: 'Insulation', meta: { align: 'right', label: 'Insulation resistance, Ω' }, cell: (c) => (c.getValue() === null ? '—' : nw(megohms(c.getValue()!))) }),
      col.accessor((r) => reading(r, 'inductance')?.value ?? null, { id: 'inductance', header: 'Inductance', meta: { align: 'right', label: 'Inductance, H' }, cell: (c) => (c.getValue() === null ? '—' : nw(henries(c.getValue()!))) }),
      col.accessor((r) => reading(r, 'turns')?.value ?? null, { id: 'turns', header: 'Turns', meta: { align: 'right' }, cell: (c) => (c.getValue() === null ? '—' : formatNumber(c.getValue()!, 0)) }),
      col.accessor((r) => reading(r, 'pull')?.value ?? null, { id: 'pull', header: 'Pull, N', meta: { align: 'right' }, cell: (c) => (c.getValue() === null ? '—' : formatNumber(c.getValue()!, 1)) }),
      col.accessor((r) => reading(r, 'heat_run')?.derived?.rise ?? null, {
        id: 'rise',
        header: 'Heat-run rise',
        meta: { align: 'right', csv: (r) => reading(r, 'heat_run')?.derived?.rise ?? null, label: 'Heat-run rise, K' },
        cell: (c) => (c.getValue() === null ? '—' : nw(u.temperatureDifference(c.getValue()!))),
      }),
      col.accessor((r) => r.instruments.map((i) => i.serial).join(', '), { id: 'instruments', header: 'Instruments', cell: (c) => <span className="whitespace-nowrap text-sm">{c.getValue() || '—'}</span> }),
      col.accessor((r) => (r.passed ? 'pass' : 'fail'), {
        id: 'verdict',
        header: 'Verdict',
        meta: { filter: 'select' },
        cell: (c) => <StatusBadge kind={c.row.original.passed ? 'good' : 'fault'}>{c.row.original.passed ? 'Pass' : 'Fail'}</StatusBadge>,
      }),
      col.accessor((r) => r.reasons.join('; '), { id: 'reasons', header: 'Why', cell: (c) => <span className="block min-w-72 text-sm">{c.getValue() || '—'}</span> }),
      col.accessor('unitState', { header: 'Unit now', meta: { filter: 'select' }, cell: (c) => nw(c.getValue()) }),
    ],
    [T, tu, u],
  );
  return <DataTable data={rows} columns={columns} noun="test record" csvName={`${number}-tests`} initialSorting={[{ id: 'serial', desc: false }]} getRowId={(r) => String(r.id)} />;
}

// ── Nonconformances ────────────────────────────────────────────────────────────────────────

const NC_STATE: Record<Nonconformance['state'], { text: string; kind: 'fault' | 'caution' | 'idle' }> = {
  open: { text: 'Open: awaiting disposition', kind: 'fault' },
  awaiting_approval: { text: 'Use as is: awaiting the engineer', kind: 'caution' },
  dispositioned: { text: 'Dispositioned', kind: 'idle' },
};
const ACTION_WORDS = { rework: 'Rework', scrap: 'Scrap', use_as_is: 'Use as is' } as const;
const RETURN_STAGES = ['ready', 'winding', 'terminating', 'impregnating', 'curing', 'testing', 'inspection'] as const;

function NonconformanceItem({ nc, role }: { nc: Nonconformance; role: string }) {
  const s = NC_STATE[nc.state];
  return (
    <li className="rounded-md border border-graphite-200 p-3" data-nc={nc.id} data-state={nc.state} data-serial={nc.serial}>
      <div className="flex flex-wrap items-center justify-between gap-2">
        <p className="text-lg font-bold tabular-nums">
          Unit {nc.serial} <span className="text-sm font-normal text-graphite-600">opened {formatDateTime(nc.createdAt)}</span>
        </p>
        <StatusBadge kind={s.kind}>{s.text}</StatusBadge>
      </div>
      <ul className="mt-2 list-disc pl-5 text-graphite-800">
        {nc.failed.map((f) => (
          <li key={f.name}>
            <span className="font-semibold">{READING_LABELS[f.name]}:</span> {f.reason} <span className="text-sm text-graphite-600">(limit {f.limit})</span>
          </li>
        ))}
      </ul>
      {nc.disposition && (
        <p className="mt-2 text-graphite-800">
          <span className="font-semibold">{ACTION_WORDS[nc.disposition.action]}</span>
          {nc.disposition.returnTo ? `, back to ${STAGE_LABELS[nc.disposition.returnTo as keyof typeof STAGE_LABELS] ?? nc.disposition.returnTo} after rework` : ''} — “{nc.disposition.reason}” (
          {nc.disposition.by?.name ?? 'someone'}, {formatDateTime(nc.disposition.at)})
          {nc.disposition.approvedAt && (
            <>
              . Approved by {nc.disposition.approvedBy?.name ?? 'an engineer'}, {formatDateTime(nc.disposition.approvedAt)}
              {nc.disposition.approvalNote ? `: “${nc.disposition.approvalNote}”` : ''}
            </>
          )}
        </p>
      )}
      {nc.state === 'open' && (role === 'foreman' || role === 'admin') && <DispositionForm nc={nc} />}
      {nc.state === 'awaiting_approval' && role === 'engineer' && <ApproveForm nc={nc} />}
      {nc.state === 'awaiting_approval' && role !== 'engineer' && <p className="mt-2 text-sm text-graphite-600">An engineer approves a use-as-is before the unit counts.</p>}
    </li>
  );
}

const DISPOSITION_FIELDS: Path<DispositionRequest>[] = ['action', 'reason', 'returnTo'];

function DispositionForm({ nc }: { nc: Nonconformance }) {
  const form = useForm<DispositionRequest>({ resolver: zodResolver(dispositionRequest), defaultValues: { action: 'rework', reason: '', returnTo: 'winding' } });
  const { register, handleSubmit, formState, setError, control, setValue } = form;
  const action = useWatch({ control, name: 'action' });
  const mutation = useDisposition();
  const [problems, setProblems] = useState<string[]>([]);
  const e = formState.errors;
  const submit = handleSubmit((v) => {
    setProblems([]);
    const body: DispositionRequest = { action: v.action, reason: v.reason, ...(v.action === 'rework' && v.returnTo && { returnTo: v.returnTo }) };
    mutation.mutate({ id: nc.id, body }, { onError: (err) => setProblems(applyServerErrors(err, setError, DISPOSITION_FIELDS)) });
  });
  return (
    <form className="mt-3 flex flex-col gap-3 border-t border-graphite-200 pt-3" onSubmit={submit} noValidate data-testid="disposition-form">
      <fieldset className="flex flex-col gap-1">
        <legend className="text-sm font-semibold text-graphite-800">Disposition</legend>
        <div className="flex flex-wrap gap-2">
          {(['rework', 'scrap', 'use_as_is'] as const).map((a) => (
            <label key={a} className="flex h-12 cursor-pointer items-center gap-2 rounded-md border-2 border-graphite-300 px-4 font-semibold has-checked:border-copper-600 has-checked:bg-copper-50">
              <input type="radio" value={a} className="size-5" {...register('action', { onChange: () => a !== 'rework' && setValue('returnTo', undefined) })} />
              {ACTION_WORDS[a]}
            </label>
          ))}
        </div>
        {e.action && <p className="text-sm text-fault">{e.action.message}</p>}
      </fieldset>
      {action === 'rework' && (
        <SelectField label="After rework, back to" error={e.returnTo?.message} {...register('returnTo')} wrapperClassName="max-w-xs" className="h-12">
          {RETURN_STAGES.map((s) => (
            <option key={s} value={s}>
              {STAGE_LABELS[s]}
            </option>
          ))}
        </SelectField>
      )}
      <TextField
        label={action === 'use_as_is' ? 'Why this unit may be used as it is (the engineer approves)' : 'Reason'}
        error={e.reason?.message}
        autoComplete="off"
        {...register('reason')}
        className="h-12"
      />
      {action === 'scrap' && <p className="text-sm text-graphite-600">Scrap takes the unit out of the batch: the work order's good quantity drops by one and the order line shows the shortfall.</p>}
      {action === 'rework' && <p className="text-sm text-graphite-600">Rework moves the work order to rework; the unit needs a passing retest.</p>}
      {problems.length > 0 && <Alert title="Not saved">{problems.join(' ')}</Alert>}
      <Button type="submit" variant="primary" size="lg" className="self-start" busy={mutation.isPending}>
        Save disposition
      </Button>
    </form>
  );
}

function ApproveForm({ nc }: { nc: Nonconformance }) {
  const [note, setNote] = useState('');
  const mutation = useApprove();
  return (
    <div className="mt-3 flex flex-wrap items-end gap-3 border-t border-graphite-200 pt-3" data-testid="approve-form">
      <TextField label="Engineer's note (optional)" value={note} onChange={(e) => setNote(e.target.value)} wrapperClassName="min-w-64 flex-1" />
      <Button variant="primary" onClick={() => mutation.mutate({ id: nc.id, note: note.trim() || undefined })} busy={mutation.isPending}>
        Approve use as is
      </Button>
      {mutation.error && <Alert>{errorMessage(mutation.error)}</Alert>}
    </div>
  );
}

