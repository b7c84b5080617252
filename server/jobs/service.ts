import type { Job } from 'bullmq';
import type { SessionUser } from '../../src/contracts/auth';
import type { FailedJob, JobStateResponse } from '../../src/contracts/jobs';
import { parsePublicJobId, publicJobId, QUEUES, type QueueKey, type Queues } from '../../jobs/queues';
import { forbidden, HttpError, notFound } from '../http/errors';

const unavailable = () => new HttpError(503, 'unavailable', 'The job queue is not reachable right now; try again shortly');

async function queueCall<T>(fn: () => Promise<T>): Promise<T> {
  try {
    return await fn();
  } catch (e) {
    if (e instanceof HttpError) throw e;
    throw unavailable();
  }
}

function progressOf(job: Job): number {
  const p = job.progress;
  const n = typeof p === 'number' ? p : typeof p === 'object' && p && 'percent' in p ? Number((p as { percent: unknown }).percent) : 0;
  return Math.max(0, Math.min(100, Number.isFinite(n) ? n : 0));
}

/** A job's state as the client polls it; readable by the roles that may start that kind of job. */
export async function jobState(queues: Queues, id: string, user: SessionUser): Promise<JobStateResponse> {
  const parsed = parsePublicJobId(id);
  if (!parsed) throw notFound('No such job');
  if (!(QUEUES[parsed.queue].readers as readonly string[]).includes(user.role)) throw forbidden('Your role may not read this job');
  return queueCall(async () => {
    const job = await queues.get(parsed.queue).getJob(parsed.jobId);
    if (!job) throw notFound('No such job (finished jobs are kept for a week)');
    const raw = await job.getState();
    const state = raw === 'completed' ? 'completed' : raw === 'failed' ? 'failed' : raw === 'active' ? 'active' : 'waiting';
    return {
      id,
      state,
      progress: state === 'completed' ? 100 : progressOf(job),
      ...(state === 'completed' && { result: job.returnvalue }),
      ...(state === 'failed' && { error: job.failedReason }),
    };
  });
}

/** Failed jobs of every queue, newest first (admin). */
export async function listFailedJobs(queues: Queues): Promise<FailedJob[]> {
  return queueCall(async () => {
    const out: FailedJob[] = [];
    for (const key of Object.keys(QUEUES) as QueueKey[]) {
      const jobs = await queues.get(key).getJobs(['failed'], 0, 200);
      for (const j of jobs) {
        if (!j?.id) continue;
        out.push({
          id: publicJobId(key, j.id),
          queue: key,
          name: j.name,
          error: j.failedReason ?? '',
          attempts: j.attemptsMade,
          failedAt: j.finishedOn ? new Date(j.finishedOn).toISOString() : null,
          data: j.data,
        });
      }
    }
    return out.sort((a, b) => (b.failedAt ?? '').localeCompare(a.failedAt ?? ''));
  });
}

/** Admin: runs a failed job again. */
export async function retryJob(queues: Queues, id: string) {
  const parsed = parsePublicJobId(id);
  if (!parsed) throw notFound('No such job');
  return queueCall(async () => {
    const job = await queues.get(parsed.queue).getJob(parsed.jobId);
    if (!job) throw notFound('No such job');
    if ((await job.getState()) !== 'failed') throw new HttpError(422, 'rule', 'Only a failed job can be retried');
    await job.retry('failed');
    return { id, state: 'waiting' as const };
  });
}
