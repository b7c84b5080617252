/**
 * The board as the board needs it: every column's count and estimated hours (aggregated by the
 * database), the first cards of each column in the order the foreman works them, more of one
 * column a page at a time, and single cards for the live feed. A card carries only what the card
 * shows; its allowed moves are the signed-in user's (the move table, moves.ts).
 */
import type { SessionUser } from '../../src/contracts/auth';
import {
  BOARD_CURSOR_PATTERN,
  BOARD_STAGES,
  type BoardCard,
  type BoardColumn,
  type BoardColumnQuery,
  type BoardFilters,
  type BoardQuery,
  type BoardResponse,
} from '../../src/contracts/board';
import type { Stage } from '../../src/contracts/stages';
import type { Db, Tx } from '../db/client';
import { stations } from '../db/schema';
import { getFloorSettings, type FloorSettings } from '../settings/service';
import * as repo from './board-repository';
import { estimateGroup, estimateRemaining, lateness, localDate } from './estimate';
import { allowedMoves, inspectionSigned, MOVERS, type UnitTestState } from './moves';
import { unitTestGate } from './unit-tests';

type Q = Db | Tx;
const r2 = (x: number) => Math.round(x * 100) / 100;
const iso = (v: Date | string) => new Date(v).toISOString();

/** Everything about a card that does not depend on who looks at it. */
export type CardFacts = { row: repo.CardRow; entry: repo.StageEntry | undefined; heldFrom: Stage | null; tests: UnitTestState; estimatedHours: number; late: boolean; atRisk: boolean };

/** Reads the facts of card rows: their stage entries, the test gate where packing is in reach, estimates, flags. */
async function facts(db: Q, rows: repo.CardRow[], settings: FloorSettings, today: string): Promise<CardFacts[]> {
  // The unit-test part of the packing gate only matters where packing is a move away: from
  // inspection, or back from a hold taken in packing (asked for every hold, in parallel).
  const maybeGated = rows.filter((r) => r.stage === 'inspection' || r.stage === 'on_hold').map((r) => r.id);
  const [entries, turns, tests] = await Promise.all([
    repo.stageEntries(db, rows.map((r) => r.id)),
    repo.sheetTurns(db, rows.map((r) => r.buildSheetId)),
    maybeGated.length ? unitTestGate(db, maybeGated) : Promise.resolve(new Map<number, UnitTestState>()),
  ]);
  const heldFromOf = (r: repo.CardRow) => (r.stage === 'on_hold' ? (entries.get(r.id)?.fromStage ?? null) : null);
  return rows.map((row) => {
    const heldFrom = heldFromOf(row);
    const gated = inspectionSigned(row.stage, heldFrom);
    const station = row.stationId !== null ? { spindleRpm: row.spindleRpm, setupSeconds: row.setupSeconds ?? 0 } : null;
    const est = estimateRemaining({ quantity: row.quantity, stage: row.stage, heldFrom, turns: turns.get(row.buildSheetId) ?? 0 }, station, settings);
    const flags = lateness(row.dueDate, row.stage, est.hours, today, settings);
    return { row, entry: entries.get(row.id), heldFrom, tests: (gated && tests.get(row.id)) || { state: 'not_tracked' }, estimatedHours: r2(est.hours), ...flags };
  });
}

/** A card as one user sees it (only the allowed moves differ between users). */
export function toCard(f: CardFacts, viewer: SessionUser): BoardCard {
  const { row } = f;
  return {
    id: row.id,
    number: row.number,
    stage: row.stage,
    version: row.version,
    quantity: row.quantity,
    dueDate: row.dueDate,
    priority: row.priority,
    assignee: row.assigneeId !== null && row.assigneeName ? { id: row.assigneeId, name: row.assigneeName } : null,
    station: row.stationId !== null && row.stationName ? { id: row.stationId, name: row.stationName } : null,
    customer: { id: row.customerId, name: row.customerName },
    orderNumber: row.orderNumber,
    title: row.title,
    enteredStageAt: f.entry ? iso(f.entry.at) : iso(row.createdAt),
    late: f.late,
    atRisk: f.atRisk,
    estimatedHours: f.estimatedHours,
    holdReason: row.stage === 'on_hold' ? (f.entry?.note ?? '') : null,
    allowedMoves: movesFor(f, viewer),
  };
}

/**
 * The move table's answer depends only on the role, the stages, the test gate's state and whose
 * work it is (the user's own, nobody's, someone else's), so a board asks it once per distinct
 * case rather than once per card.
 */
const movesMemo = new Map<string, Stage[]>();
function movesFor(f: CardFacts, viewer: SessionUser): Stage[] {
  if (!MOVERS.includes(viewer.role)) return [];
  const { row } = f;
  const whose = row.assigneeId === null ? 'none' : row.assigneeId === viewer.id ? 'mine' : 'other';
  const key = `${viewer.role}|${row.stage}|${f.heldFrom}|${f.tests.state}|${whose}`;
  let moves = movesMemo.get(key);
  if (!moves) {
    // A stand-in assignee of the same kind (mine / nobody / someone else) gives the same answer.
    const assigneeId = whose === 'none' ? null : whose === 'mine' ? viewer.id : -1;
    moves = allowedMoves({ actor: viewer, workOrder: { stage: row.stage, assigneeId }, heldFrom: f.heldFrom, unitTests: f.tests, stationId: row.stationId });
    if (movesMemo.size < 10_000) movesMemo.set(key, moves);
  }
  return moves;
}

