import { Queue, type JobsOptions } from 'bullmq';
import type { Redis } from 'ioredis';
import type { Role } from '../src/contracts/roles';

/**
 * The queues, one per kind of background work, and who may read a job's state: the same
 * roles as may start that kind of work.
 */
export const QUEUES = {
  mail: { name: 'mail', readers: ['admin'] as Role[] },
  travelers: { name: 'travelers', readers: ['engineer', 'foreman', 'office', 'admin'] as Role[] },
  /** Shipment documents (packing list, certificate of conformance). */
  documents: { name: 'documents', readers: ['shipping', 'foreman', 'office', 'admin'] as Role[] },
} as const;
export type QueueKey = keyof typeof QUEUES;

/** Retries with exponential backoff: 5 tries over about a minute, then failed (admin can retry). */
export const DEFAULT_JOB_OPTIONS: JobsOptions = {
  attempts: 5,
  backoff: { type: 'exponential', delay: 2_000 },
  removeOnComplete: { age: 7 * 24 * 3600, count: 5_000 },
  removeOnFail: false,
};

/** The id the API shows for a job: `<queue>.<job id>` (BullMQ ids may not contain ':'). */
export const publicJobId = (queue: QueueKey, jobId: string) => `${queue}.${jobId}`;
export function parsePublicJobId(id: string): { queue: QueueKey; jobId: string } | null {
  const dot = id.indexOf('.');
  if (dot < 1) return null;
  const queue = id.slice(0, dot);
  const jobId = id.slice(dot + 1);
  if (!(queue in QUEUES) || !jobId || jobId.length > 200) return null;
  return { queue: queue as QueueKey, jobId };
}

/** The job id of a notification's mail: one job per outbox row, whoever adds it. */
export const mailJobId = (notificationId: number) => `notification-${notificationId}`;

export function createQueues(connection: Redis) {
  const make = (key: QueueKey) => new Queue(QUEUES[key].name, { connection, defaultJobOptions: DEFAULT_JOB_OPTIONS });
  const queues = { mail: make('mail'), travelers: make('travelers'), documents: make('documents') } satisfies Record<QueueKey, Queue>;
  return {
    ...queues,
    get: (key: QueueKey) => queues[key],
    async close() {
      await Promise.all(Object.values(queues).map((q) => q.close()));
    },
  };
}
export type Queues = ReturnType<typeof createQueues>;
