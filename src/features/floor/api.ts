/**
 * The floor feature's server calls: the board's cards, one work order, moves, assignment,
 * stations, the load view, "my work", and the live feed that keeps them current.
 * Contracts: src/contracts/floor.ts and src/contracts/work-orders.ts.
 */
import { keepPreviousData, queryOptions, useMutation, useQueryClient, type QueryClient } from '@tanstack/react-query';
import { useEffect, useState } from 'react';
import { z } from 'zod';
import {
  FLOOR_EVENT_NAME,
  floorLoad,
  myWorkResponse,
  stationRecord,
  type CreateStationBody,
  type MoveWorkOrderBody,
  type UpdateStationRequest,
} from '../../contracts/floor';
import {
  WORK_ORDER_NUMBER_PATTERN,
  workOrderDetail,
  workOrderListResponse,
  workOrderSummary,
  type WorkOrderDetail,
} from '../../contracts/work-orders';
import {
  BOARD_LIMIT_MAX,
  BOARD_SEARCH_MAX,
  BOARD_STAGES,
  boardColumn,
  boardDelta,
  boardOrder,
  boardResponse,
  cardMatchesFilters,
  type BoardCard,
  type BoardDelta,
  type BoardFilters,
  type BoardResponse,
} from '../../contracts/board';
import type { Stage } from '../../contracts/stages';
import { api, isApiError } from '../../lib/api';
import { queryClient } from '../../lib/queryClient';

/** Every cache entry of this feature starts with one of these, so the live feed can refresh them all. */
const FLOOR_KEY = 'floor';
const WORK_ORDER_KEY = 'work-orders';

/** Polling interval when the live feed is down, ms. */
export const POLL_MS = 10_000;

/** The board's filters as the API's query string (only those set), in a fixed order. */
export function boardParams(f: BoardFilters, extra: Record<string, string | number | undefined> = {}): string {
  const p = new URLSearchParams();
  const all: Record<string, unknown> = { ...f, ...extra };
  for (const k of Object.keys(all).sort()) if (all[k] !== undefined && all[k] !== '') p.set(k, String(all[k]));
  const s = p.toString();
  return s ? `?${s}` : '';
}

const BOARD_KEY = 'board';

/**
 * The board's first screen for a filter set: every column's count and hours and its first cards.
 * The server answers with an ETag, so asking again while nothing changed costs a 304. The live
 * feed patches this answer in place (applyBoardDelta); more cards of a column are appended to it.
 */
export const boardQuery = (filters: BoardFilters, pollMs: number | false = false) =>
  queryOptions({
    queryKey: [FLOOR_KEY, BOARD_KEY, boardParams(filters)],
    queryFn: ({ signal }) => api.get(`/board${boardParams(filters, { limit: BOARD_PAGE })}`, { schema: boardResponse, signal }),
    placeholderData: keepPreviousData,
    refetchInterval: pollMs,
  });

/** Cards a column fetches at a time (the first screen's and each page after it). */
export const BOARD_PAGE = 40;

/** The next page of one column, appended to the board's answer for these filters. */
export async function loadMoreCards(filters: BoardFilters, stage: Stage, cursor: string) {
  const page = await api.get(`/board/columns/${stage}${boardParams(filters, { cursor, limit: BOARD_PAGE })}`, { schema: boardColumn });
  queryClient.setQueryData<BoardResponse>(boardQuery(filters).queryKey, (old) =>
    old
      ? {
          ...old,
          columns: old.columns.map((c) => {
            if (c.stage !== stage) return c;
            const have = new Set(c.cards.map((x) => x.id));
            return { ...c, count: page.count, estimatedHours: page.estimatedHours, cards: [...c.cards, ...page.cards.filter((x) => !have.has(x.id))], nextCursor: page.nextCursor };
          }),
        }
      : old,
  );
}

/** Fresh counts and hours of every column (no cards): after a change the board could not place exactly. */
async function refreshTotals(filters: BoardFilters) {
  const totals = await api.get(`/board${boardParams(filters, { limit: 0 })}`, { schema: boardResponse });
  queryClient.setQueryData<BoardResponse>(boardQuery(filters).queryKey, (old) =>
    old
      ? {
          ...old,
          columns: old.columns.map((c) => {
            const t = totals.columns.find((x) => x.stage === c.stage);
            return t ? { ...c, count: t.count, estimatedHours: t.estimatedHours } : c;
          }),
        }
      : old,
  );
}