/** Count and estimated hours per stage, from the database's groups. */
async function columnTotals(db: Q, f: BoardFilters, today: string, settings: Promise<FloorSettings>, stages: readonly Stage[]) {
  const [groups, stations, s] = await Promise.all([repo.hourGroups(db, f, today, stages), stationTimings(db), settings]);
  const totals = new Map<Stage, { count: number; hours: number }>(stages.map((st) => [st, { count: 0, hours: 0 }]));
  for (const g of groups) {
    const t = totals.get(g.stage)!;
    t.count += g.count;
    t.hours += estimateGroup(g, g.stationId !== null ? (stations.get(g.stationId) ?? null) : null, s).hours;
  }
  return totals;
}

async function stationTimings(db: Q) {
  const rows = await db.select({ id: stations.id, spindleRpm: stations.spindleRpm, setupSeconds: stations.setupSeconds }).from(stations);
  return new Map(rows.map((s) => [s.id, { spindleRpm: s.spindleRpm, setupSeconds: s.setupSeconds }]));
}

const cursorText = (r: repo.CardRow) => `${r.priority}_${r.dueDate}_${r.id}`;
function parseCursor(c: string | undefined): repo.Cursor | undefined {
  const m = c ? BOARD_CURSOR_PATTERN.exec(c) : null;
  return m ? { priority: Number(m[1]), dueDate: m[2], id: Number(m[3]) } : undefined;
}

/** Splits limit + 1 rows per stage into pages and the next cursor of each. */
function pages(rows: repo.CardRow[], limit: number) {
  const byStage = new Map<Stage, repo.CardRow[]>();
  for (const r of rows) {
    const list = byStage.get(r.stage) ?? [];
    list.push(r);
    byStage.set(r.stage, list);
  }
  const out = new Map<Stage, { rows: repo.CardRow[]; nextCursor: string | null }>();
  for (const [stage, list] of byStage) {
    const more = list.length > limit;
    const page = list.slice(0, limit);
    out.set(stage, { rows: page, nextCursor: more && page.length ? cursorText(page[page.length - 1]) : null });
  }
  return out;
}

const filtersOf = (q: BoardQuery | BoardColumnQuery): BoardFilters => ({
  station: q.station,
  assignee: q.assignee,
  customer: q.customer,
  late: q.late,
  dueTo: q.dueTo,
  q: q.q,
});

/** GET /api/board: every column's totals and first cards, and the filters' choices. */
export async function board(db: Q, viewer: SessionUser, q: BoardQuery, today = localDate()): Promise<BoardResponse> {
  const f = filtersOf(q);
  const settingsRead = getFloorSettings(db);
  const [settings, totals, rows, choiceRows] = await Promise.all([
    settingsRead,
    columnTotals(db, f, today, settingsRead, BOARD_STAGES),
    q.limit > 0 ? repo.firstCards(db, f, today, q.limit) : Promise.resolve([]),
    repo.choices(db),
  ]);
  const paged = pages(rows, q.limit);
  const shown = [...paged.values()].flatMap((p) => p.rows);
  const byId = new Map((await facts(db, shown, settings, today)).map((x) => [x.row.id, x]));
  const pick = (kind: repo.Choice['kind']) => choiceRows.filter((c) => c.kind === kind).map((c) => ({ id: c.id, name: c.name }));
  return {
    today,
    columns: BOARD_STAGES.map((stage) => {
      const t = totals.get(stage)!;
      const p = paged.get(stage);
      return {
        stage,
        count: t.count,
        estimatedHours: r2(t.hours),
        cards: (p?.rows ?? []).map((r) => toCard(byId.get(r.id)!, viewer)),
        nextCursor: p?.nextCursor ?? null,
      };
    }),
    choices: { people: pick('person'), stations: pick('station'), customers: pick('customer') },
  };
}

/** GET /api/board/columns/:stage: one column's totals and the page after `cursor`. */
export async function boardColumn(db: Q, viewer: SessionUser, stage: Stage, q: BoardColumnQuery, today = localDate()): Promise<BoardColumn> {
  const f = filtersOf(q);
  const settingsRead = getFloorSettings(db);
  const [settings, totals, rows] = await Promise.all([
    settingsRead,
    columnTotals(db, f, today, settingsRead, [stage]),
    q.limit > 0 ? repo.firstCards(db, f, today, q.limit, [stage], parseCursor(q.cursor)) : Promise.resolve([]),
  ]);
  const p = pages(rows, q.limit).get(stage) ?? { rows: [], nextCursor: null };
  const cards = await facts(db, p.rows, settings, today);
  const t = totals.get(stage)!;
  return { stage, count: t.count, estimatedHours: r2(t.hours), cards: cards.map((c) => toCard(c, viewer)), nextCursor: p.nextCursor };
}

/**
 * The facts of some work orders' cards, whatever their stage (the live feed renders them once per
 * change and per process, then per user with toCard). Not on the board (shipped, engineering) → absent.
 */
export async function cardFacts(db: Q, ids: number[], today = localDate()): Promise<Map<number, CardFacts>> {
  const rows = (await repo.cardsByIds(db, ids)).filter((r) => BOARD_STAGES.includes(r.stage));
  const settings = await getFloorSettings(db);
  return new Map((await facts(db, rows, settings, today)).map((x) => [x.row.id, x]));
}
