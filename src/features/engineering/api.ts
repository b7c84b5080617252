/**
 * The engineering feature's server calls. The coil engine runs only on the server: every number
 * on the line's page comes from /api/coil/* or from a saved build sheet.
 */
import { keepPreviousData, queryOptions, useMutation } from '@tanstack/react-query';
import { z } from 'zod';
import {
  buildSheetRecord,
  engineResultV2,
  engineeringQueueResponse,
  orderLineDetail,
  releaseResponse,
  type DraftBuildSheetBody,
} from '../../contracts/build-sheets';
import { coilProfileResponse, coilReferenceResponse, type CoilSpec, type CoilTarget } from '../../contracts/coil';
import { stockCheck } from '../../contracts/stock';
import { workOrderListResponse } from '../../contracts/work-orders';
import { api } from '../../lib/api';
import { queryClient } from '../../lib/queryClient';

// ── The engine's answers (server/coil/types.ts BuildSheet), as far as the screens read them ──

const wireSize = z.union([
  z.object({ standard: z.literal('AWG'), gauge: z.number() }),
  z.object({ standard: z.literal('metric'), diameter: z.number() }),
]);

/** One design as the engine computes it (extra fields pass through). SI units; °C. Engine 2 fields are optional: stored records of engine 1 lack them. */
export const engineSheet = z.looseObject({
  ...engineResultV2,
  wire: z.looseObject({
    size: wireSize,
    conductor: z.enum(['copper', 'aluminium']),
    grade: z.number(),
    bareDiameter: z.number(),
    overallDiameter: z.number(),
  }),
  turns: z.number(),
  turnsPerLayer: z.number(),
  layers: z.number(),
  innerDiameter: z.number(),
  outerDiameter: z.number(),
  windingLength: z.number(),
  wireLength: z.number(),
  wireMass: z.number(),
  fillFactor: z.number().optional(),
  resistance20: z.number(),
  resistanceHot: z.number(),
  ambient: z.number().optional(),
  windingTemperature: z.number(),
  temperatureRise: z.number(),
  voltage: z.number().optional(),
  currentCold: z.number().optional(),
  currentHot: z.number(),
  powerCold: z.number().optional(),
  powerHot: z.number(),
  ampereTurnsCold: z.number().optional(),
  ampereTurnsHot: z.number(),
  currentDensity: z.number(),
  centreField: z.number(),
  gapFluxDensity: z.number().optional(),
  pullForce: z.number().optional(),
  inductance: z.number(),
  timeConstant: z.number(),
  thermalTimeConstant: z.number(),
  thermalRunaway: z.boolean().optional(),
  warnings: z.array(z.object({ code: z.string(), message: z.string() })),
  assumptions: z.array(z.object({ name: z.string(), value: z.union([z.number(), z.string()]), unit: z.string(), source: z.string() })).default([]),
});
export type EngineSheet = z.infer<typeof engineSheet>;

export const solveResponse = z.object({
  best: engineSheet.nullable(),
  candidates: z.array(engineSheet),
  rejected: z.array(z.object({ wire: engineSheet.shape.wire, reasons: z.array(z.string()) })),
});
export type SolveResponse = z.infer<typeof solveResponse>;

// ── Queries ────────────────────────────────────────────────────────────────────────────────

export const queueQuery = queryOptions({
  queryKey: ['engineering', 'queue'],
  queryFn: async ({ signal }) => (await api.get('/engineering/queue', { schema: engineeringQueueResponse, signal })).lines,
});

export const lineQuery = (id: number) =>
  queryOptions({
    queryKey: ['engineering', 'line', id],
    queryFn: ({ signal }) => api.get(`/order-lines/${id}`, { schema: orderLineDetail, signal }),
  });

/** A stable key for a spec: the same spec always gives the same cache entry. */
const specKey = (spec: CoilSpec | null) => (spec ? JSON.stringify(spec) : 'none');

