/**
 * API contract of the floor's board: the columns with their counts and hours and the first cards
 * of each, more cards of one column a page at a time, and the card the live feed carries when a
 * work order changes. Imports nothing but zod (and other contracts).
 *
 * Routes (roles):
 *   GET /api/board                   every staff role   ?station=&assignee=&customer=&late=&dueTo=&q=&limit= → BoardResponse
 *   GET /api/board/columns/:stage    every staff role   same filters, &cursor=                            → BoardColumn
 *
 * Both answer with an ETag and `Cache-Control: private, no-cache`: a request carrying the ETag it
 * holds in `If-None-Match` gets 304 while nothing on the board changed. The live feed
 * (GET /api/floor/events, floor.ts) sends each change with the work order's card as the
 * signed-in user sees it (BoardDelta), so an open board updates without fetching its lists again.
 */
import { z } from 'zod';
import { FLOOR_STAGES, floorChange } from './floor';
import { SIDE_STAGES, stageSchema, type Stage } from './stages';
import { queryFields } from './work-orders';

/** The board's columns: the floor stages (ready … packing), then the side states. */
export const BOARD_STAGES: readonly Stage[] = [...FLOOR_STAGES, ...SIDE_STAGES];

/** Cards per column on the first screen when `limit` is not given; the most a page may ask. */
export const BOARD_LIMIT_DEFAULT = 50;
export const BOARD_LIMIT_MAX = 200;
/** Longest search text. */
export const BOARD_SEARCH_MAX = 60;

const { id, isoDate, bool, idOrNone } = queryFields;

/**
 * The board's filters. `assignee` / `station` take an id or `none` (nobody / no station);
 * `customer` a customer id; `late` true (only late work) or false (only work on time); `dueTo` the
 * last due date shown (YYYY-MM-DD, inclusive); `q` searches work-order number, order number,
 * customer and line title (any letter case, part of a word is enough). `limit` = cards per column
 * (0 answers the counts and hours only).
 */
export const boardQuery = z.object({
  station: idOrNone('Station').optional(),
  assignee: idOrNone('Assignee').optional(),
  customer: id('Customer').optional(),
  late: bool('Late').optional(),
  dueTo: isoDate('Due to').optional(),
  q: z
    .string({ error: 'Search: text' })
    .trim()
    .max(BOARD_SEARCH_MAX, `Search: at most ${BOARD_SEARCH_MAX} characters`)
    .refine((s) => !s.includes('\u0000'), 'Search: remove the NUL character')
    .optional()
    .transform((s) => (s ? s : undefined)),
  limit: z.coerce
    .number({ error: 'Limit: a whole number' })
    .pipe(z.int({ error: 'Limit: a whole number' }).min(0, 'Limit: 0 or more').max(BOARD_LIMIT_MAX, `Limit: at most ${BOARD_LIMIT_MAX}`))
    .default(BOARD_LIMIT_DEFAULT),
});
export type BoardQuery = z.output<typeof boardQuery>;
export type BoardFilters = Partial<Omit<BoardQuery, 'limit'>>;

/** Where the next page of a column starts: the last card's priority, due date and id. */
export const BOARD_CURSOR_PATTERN = /^(-?\d{1,6})_(\d{4}-\d{2}-\d{2})_(\d{1,10})$/;
export const boardColumnQuery = boardQuery.extend({
  cursor: z.string({ error: 'Cursor: the nextCursor of the page before' }).regex(BOARD_CURSOR_PATTERN, 'Cursor: the nextCursor of the page before').optional(),
});
export type BoardColumnQuery = z.output<typeof boardColumnQuery>;
export const boardStageParam = z.enum(BOARD_STAGES as [Stage, ...Stage[]], { error: `Stage: a board column, one of ${BOARD_STAGES.join(', ')}` });

const named = z.object({ id: z.number().int(), name: z.string() });