/**
 * Puts one change the live feed brought into a board answer: the card leaves its old column and,
 * when it still matches the filters, takes its place in its new one (if that place is among the
 * cards loaded). Counts and hours follow when the old card was on screen (or the work order is new);
 * otherwise the answer says the totals need asking for. An older version than the one shown changes nothing.
 */
export function applyBoardDelta(data: BoardResponse, d: BoardDelta, filters: BoardFilters): { data: BoardResponse; totalsKnown: boolean } {
  let old: BoardCard | undefined;
  for (const c of data.columns) old ??= c.cards.find((x) => x.id === d.id);
  if (old && old.version >= d.version) return { data, totalsKnown: true };
  const card = d.card && BOARD_STAGES.includes(d.card.stage) && cardMatchesFilters(d.card, filters, data.today) ? d.card : null;
  const round = (h: number) => Math.round(h * 100) / 100;
  const columns = data.columns.map((c) => {
    let { cards, count, estimatedHours } = c;
    if (old && old.stage === c.stage) {
      cards = cards.filter((x) => x.id !== d.id);
      count -= 1;
      estimatedHours = round(estimatedHours - old.estimatedHours);
    }
    if (card && card.stage === c.stage) {
      count += 1;
      estimatedHours = round(estimatedHours + card.estimatedHours);
      const at = cards.findIndex((x) => boardOrder(card, x) < 0);
      if (at >= 0) cards = [...cards.slice(0, at), card, ...cards.slice(at)];
      else if (c.nextCursor === null) cards = [...cards, card];
    }
    return cards === c.cards && count === c.count ? c : { ...c, cards, count, estimatedHours };
  });
  return { data: { ...data, columns }, totalsKnown: Boolean(old) || d.kind === 'release' };
}

/** Applies a live change to every board answer held (each filter set), asking for totals where needed. */
const totalsDue = new Map<string, ReturnType<typeof setTimeout>>();
function patchBoards(client: QueryClient, d: BoardDelta) {
  for (const [key, data] of client.getQueriesData<BoardResponse>({ queryKey: [FLOOR_KEY, BOARD_KEY] })) {
    if (!data) continue;
    const params = String(key[2] ?? '');
    const filters = filtersFromParams(new URLSearchParams(params));
    const { data: next, totalsKnown } = applyBoardDelta(data, d, filters);
    client.setQueryData(key, next);
    if (!totalsKnown && !totalsDue.has(params)) {
      // A burst of changes asks once.
      totalsDue.set(
        params,
        setTimeout(() => {
          totalsDue.delete(params);
          refreshTotals(filters).catch(() => void client.invalidateQueries({ queryKey: key }));
        }, 400),
      );
    }
  }
}

/** The filters a board query string names (the inverse of boardParams). */
export function filtersFromParams(p: URLSearchParams): BoardFilters {
  const idOrNone = (v: string | null) => (v === null || v === '' ? undefined : v === 'none' ? ('none' as const) : Number(v));
  const late = p.get('late');
  return {
    station: idOrNone(p.get('station')),
    assignee: idOrNone(p.get('assignee')),
    customer: p.get('customer') ? Number(p.get('customer')) : undefined,
    late: late === null ? undefined : late === 'true',
    dueTo: p.get('dueTo') ?? undefined,
    q: p.get('q') || undefined,
  };
}

export const workOrderQuery = (id: number, pollMs: number | false = false) =>
  queryOptions({
    queryKey: [WORK_ORDER_KEY, 'one', id],
    queryFn: ({ signal }) => api.get(`/work-orders/${id}`, { schema: workOrderDetail, signal }),
    refetchInterval: pollMs,
  });

export const stationsQuery = (activeOnly = false) =>
  queryOptions({
    queryKey: [FLOOR_KEY, 'stations', activeOnly],
    queryFn: async ({ signal }) =>
      (await api.get(`/stations${activeOnly ? '?active=true' : ''}`, { schema: z.object({ stations: z.array(stationRecord) }), signal })).stations,
    staleTime: 60_000,
  });

export const loadQuery = (days: number, pollMs: number | false = false) =>
  queryOptions({
    queryKey: [FLOOR_KEY, 'load', days],
    queryFn: ({ signal }) => api.get(`/floor/load?days=${days}`, { schema: floorLoad, signal }),
    placeholderData: keepPreviousData,
    refetchInterval: pollMs,
  });

