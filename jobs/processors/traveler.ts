import type { Job } from 'bullmq';
import type { Deps } from '../../server/deps';
import { buildBatch, ensureTraveler } from '../../server/travelers/service';

export type TravelerJobData = { workOrderId: number; userId: number };
export type TravelerBatchJobData = { workOrderIds: number[]; userId: number; key: string };

/** Prints one traveler, or a batch merged into one PDF (job names 'traveler' and 'batch'). */
export function travelerProcessor(deps: Deps) {
  return async (job: Job<TravelerJobData | TravelerBatchJobData>) => {
    const publicUrl = deps.config.publicUrl;
    if (job.name === 'batch') {
      return buildBatch(deps.db, deps.storage, publicUrl, job.data as TravelerBatchJobData, (p) => job.updateProgress(p));
    }
    const { workOrderId, userId } = job.data as TravelerJobData;
    const t = await ensureTraveler(deps.db, deps.storage, publicUrl, workOrderId, userId);
    await job.updateProgress(100);
    return { travelerId: t.id, sha256: t.sha256, pages: t.pages, downloadUrl: `/api/work-orders/${workOrderId}/traveler.pdf` };
  };
}