/** One card: only what the board shows of a work order. */
export const boardCard = z.object({
  id: z.number().int(),
  number: z.string(),
  stage: stageSchema,
  /** Send it back with a move or an assignment (optimistic locking, floor.ts). */
  version: z.number().int(),
  quantity: z.number().int(),
  dueDate: z.string(),
  priority: z.number().int(),
  assignee: named.nullable(),
  station: named.nullable(),
  customer: named,
  orderNumber: z.string(),
  /** The order line's title. */
  title: z.string(),
  /** When it entered its current stage. */
  enteredStageAt: z.string(),
  late: z.boolean(),
  atRisk: z.boolean(),
  /** Estimated hours still to do (the rule: FloorLoad in floor.ts). */
  estimatedHours: z.number(),
  /** While on hold: the reason given; null otherwise. */
  holdReason: z.string().nullable(),
  /** The stages the signed-in user may move it to now (floor.ts, the move table). */
  allowedMoves: z.array(stageSchema),
});
export type BoardCard = z.infer<typeof boardCard>;

/**
 * One column: how many work orders match the filters in this stage, their estimated hours in all,
 * the first `limit` cards in the order the foreman works them — highest priority first, then the
 * earliest due date (late work first), then the work-order id — and the cursor of the next page
 * (null when these are all).
 */
export const boardColumn = z.object({
  stage: stageSchema,
  count: z.number().int(),
  estimatedHours: z.number(),
  cards: z.array(boardCard),
  nextCursor: z.string().nullable(),
});
export type BoardColumn = z.infer<typeof boardColumn>;

export const boardResponse = z.object({
  /** The shop's date the late flags were judged on (YYYY-MM-DD). */
  today: z.string(),
  /** Every board stage, in the board's order (ready … packing, then on hold and rework). */
  columns: z.array(boardColumn),
  /** What the filters can pick from: the people, stations and customers of open work. */
  choices: z.object({ people: z.array(named), stations: z.array(named), customers: z.array(named) }),
});
export type BoardResponse = z.infer<typeof boardResponse>;

/**
 * One `event: work-order` of the live feed: what changed and the work order's card as the
 * signed-in user sees it now (null when it left the board: shipped, or back in engineering).
 */
export const boardDelta = floorChange.extend({ card: boardCard.nullable().optional() });
export type BoardDelta = z.infer<typeof boardDelta>;

/** Does a card match the search text? The server's rule, for cards the live feed brings. */
export function cardMatchesSearch(card: Pick<BoardCard, 'number' | 'orderNumber' | 'customer' | 'title'>, q: string): boolean {
  const needle = q.trim().toLowerCase();
  if (!needle) return true;
  return [card.number, card.orderNumber, card.customer.name, card.title].some((s) => s.toLowerCase().includes(needle));
}

/** Does a card match the filters (not the search)? The server's rule, for cards the live feed brings. */
export function cardMatchesFilters(card: BoardCard, f: BoardFilters, today: string): boolean {
  if (f.station !== undefined && (f.station === 'none' ? card.station !== null : card.station?.id !== f.station)) return false;
  if (f.assignee !== undefined && (f.assignee === 'none' ? card.assignee !== null : card.assignee?.id !== f.assignee)) return false;
  if (f.customer !== undefined && card.customer.id !== f.customer) return false;
  if (f.late !== undefined && (card.dueDate < today) !== f.late) return false;
  if (f.dueTo !== undefined && card.dueDate > f.dueTo) return false;
  return f.q === undefined || cardMatchesSearch(card, f.q);
}

/** The order of cards in a column: priority (high first), due date, id. Negative = a goes first. */
export function boardOrder(a: Pick<BoardCard, 'priority' | 'dueDate' | 'id'>, b: Pick<BoardCard, 'priority' | 'dueDate' | 'id'>): number {
  return b.priority - a.priority || (a.dueDate < b.dueDate ? -1 : a.dueDate > b.dueDate ? 1 : 0) || a.id - b.id;
}