/**
 * The floor staff a foreman can assign work to. The API has no people list for the foreman
 * (GET /api/users is admin-only); the load view lists every active floor user, so we read it.
 */
export const floorPeopleQuery = () =>
  queryOptions({
    queryKey: [FLOOR_KEY, 'people'],
    queryFn: async ({ signal }) =>
      (await api.get('/floor/load?days=1', { schema: floorLoad, signal })).people.map((p) => ({ id: p.id, name: p.name })),
    staleTime: 5 * 60_000,
  });

export const myWorkQuery = (pollMs: number | false = false) =>
  queryOptions({
    queryKey: [FLOOR_KEY, 'my-work'],
    queryFn: async ({ signal }) => (await api.get('/floor/my-work', { schema: myWorkResponse, signal })).workOrders,
    refetchInterval: pollMs,
  });

/** Whether a live feed is open in this tab (its messages bring the boards' changed cards). */
let feedLive = false;

/**
 * After a move or assignment: this work order's detail is fresh; every list is not. The boards
 * wait for the live feed's card when it is open (no list fetched again), else ask again.
 */
function afterChange(detail?: WorkOrderDetail) {
  if (detail) queryClient.setQueryData(workOrderQuery(detail.id).queryKey, detail);
  void queryClient.invalidateQueries({ predicate: (q) => q.queryKey[0] === FLOOR_KEY && !(feedLive && q.queryKey[1] === BOARD_KEY) });
  void queryClient.invalidateQueries({ queryKey: [WORK_ORDER_KEY] });
}

/** A refused or conflicting write: everything shown may be stale, so fetch it again. */
export function refreshAfterError(e: unknown) {
  if (isApiError(e) && (e.status === 409 || e.status === 422 || e.status === 404)) afterChange();
}

export function useMoveWorkOrder() {
  return useMutation({
    mutationFn: ({ id, body }: { id: number; body: MoveWorkOrderBody }) => api.post(`/work-orders/${id}/move`, body, { schema: workOrderDetail }),
    onSuccess: (d) => afterChange(d),
    onError: refreshAfterError,
  });
}

export type AssignInput = { ids: number[]; versions: number[]; assigneeId?: number | null; stationId?: number | null };

export function useAssignWorkOrders() {
  return useMutation({
    mutationFn: async (input: AssignInput) =>
      (await api.post('/work-orders/assign', input, { schema: z.object({ workOrders: z.array(workOrderSummary) }) })).workOrders,
    onSuccess: () => afterChange(),
    onError: refreshAfterError,
  });
}

export function useSetPriority() {
  return useMutation({
    mutationFn: ({ id, priority, version }: { id: number; priority: number; version: number }) =>
      api.patch(`/work-orders/${id}`, { priority, version }, { schema: workOrderDetail }),
    onSuccess: (d) => afterChange(d),
    onError: refreshAfterError,
  });
}

const stationResponse = z.object({ station: stationRecord });

export function useCreateStation() {
  return useMutation({
    mutationFn: async (input: CreateStationBody) => (await api.post('/stations', input, { schema: stationResponse })).station,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: [FLOOR_KEY, 'stations'] }),
  });
}

export function useUpdateStation() {
  return useMutation({
    mutationFn: async ({ id, change }: { id: number; change: UpdateStationRequest }) =>
      (await api.patch(`/stations/${id}`, change, { schema: stationResponse })).station,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: [FLOOR_KEY, 'stations'] }),
  });
}

/** What a scan or a typed entry names: a work-order id (from the traveler's QR URL) or a number. */
export type ScanTarget = { id: number } | { number: string };

