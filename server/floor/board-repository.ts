/**
 * The board's queries, shaped for the board: per-stage counts and hour groups aggregated by the
 * database, the first cards of every column through one index-ordered scan per stage, the cards'
 * own fields for just those ids, and their stage entries in one batched look-up. No correlated
 * subquery runs per work order; the one index the plans use is work_orders_board_idx
 * (stage, -priority, due_date, id), which both orders a column and serves its keyset cursor.
 */
import { createHash } from 'node:crypto';
import { sql, type SQL } from 'drizzle-orm';
import { PgDialect } from 'drizzle-orm/pg-core';
import { BOARD_STAGES, type BoardFilters } from '../../src/contracts/board';
import type { Stage } from '../../src/contracts/stages';
import type { Db, Tx } from '../db/client';

type Q = Db | Tx;

const dialect = new PgDialect();

/**
 * Runs one of the board's queries as a named prepared statement (one per distinct text and pool
 * connection), so PostgreSQL plans it once rather than on every request: planning these joins
 * costs more than running them. Inside a transaction it runs as a plain query.
 */
export async function run<T>(db: Q, query: SQL): Promise<T[]> {
  const pool = (db as Partial<Db>).$client;
  if (!pool || typeof (pool as { query?: unknown }).query !== 'function') return (await db.execute(query)).rows as T[];
  const { sql: text, params } = dialect.sqlToQuery(query);
  const name = `board_${createHash('sha1').update(text).digest('hex').slice(0, 20)}`;
  return (await pool.query({ name, text, values: params as unknown[] })).rows as T[];
}

/** A cursor decoded: the last card's priority, due date and id. */
export type Cursor = { priority: number; dueDate: string; id: number };

