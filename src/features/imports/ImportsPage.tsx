import { useQuery } from '@tanstack/react-query';
import { createColumnHelper } from '@tanstack/react-table';
import { useMemo, useRef, useState } from 'react';
import { Link } from 'react-router';
import { IMPORT_KINDS, IMPORT_LABELS, IMPORT_MAX_ROWS, type ImportColumn, type ImportKind, type ImportReport, type ImportRow } from '../../contracts/imports';
import { Alert } from '../../components/Alert';
import { Button, buttonClass } from '../../components/Button';
import { DataTable } from '../../components/DataTable';
import { Loading, PageHeader, Panel } from '../../components/Panel';
import { StatusBadge } from '../../components/Status';
import { errorMessage } from '../../lib/api';
import { useCurrentUser } from '../../lib/session';
import { importColumnsQuery, templateHref, useCommitImport, useDryRun } from './api';

const WHERE: Record<ImportKind, { path: string; words: string }> = {
  customers: { path: '/customers', words: 'Open the customers' },
  spools: { path: '/stock', words: 'Open the wire stock' },
  orders: { path: '/orders', words: 'Open the orders' },
};

const HINTS: Record<ImportKind, string> = {
  customers: 'One row per contact; rows with the same company name make one customer. A company with no contacts is one row with the contact columns empty.',
  spools: 'One row per spool received.',
  orders: 'One row per order line; rows with the same customer and purchase order make one order. Orders arrive as entered: acknowledge them when you are ready to mail the customer.',
};

const colCol = createColumnHelper<ImportColumn>();
const rowCol = createColumnHelper<ImportRow>();

/** Totals in words: { customers: 3, contacts: 5 } → "3 customers, 5 contacts". */
const totalsWords = (t: Record<string, number>) =>
  Object.entries(t)
    .map(([k, n]) => `${n} ${n === 1 ? k.replace(/s$/, '') : k}`)
    .join(', ');