/** Reads a scanned or typed text: "WO-26-00042", "wo-26-00042", or a traveler URL ending in /work-orders/17. */
export function parseScan(raw: string): ScanTarget | null {
  const text = raw.trim();
  if (!text) return null;
  const url = /\/work-orders\/(\d+)\/?(?:[?#].*)?$/.exec(text);
  if (url) return { id: Number(url[1]) };
  const upper = text.toUpperCase().replace(/\s+/g, '');
  return { number: upper };
}

/**
 * Finds a work order by what was scanned: a full number through the list's `number` filter; a
 * shortened one ("26-00042", "42") by searching the open work on the board. Then read in full by id.
 * Answers null when nothing has that number.
 */
export async function lookupWorkOrder(target: ScanTarget, signal?: AbortSignal): Promise<WorkOrderDetail | null> {
  let id: number | undefined;
  if ('id' in target) id = target.id;
  else if (/^WO-\d{2}-\d+$/.test(target.number)) {
    const found = (await api.get(`/work-orders?number=${encodeURIComponent(target.number)}`, { schema: workOrderListResponse, signal })).workOrders;
    if (found.length !== 1) return null;
    id = found[0]!.id;
  } else {
    // A shortened number: search the open work on the board (never the shop's whole history).
    const found = await api.get(`/board${boardParams({ q: target.number.slice(-BOARD_SEARCH_MAX) }, { limit: BOARD_LIMIT_MAX })}`, { schema: boardResponse, signal });
    const all = found.columns.flatMap((c) => c.cards);
    const exact = all.find((w) => w.number.toUpperCase() === target.number);
    // A number typed without its prefix ("26-00042") or the sequence alone ("42") also finds it, when unambiguous.
    const loose = exact
      ? [exact]
      : all.filter((w) => {
          const n = w.number.toUpperCase();
          if (n.endsWith(`-${target.number}`) || n === `WO-${target.number}`) return true;
          return /^\d+$/.test(target.number) && Number(n.split('-').pop()) === Number(target.number);
        });
    if (loose.length !== 1) return null;
    id = loose[0]!.id;
  }
  try {
    const detail = await api.get(`/work-orders/${id}`, { schema: workOrderDetail, signal });
    queryClient.setQueryData(workOrderQuery(detail.id).queryKey, detail);
    return detail;
  } catch (e) {
    if (isApiError(e) && (e.status === 404 || e.status === 400)) return null;
    throw e;
  }
}

export const looksLikeNumber = (s: string) => WORK_ORDER_NUMBER_PATTERN.test(s.trim().toUpperCase());

export type LiveState = 'connecting' | 'live' | 'polling';

/**
 * Subscribes to GET /api/floor/events while mounted and refreshes every floor query on each
 * message, so moves and assignments by others show within seconds. When the stream fails the
 * screens poll every POLL_MS instead (the answer's `pollMs`), and the stream is tried again later.
 */
export function useFloorLive(): { state: LiveState; pollMs: number | false } {
  const client = useQueryClient();
  const [state, setState] = useState<LiveState>('connecting');
  useEffect(() => {
    if (typeof EventSource === 'undefined') {
      setState('polling');
      return;
    }
    let source: EventSource | null = null;
    let retry: ReturnType<typeof setTimeout> | undefined;
    let closed = false;
    const refresh = () => {
      void client.invalidateQueries({ queryKey: [FLOOR_KEY] });
      void client.invalidateQueries({ queryKey: [WORK_ORDER_KEY] });
    };
    /**
     * One change: the boards held take the card the message carries (no list fetched again);
     * the other floor screens (load, my work, the work order itself) ask again — each a small,
     * cached answer. A message without a card refreshes everything.
     */
    const onChange = (e: MessageEvent) => {
      let parsed;
      try {
        parsed = boardDelta.safeParse(JSON.parse(String(e.data)));
      } catch {
        parsed = null;
      }
      if (!parsed?.success || parsed.data.card === undefined) return refresh();
      const d = parsed.data;
      patchBoards(client, d);
      void client.invalidateQueries({ predicate: (q) => q.queryKey[0] === FLOOR_KEY && (q.queryKey[1] === 'load' || q.queryKey[1] === 'my-work') });
      void client.invalidateQueries({ queryKey: [WORK_ORDER_KEY] });
    };
    const open = () => {
      if (closed) return;
      source = new EventSource('/api/floor/events', { withCredentials: true });
      source.addEventListener('ready', () => {
        setState('live');
        feedLive = true;
        // Connected (or back after a break): whatever changed before is asked for now. The
        // answers carry ETags, so what did not change costs a 304.
        refresh();
      });
      source.addEventListener(FLOOR_EVENT_NAME, onChange);
      source.onmessage = refresh;
      source.onerror = () => {
        feedLive = false;
        source?.close();
        source = null;
        setState('polling');
        retry = setTimeout(open, 60_000);
      };
    };
    open();
    return () => {
      closed = true;
      feedLive = false;
      if (retry) clearTimeout(retry);
      source?.close();
    };
  }, [client]);
  return { state, pollMs: state === 'polling' ? POLL_MS : false };
}