/** POST /api/coil/calculate — the sheet updates in place: the last answer stays while the next computes. */
export const calculateQuery = (spec: CoilSpec | null) =>
  queryOptions({
    queryKey: ['coil', 'calculate', specKey(spec)],
    queryFn: ({ signal }) => api.post('/coil/calculate', spec, { schema: engineSheet, signal }),
    enabled: spec !== null,
    placeholderData: keepPreviousData,
    staleTime: Infinity,
    retry: false,
  });

/** POST /api/coil/sweep — one design per standard wire size. */
export const sweepQuery = (spec: CoilSpec | null) =>
  queryOptions({
    queryKey: ['coil', 'sweep', specKey(spec)],
    queryFn: ({ signal }) => api.post('/coil/sweep', spec, { schema: z.array(engineSheet), signal }),
    enabled: spec !== null,
    placeholderData: keepPreviousData,
    staleTime: Infinity,
    retry: false,
  });

/** POST /api/coil/profile — the curves the pictures draw. */
export const profileQuery = (spec: CoilSpec | null) =>
  queryOptions({
    queryKey: ['coil', 'profile', specKey(spec)],
    queryFn: ({ signal }) => api.post('/coil/profile', spec, { schema: coilProfileResponse, signal }),
    enabled: spec !== null,
    placeholderData: keepPreviousData,
    staleTime: Infinity,
    retry: false,
  });

/** GET /api/coil/reference — the engine's version, constants and core-material library. */
export const referenceQuery = queryOptions({
  queryKey: ['coil', 'reference'],
  queryFn: ({ signal }) => api.get('/coil/reference', { schema: coilReferenceResponse, signal }),
  staleTime: Infinity,
});

export const stockCheckQuery = (sheetId: number) =>
  queryOptions({
    queryKey: ['engineering', 'stock-check', sheetId],
    queryFn: ({ signal }) => api.get(`/build-sheets/${sheetId}/stock-check`, { schema: stockCheck, signal }),
    staleTime: 0,
  });

// ── Writes ─────────────────────────────────────────────────────────────────────────────────

/** POST /api/coil/solve: *find wire* against the line's target. */
export function useSolve() {
  return useMutation({
    mutationFn: (req: { spec: CoilSpec; target: CoilTarget }) => api.post('/coil/solve', req, { schema: solveResponse }),
  });
}

function afterSheetWrite(lineId: number) {
  void queryClient.invalidateQueries({ queryKey: lineQuery(lineId).queryKey });
  void queryClient.invalidateQueries({ queryKey: queueQuery.queryKey });
  // The orders feature shows a line's sheet status; spools change with a release.
  void queryClient.invalidateQueries({ queryKey: ['orders'] });
  void queryClient.invalidateQueries({ queryKey: ['stock'] });
}

export function useSaveDraft(lineId: number) {
  return useMutation({
    mutationFn: (body: DraftBuildSheetBody) => api.post(`/order-lines/${lineId}/build-sheet`, body, { schema: buildSheetRecord }),
    onSuccess: () => afterSheetWrite(lineId),
  });
}

export function useApprove(lineId: number) {
  return useMutation({
    mutationFn: ({ sheetId, overrideReason }: { sheetId: number; overrideReason?: string }) =>
      api.post(`/build-sheets/${sheetId}/approve`, overrideReason ? { overrideReason } : {}, { schema: buildSheetRecord }),
    onSuccess: () => afterSheetWrite(lineId),
  });
}

export function useRelease(lineId: number) {
  return useMutation({
    mutationFn: ({ sheetId, shortStockNote }: { sheetId: number; shortStockNote?: string }) =>
      api.post(`/build-sheets/${sheetId}/release`, shortStockNote ? { shortStockNote } : {}, { schema: releaseResponse }),
    onSuccess: () => afterSheetWrite(lineId),
  });
}

/** The work orders a line's release made (GET /api/work-orders?lineId=). */
export const lineWorkOrdersQuery = (lineId: number) =>
  queryOptions({
    queryKey: ['engineering', 'work-orders', lineId],
    queryFn: async ({ signal }) => (await api.get(`/work-orders?lineId=${lineId}`, { schema: workOrderListResponse, signal })).workOrders,
  });