/** Escapes LIKE's wildcards in user text. */
const likeText = (s: string) => `%${s.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;

/** A stage list as one PostgreSQL array parameter. */
const stageArray = (stages: readonly Stage[]) => sql`${`{${stages.join(',')}}`}::work_order_stage[]`;

/**
 * The joins and conditions of a filter set, over `w` (work_orders); with `stages`, also the
 * stage condition (without, the caller names the stage).
 */
function scope(f: BoardFilters, today: string, stages?: readonly Stage[]) {
  const joins: SQL[] = [];
  if (f.customer !== undefined || f.q !== undefined) joins.push(sql`join orders o on o.id = w.order_id`);
  if (f.q !== undefined) joins.push(sql`join customers c on c.id = o.customer_id join order_lines l on l.id = w.line_id`);
  const where: SQL[] = [];
  if (stages) where.push(stages.length === 1 ? sql`w.stage = ${stages[0]}` : sql`w.stage = any(${stageArray(stages)})`);
  if (f.station === 'none') where.push(sql`w.station_id is null`);
  else if (f.station !== undefined) where.push(sql`w.station_id = ${f.station}`);
  if (f.assignee === 'none') where.push(sql`w.assignee_id is null`);
  else if (f.assignee !== undefined) where.push(sql`w.assignee_id = ${f.assignee}`);
  if (f.customer !== undefined) where.push(sql`o.customer_id = ${f.customer}`);
  if (f.late === true) where.push(sql`w.due_date < ${today}::date`);
  if (f.late === false) where.push(sql`w.due_date >= ${today}::date`);
  if (f.dueTo !== undefined) where.push(sql`w.due_date <= ${f.dueTo}::date`);
  if (f.q !== undefined) {
    const like = likeText(f.q);
    where.push(sql`(w.number ilike ${like} or o.number ilike ${like} or c.name ilike ${like} or l.title ilike ${like})`);
  }
  return { joins: sql.join(joins, sql` `), where: where.length ? sql.join(where, sql` and `) : sql`true` };
}

/**
 * The stage an on-hold work order was held from: its last release or move event, for the on-hold
 * work orders only (one pass over their events, not a subquery per row).
 */
const HELD_FROM = sql`held as (
  select distinct on (e.work_order_id) e.work_order_id, e.from_stage
  from work_order_events e join work_orders hw on hw.id = e.work_order_id and hw.stage = 'on_hold'
  where e.kind in ('release', 'move')
  order by e.work_order_id, e.at desc, e.id desc
)`;

export type HourGroup = { stage: Stage; heldFrom: Stage | null; stationId: number | null; count: number; quantity: number; quantityTurns: number };

/**
 * Work orders matching the filters, grouped by stage, held-from stage and station, with their
 * count, units and units × turns (the estimate is linear in these; see estimate.ts). Grouped by
 * build sheet first, so each sheet's turns are read once.
 */
export function hourGroupsQuery(f: BoardFilters, today: string, stages: readonly Stage[] = BOARD_STAGES): SQL {
  const s = scope(f, today, stages);
  return sql`with ${HELD_FROM},
    g as (
      select w.stage, h.from_stage as held_from, w.station_id, w.build_sheet_id, count(*)::int as n, sum(w.quantity)::int as q
      from work_orders w ${s.joins} left join held h on h.work_order_id = w.id
      where ${s.where}
      group by 1, 2, 3, 4
    )
    select g.stage, g.held_from as "heldFrom", g.station_id as "stationId", sum(g.n)::int as count, sum(g.q)::int as quantity,
           sum(g.q * (bs.result ->> 'turns')::float8)::float8 as "quantityTurns"
    from g join build_sheets bs on bs.id = g.build_sheet_id
    group by 1, 2, 3`;
}

export async function hourGroups(db: Q, f: BoardFilters, today: string, stages: readonly Stage[] = BOARD_STAGES): Promise<HourGroup[]> {
  return run<HourGroup>(db, hourGroupsQuery(f, today, stages));
}

/** Card fields of work orders (joined once for just these rows). */
const CARD_FIELDS = sql`w.id, w.number, w.stage, w.version, w.quantity, w.due_date::text as "dueDate", w.priority,
  w.assignee_id as "assigneeId", au.name as "assigneeName", w.station_id as "stationId", st.name as "stationName",
  st.spindle_rpm as "spindleRpm", st.setup_seconds as "setupSeconds",
  o.customer_id as "customerId", c.name as "customerName", o.number as "orderNumber", l.title,
  w.build_sheet_id as "buildSheetId", w.created_at as "createdAt"`;
const CARD_JOINS = sql`join orders o on o.id = w.order_id
  join customers c on c.id = o.customer_id
  join order_lines l on l.id = w.line_id
  left join users au on au.id = w.assignee_id
  left join stations st on st.id = w.station_id`;

export type CardRow = {
  id: number;
  number: string;
  stage: Stage;
  version: number;
  quantity: number;
  dueDate: string;
  priority: number;
  assigneeId: number | null;
  assigneeName: string | null;
  stationId: number | null;
  stationName: string | null;
  spindleRpm: number | null;
  setupSeconds: number | null;
  customerId: number;
  customerName: string;
  orderNumber: string;
  title: string;
  buildSheetId: number;
  createdAt: Date | string;
};

/**
 * Turns of build sheets, read once per sheet (a sheet's result is a large JSON document; reading
 * it once per card would cost more than the rest of the query).
 */
export async function sheetTurns(db: Q, ids: number[]): Promise<Map<number, number>> {
  if (!ids.length) return new Map();
  const rows = await run<{ id: number; turns: number }>(
    db,
    sql`select id, (result ->> 'turns')::float8 as turns from build_sheets where id = any(${`{${[...new Set(ids)].join(',')}}`}::int[])`,
  );
  return new Map(rows.map((r) => [r.id, r.turns]));
}

const ORDER = sql`(-w.priority), w.due_date, w.id`;
const afterCursor = (c: Cursor | undefined) => (c ? sql` and ((-w.priority), w.due_date, w.id) > (${-c.priority}, ${c.dueDate}::date, ${c.id})` : sql``);

/**
 * The first `limit` + 1 cards of every stage in board order: for each stage, an index-ordered
 * scan that stops after limit + 1 rows (the extra one says whether there is a next page); then
 * the card fields for those rows only.
 */
export function firstCardsQuery(f: BoardFilters, today: string, limit: number, stages: readonly Stage[] = BOARD_STAGES, cursor?: Cursor): SQL {
  // The stage is the lateral scan's own; the other filters are the same for every stage. The scan
  // returns the work orders' own columns (as `w`), so nothing joins back to work_orders.
  const s = scope(f, today);
  return sql`select ${CARD_FIELDS}
    from unnest(${stageArray(stages)}) with ordinality as s(stage, pos)
    cross join lateral (
      select w.id, w.number, w.stage, w.version, w.quantity, w.due_date, w.priority, w.assignee_id, w.station_id,
             w.order_id, w.line_id, w.build_sheet_id, w.created_at
      from work_orders w ${s.joins}
      where w.stage = s.stage and ${s.where}${afterCursor(cursor)}
      order by ${ORDER}
      limit ${limit + 1}
    ) w
    ${CARD_JOINS}
    order by s.pos, ${ORDER}`;
}

export async function firstCards(db: Q, f: BoardFilters, today: string, limit: number, stages: readonly Stage[] = BOARD_STAGES, cursor?: Cursor): Promise<CardRow[]> {
  return run<CardRow>(db, firstCardsQuery(f, today, limit, stages, cursor));
}

/** Card fields of the given work orders, whatever their stage. */
export async function cardsByIds(db: Q, ids: number[]): Promise<CardRow[]> {
  if (!ids.length) return [];
  return run<CardRow>(db, sql`select ${CARD_FIELDS} from work_orders w ${CARD_JOINS} where w.id = any(${`{${ids.join(',')}}`}::int[])`);
}

export type StageEntry = { workOrderId: number; at: Date | string; fromStage: Stage | null; note: string };

/** Each work order's last release or move event (when it entered its stage; a hold's stage and reason). */
export function stageEntriesQuery(ids: number[]): SQL {
  return sql`select distinct on (e.work_order_id) e.work_order_id as "workOrderId", e.at, e.from_stage as "fromStage", e.note
    from work_order_events e
    where e.work_order_id = any(${`{${ids.join(',')}}`}::int[]) and e.kind in ('release', 'move')
    order by e.work_order_id, e.at desc, e.id desc`;
}

export async function stageEntries(db: Q, ids: number[]): Promise<Map<number, StageEntry>> {
  if (!ids.length) return new Map();
  const rows = await run<StageEntry>(db, stageEntriesQuery(ids));
  return new Map(rows.map((r) => [r.workOrderId, r]));
}

export type Choice = { kind: 'person' | 'station' | 'customer'; id: number; name: string };

/** The people, stations and customers of the work on the board (what its filters can pick). */
export function choicesQuery(): SQL {
  return sql`with open as (select w.assignee_id, w.station_id, w.order_id from work_orders w where w.stage = any(${stageArray(BOARD_STAGES)}))
    select 'person' as kind, u.id, u.name from users u where u.id in (select assignee_id from open)
    union all select 'station', s.id, s.name from stations s where s.id in (select station_id from open)
    union all select 'customer', c.id, c.name from customers c where c.id in (select o.customer_id from orders o where o.id in (select order_id from open))
    order by 1, 3`;
}

export async function choices(db: Q): Promise<Choice[]> {
  return run<Choice>(db, choicesQuery());
}

/** The board's queries as the first screen runs them (unfiltered), for EXPLAIN in the bench. */
export async function boardPlans(db: Q): Promise<[string, SQL][]> {
  const today = new Date().toISOString().slice(0, 10);
  const first = await firstCards(db, {}, today, 50);
  const ids = first.map((r) => r.id);
  return [
    ['column counts and hour groups', hourGroupsQuery({}, today)],
    ['first 50 cards of every column', firstCardsQuery({}, today, 50)],
    ['one column page after a cursor (winding, second page)', firstCardsQuery({}, today, 50, ['winding'], cursorOf(first.filter((r) => r.stage === 'winding').at(-1)))],
    ['stage entries of the cards shown', stageEntriesQuery(ids)],
    ['filter choices', choicesQuery()],
  ];
}

export const cursorOf = (r: Pick<CardRow, 'priority' | 'dueDate' | 'id'> | undefined): Cursor | undefined =>
  r ? { priority: r.priority, dueDate: r.dueDate, id: r.id } : undefined;