/** Moving in from spreadsheets: a template per kind, a dry run that reports row by row, then one commit. */
export function ImportsPage() {
  const user = useCurrentUser();
  const [kind, setKind] = useState<ImportKind>('customers');
  /** The chosen file's bytes, read once: the import commits exactly what was checked. */
  const [file, setFile] = useState<File | null>(null);
  const [report, setReport] = useState<ImportReport | null>(null);
  const [sent, setSent] = useState<number | null>(null);
  const input = useRef<HTMLInputElement>(null);
  const columns = useQuery(importColumnsQuery(kind, `${user.lengthUnit}-${user.temperatureUnit}`));
  const dryRun = useDryRun();
  const commit = useCommitImport();

  const choose = (k: ImportKind) => {
    setKind(k);
    setFile(null);
    setReport(null);
    dryRun.reset();
    commit.reset();
    if (input.current) input.current.value = '';
  };

  const check = async (f: File) => {
    setReport(null);
    commit.reset();
    setSent(0);
    try {
      setReport(await dryRun.mutateAsync({ kind, file: f, onProgress: setSent }));
    } finally {
      setSent(null);
    }
  };

  const doCommit = async () => {
    if (!file) return;
    setSent(0);
    try {
      await commit.mutateAsync({ kind, file, onProgress: setSent });
    } catch {
      // Someone changed the data since the check (a company entered meanwhile): show a fresh report.
      setSent(null);
      setReport(await dryRun.mutateAsync({ kind, file }).catch(() => null));
    } finally {
      setSent(null);
    }
  };

  const guide = useMemo(
    () => [
      colCol.accessor('name', { header: 'Column', cell: (c) => <code className="font-mono text-sm">{c.getValue()}</code> }),
      colCol.accessor((c) => (c.required ? 'required' : 'optional'), { id: 'required', header: 'Filled in', meta: { filter: 'select' } }),
      colCol.accessor('meaning', { header: 'Meaning' }),
      colCol.accessor('example', { header: 'Example', cell: (c) => <span className="font-mono text-sm">{c.getValue()}</span> }),
    ],
    [],
  );
  const rowColumns = useMemo(
    () => [
      rowCol.accessor('row', { header: 'Row', meta: { align: 'right' } }),
      rowCol.accessor((r) => (r.problems.length ? 'Needs attention' : 'Fine'), {
        id: 'state',
        header: 'State',
        meta: { filter: 'select' },
        cell: (c) => <StatusBadge kind={c.row.original.problems.length ? 'fault' : 'good'}>{c.getValue()}</StatusBadge>,
      }),
      rowCol.accessor('creates', { header: 'Would create', cell: (c) => <span className="text-sm">{c.getValue() || '—'}</span> }),
      rowCol.accessor((r) => r.problems.map((p) => (p.column ? `${p.column}: ${p.message}` : p.message)).join('; '), {
        id: 'problems',
        header: 'What is wrong',
        cell: (c) => (
          <ul className="text-sm text-fault">
            {c.row.original.problems.map((p, i) => (
              <li key={i}>
                {p.column && <code className="mr-1 font-mono text-graphite-800">{p.column}</code>}
                {p.message}
              </li>
            ))}
          </ul>
        ),
      }),
    ],
    [],
  );

  const bad = report?.rows.filter((r) => r.problems.length).length ?? 0;
  const committed = commit.data;

  return (
    <div className="space-y-6" data-imports>
      <PageHeader
        title="Import from spreadsheets"
        lead="Bring customers, wire stock and open orders in from CSV files. Every row is checked with the same rules as the forms; nothing is written until every row is right, and then all of it at once."
      />
      <div role="tablist" aria-label="What to import" className="flex flex-wrap gap-2">
        {IMPORT_KINDS.map((k) => (
          <button key={k} role="tab" aria-selected={k === kind} className={buttonClass(k === kind ? 'primary' : 'secondary')} onClick={() => choose(k)}>
            {IMPORT_LABELS[k]}
          </button>
        ))}
      </div>

      <Panel
        title={`1. The template: ${IMPORT_LABELS[kind].toLowerCase()}`}
        actions={
          <a className={buttonClass('secondary', 'sm')} href={templateHref(kind)} download>
            Download the template (CSV)
          </a>
        }
      >
        <p className="mb-3 text-graphite-700">
          {HINTS[kind]} Lengths, temperatures and masses are in your units ({user.lengthUnit === 'mm' ? 'mm, kg' : 'in, lb'}, °{user.temperatureUnit}); a column named in the
          other unit (…_in instead of …_mm) is read in that unit. Up to {IMPORT_MAX_ROWS.toLocaleString()} rows per file; save as CSV (comma or semicolon).
        </p>
        {columns.isPending ? (
          <Loading what="Loading the columns" />
        ) : columns.error ? (
          <Alert title="Cannot load the columns">{errorMessage(columns.error)}</Alert>
        ) : (
          <details>
            <summary className="cursor-pointer font-semibold text-copper-700">What each of the {columns.data.length} columns means</summary>
            <div className="mt-2">
              <DataTable data={columns.data} columns={guide} noun="column" csvName={`import-${kind}-columns`} getRowId={(c) => c.name} />
            </div>
          </details>
        )}
      </Panel>

      <Panel title="2. Check the file">
        <div className="flex flex-wrap items-end gap-3">
          <label className="flex flex-col gap-1 text-sm font-semibold text-graphite-800">
            CSV file
            <input
              ref={input}
              type="file"
              accept=".csv,text/csv"
              className="text-[0.95rem] font-normal"
              onChange={async (e) => {
                const picked = e.target.files?.[0];
                // Cleared at once, so choosing the same file again after correcting it is a new choice.
                e.target.value = '';
                if (!picked) return;
                const copy = new File([await picked.arrayBuffer()], picked.name, { type: picked.type || 'text/csv' });
                setFile(copy);
                void check(copy);
              }}
            />
          </label>
          {file && (
            <span className="text-sm text-graphite-700">
              Checked: <span className="font-semibold">{file.name}</span> — after correcting it, choose it again.
            </span>
          )}
          {sent !== null && (
            <span role="status" className="text-sm text-graphite-600">
              Sending… {Math.round(sent * 100)} %
            </span>
          )}
        </div>
        {dryRun.error && <div className="mt-3"><Alert title="Cannot check the file">{errorMessage(dryRun.error)}</Alert></div>}
        {report && (
          <div className="mt-4 space-y-3">
            {report.fileProblems.length > 0 && (
              <Alert title="The file itself needs attention">
                <ul className="list-disc pl-4">
                  {report.fileProblems.map((p) => (
                    <li key={p}>{p}</li>
                  ))}
                </ul>
              </Alert>
            )}
            {report.fileProblems.length === 0 && (
              <Alert kind={report.ok ? 'good' : 'fault'} title={report.ok ? `All ${report.rowCount} rows are fine` : `${bad} of ${report.rowCount} rows need attention`}>
                {report.ok ? `Importing creates ${totalsWords(report.totals)}.` : 'Correct them in the spreadsheet, save it as CSV again and choose it here. Nothing is imported until every row is right.'}
              </Alert>
            )}
            {report.rows.length > 0 && (
              <div data-import-report>
              <DataTable
                data={report.rows}
                columns={rowColumns}
                noun="row"
                csvName={`import-${kind}-check`}
                getRowId={(r) => String(r.row)}
              />
              </div>
            )}
          </div>
        )}
      </Panel>

      <Panel title="3. Import">
        {committed ? (
          <Alert kind="good" title="Imported">
            Created {totalsWords(committed.totals)}. <Link className="text-copper-700 underline" to={WHERE[kind].path}>{WHERE[kind].words}</Link>
          </Alert>
        ) : (
          <div className="flex flex-wrap items-center gap-3">
            <Button variant="primary" disabled={!report?.ok || !file} busy={commit.isPending} onClick={() => void doCommit()}>
              Import {report?.ok ? totalsWords(report.totals) : ''}
            </Button>
            <span className="text-sm text-graphite-600">{report?.ok ? 'All rows in one go: if anything fails, nothing is kept.' : 'Check a file first; importing opens when every row is fine.'}</span>
          </div>
        )}
        {commit.error && <div className="mt-3"><Alert title="Nothing was imported">{errorMessage(commit.error)}</Alert></div>}
      </Panel>
    </div>
  );
}
