import type { SessionUser } from '../../src/contracts/auth';
import type { ImportCommitted, ImportKind, ImportReport } from '../../src/contracts/imports';
import { toCsv } from '../../src/lib/csv';
import type { Db } from '../db/client';
import { HttpError } from '../http/errors';
import { IMPORTS, type Planned } from './kinds';
import { describeColumns, headerOf, readTable } from './table';

const prefsOf = (u: SessionUser) => ({ lengthUnit: u.lengthUnit, temperatureUnit: u.temperatureUnit });

export function columns(kind: ImportKind, user: SessionUser) {
  return { kind, columns: describeColumns(IMPORTS[kind].columns, prefsOf(user)) };
}

/** The header row, in the user's units, ready for a spreadsheet. */
export function template(kind: ImportKind, user: SessionUser): string {
  return toCsv(IMPORTS[kind].columns.map((c) => headerOf(c, prefsOf(user))), []);
}

async function check(db: Db, kind: ImportKind, file: Buffer, user: SessionUser) {
  const prefs = prefsOf(user);
  const imp = IMPORTS[kind];
  const table = readTable(file, imp.columns, prefs);
  const { items, creates, totals } = table.fileProblems.length
    ? { items: [] as Planned<unknown>[], creates: new Map(), totals: {} }
    : await imp.plan(db, table.rows, prefs);
  const report: ImportReport = {
    kind,
    rowCount: table.rows.length,
    ok: table.fileProblems.length === 0 && table.rows.length > 0 && table.rows.every((r) => r.problems.length === 0),
    totals,
    rows: table.rows.map((r) => ({ row: r.line, creates: creates.get(r) ?? '', problems: r.problems })),
    fileProblems: table.rows.length === 0 && table.fileProblems.length === 0 ? ['The file has no data rows'] : table.fileProblems,
  };
  return { report, items };
}

/** A dry run: every row checked exactly as a commit checks it; nothing is written. */
export async function dryRun(db: Db, kind: ImportKind, file: Buffer, user: SessionUser): Promise<ImportReport> {
  return (await check(db, kind, file, user)).report;
}

/**
 * Checks the file again and, only when no row has a problem, creates everything in one
 * transaction through the same services the forms use; any failure leaves nothing behind.
 */
export async function commit(db: Db, kind: ImportKind, file: Buffer, user: SessionUser): Promise<ImportCommitted> {
  const { report, items } = await check(db, kind, file, user);
  if (!report.ok) {
    const bad = report.rows.filter((r) => r.problems.length).length;
    throw new HttpError(422, 'rule', bad ? `${bad} ${bad === 1 ? 'row needs' : 'rows need'} attention; nothing was imported` : 'The file cannot be imported; nothing was imported', undefined, { report });
  }
  const imp = IMPORTS[kind] as (typeof IMPORTS)[ImportKind] & { create(tx: unknown, input: unknown, actor: SessionUser): Promise<number> };
  const ids = await db.transaction(async (tx) => {
    const out: number[] = [];
    for (const item of items) {
      try {
        out.push(await imp.create(tx, item.input, user));
      } catch (e) {
        // Someone entered the same record meanwhile: name the row and undo the whole import.
        if (e instanceof HttpError) throw new HttpError(e.status, e.code, `Row ${item.rows[0].line}: ${e.message}; nothing was imported`, e.fields);
        throw e;
      }
    }
    return out;
  });
  return { kind, totals: report.totals, ids };
}
