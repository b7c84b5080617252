import { Worker } from 'bullmq';
import type { Deps } from '../server/deps';
import { workerConnection } from './connection';
import { dispatchDue } from './dispatcher';
import { documentsProcessor } from './processors/documents';
import { mailProcessor } from './processors/mail';
import { travelerProcessor } from './processors/traveler';
import { createQueues, QUEUES } from './queues';

/** `dispatch: false` runs the workers without the outbox dispatcher (a test that queues its own row). */
export type WorkerOptions = { dispatchIntervalMs?: number; dispatch?: boolean; log?: (msg: string) => void };

/**
 * Starts the workers of every queue and the outbox dispatcher in this process. Any number of
 * processes may run this against one Redis: jobs are shared out, and dispatching is idempotent.
 */
export function startWorkers(deps: Deps, opts: WorkerOptions = {}) {
  const log = opts.log ?? (() => {});
  const connection = workerConnection(deps.config.redisUrl);
  const queues = createQueues(workerConnection(deps.config.redisUrl));
  // A stalled job (its worker died) is handed to another worker after about lockDuration.
  const common = { connection, lockDuration: 15_000, stalledInterval: 5_000, maxStalledCount: 2 };
  const workers = [
    new Worker(QUEUES.mail.name, mailProcessor(deps), { ...common, concurrency: 4 }),
    // PDF drawing is CPU work: one at a time per process; run more workers to print faster.
    new Worker(QUEUES.travelers.name, travelerProcessor(deps), { ...common, concurrency: 1 }),
    new Worker(QUEUES.documents.name, documentsProcessor(deps), { ...common, concurrency: 1 }),
  ];
  for (const w of workers) {
    w.on('failed', (job, err) => log(`${w.name} job ${job?.id} failed (attempt ${job?.attemptsMade}): ${err.message}`));
    w.on('error', () => {});
  }

  let stopped = false;
  let timer: NodeJS.Timeout | undefined;
  const interval = opts.dispatchIntervalMs ?? 2_000;
  const round = async () => {
    try {
      const n = await dispatchDue(deps.db, queues);
      if (n) log(`dispatched ${n} notification(s)`);
    } catch (e) {
      log(`dispatcher: ${(e as Error).message} (will try again)`);
    }
    if (!stopped) timer = setTimeout(round, interval);
  };
  if (opts.dispatch !== false) void round();

  return {
    queues,
    workers,
    async close() {
      stopped = true;
      clearTimeout(timer);
      await Promise.all(workers.map((w) => w.close()));
      await queues.close();
      connection.disconnect();
    },
  };
}
