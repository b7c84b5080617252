/**
 * API contract of moving in from spreadsheets: CSV imports of customers (with contacts and
 * addresses), wire spools and open orders. Imports nothing but zod.
 *
 * Routes (customers and orders: office, admin; spools: office, engineer, admin):
 *   GET  /api/imports/<kind>/template.csv  the header row, in the signed-in user's units
 *   POST /api/imports/<kind>/dry-run       multipart `file` → 200 ImportReport (nothing is written)
 *   POST /api/imports/<kind>/commit        multipart `file` → 201 ImportCommitted, or 422 with
 *                                          `error.report` (an ImportReport) and nothing written
 *
 * Rows are numbered as a spreadsheet shows them: the header is row 1, the first data row is 2.
 * Each row is checked with the same contract schemas as the forms (createCustomerRequest,
 * receiveSpoolRequest, createOrderRequest); lengths, temperatures and masses are read in the
 * unit their column names (…_mm or …_in, …_c or …_f, …_kg or …_lb) and reported in the user's.
 */
import { z } from 'zod';

export const IMPORT_KINDS = ['customers', 'spools', 'orders'] as const;
export type ImportKind = (typeof IMPORT_KINDS)[number];

export const IMPORT_LABELS: Record<ImportKind, string> = { customers: 'Customers and contacts', spools: 'Wire spools', orders: 'Open orders' };

/** Largest file, bytes, and most data rows in one import. */
export const IMPORT_MAX_BYTES = 2 * 1024 * 1024;
export const IMPORT_MAX_ROWS = 5_000;

/** One column of an import: its header (for this user's units), whether it must be filled, what it means. */
export const importColumn = z.object({
  name: z.string(),
  required: z.boolean(),
  meaning: z.string(),
  example: z.string(),
});
export type ImportColumn = z.infer<typeof importColumn>;

export const importProblem = z.object({
  /** The column's header, or null for the row as a whole. */
  column: z.string().nullable(),
  message: z.string(),
});

export const importRow = z.object({
  /** Spreadsheet row number (the header is row 1). */
  row: z.number().int(),
  /** What this row would create, in words and the user's units ("" for a row that only adds to an earlier one). */
  creates: z.string(),
  problems: z.array(importProblem),
});
export type ImportRow = z.infer<typeof importRow>;

export const importReport = z.object({
  kind: z.enum(IMPORT_KINDS),
  /** Data rows read (the header not counted). */
  rowCount: z.number().int(),
  /** true when no row has a problem: a commit would write exactly what `creates` says. */
  ok: z.boolean(),
  /** What a commit creates, by record kind (customers, contacts, spools, orders, lines). */
  totals: z.record(z.string(), z.number().int()),
  rows: z.array(importRow),
  /** Problems with the file as a whole (unknown or missing columns, unreadable CSV). */
  fileProblems: z.array(z.string()),
});
export type ImportReport = z.infer<typeof importReport>;

export const importCommitted = z.object({
  kind: z.enum(IMPORT_KINDS),
  totals: z.record(z.string(), z.number().int()),
  /** Ids of the main records created (customers, spools or orders), in file order. */
  ids: z.array(z.number().int()),
});
export type ImportCommitted = z.infer<typeof importCommitted>;

export const importColumnsResponse = z.object({ kind: z.enum(IMPORT_KINDS), columns: z.array(importColumn) });
