import { z } from 'zod';

const ID_MAX = 2_147_483_647;
const id = z.int({ error: 'an id' }).positive('an id').max(ID_MAX, 'an id');

/** POST /api/travelers/batch: a whole order, or any selection of work orders (one of the two). */
export const travelerBatchRequest = z
  .object({
    orderId: id.optional(),
    workOrderIds: z.array(id).min(1, 'Choose at least one work order').max(500, 'At most 500 work orders at once').optional(),
  })
  .refine((v) => (v.orderId === undefined) !== (v.workOrderIds === undefined), {
    message: 'Name either an order or a list of work orders',
    path: ['workOrderIds'],
  });
export type TravelerBatchRequest = z.infer<typeof travelerBatchRequest>;

/** 202 answer of a print request: poll GET /api/jobs/:jobId. */
export const travelerJobAccepted = z.object({ jobId: z.string(), count: z.number().int().optional() });
export type TravelerJobAccepted = z.infer<typeof travelerJobAccepted>;

/** A finished batch job's result. */
export const travelerBatchResult = z.object({
  count: z.number().int(),
  pages: z.number().int(),
  downloadUrl: z.string(),
});
export type TravelerBatchResult = z.infer<typeof travelerBatchResult>;

/** GET /api/work-orders/:id/traveler — what exists for a work order. */
export const travelerInfo = z.object({
  exists: z.boolean(),
  stale: z.boolean(),
  buildSheetVersion: z.number().int().nullable(),
  createdAt: z.string().nullable(),
  sha256: z.string().nullable(),
  size: z.number().int().nullable(),
  pages: z.number().int().nullable(),
  downloadUrl: z.string().nullable(),
});
export type TravelerInfo = z.infer<typeof travelerInfo>;
