/**
 * The floor feature's server calls: the board's cards, one work order, moves, assignment,
 * stations, the load view, "my work", and the live feed that keeps them current.
 * Contracts: src/contracts/floor.ts and src/contracts/work-orders.ts.
 */
import { keepPreviousData, queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
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
import { api, isApiError } from '../../lib/api';
import { queryClient } from '../../lib/queryClient';
import { BOARD_STAGES } from './stageRules';

/** Every cache entry of this feature starts with one of these, so the live feed can refresh them all. */
const FLOOR_KEY = 'floor';
const WORK_ORDER_KEY = 'work-orders';

/** Polling interval when the live feed is down, ms. */
export const POLL_MS = 10_000;

export const boardQuery = (pollMs: number | false = false) =>
  queryOptions({
    queryKey: [FLOOR_KEY, 'board'],
    queryFn: async ({ signal }) =>
      (await api.get(`/work-orders?stage=${BOARD_STAGES.join(',')}`, { schema: workOrderListResponse, signal })).workOrders,
    placeholderData: keepPreviousData,
    refetchInterval: pollMs,
  });

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

/** After a move or assignment: this work order's detail is fresh; every list is not. */
function afterChange(detail?: WorkOrderDetail) {
  if (detail) queryClient.setQueryData(workOrderQuery(detail.id).queryKey, detail);
  void queryClient.invalidateQueries({ queryKey: [FLOOR_KEY] });
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
 * shortened one ("26-00042", "42") by matching the list. Then read in full by id.
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
    const all = (await api.get('/work-orders', { schema: workOrderListResponse, signal })).workOrders;
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
    let reconnecting = false;
    const refresh = () => {
      void client.invalidateQueries({ queryKey: [FLOOR_KEY] });
      void client.invalidateQueries({ queryKey: [WORK_ORDER_KEY] });
    };
    const open = () => {
      if (closed) return;
      source = new EventSource('/api/floor/events', { withCredentials: true });
      source.addEventListener('ready', () => {
        setState('live');
        // Back after a break: whatever changed meanwhile is fetched now.
        if (reconnecting) refresh();
        reconnecting = true;
      });
      source.addEventListener(FLOOR_EVENT_NAME, refresh);
      source.onmessage = refresh;
      source.onerror = () => {
        source?.close();
        source = null;
        setState('polling');
        retry = setTimeout(open, 60_000);
      };
    };
    open();
    return () => {
      closed = true;
      if (retry) clearTimeout(retry);
      source?.close();
    };
  }, [client]);
  return { state, pollMs: state === 'polling' ? POLL_MS : false };
}
