import type { Db } from '../server/db/client';
import { listDue } from '../server/notifications/service';
import { mailJobId, type Queues } from './queues';

/**
 * Moves due outbox rows onto the mail queue, the row id as the job id, so running it twice (or
 * in two workers) adds each row once. A row whose earlier job failed and that an admin set back
 * to pending has that job retried. When Redis is away this throws; the rows stay pending and go
 * out on a later round.
 */
export async function dispatchDue(db: Db, queues: Queues, limit = 100): Promise<number> {
  const due = await listDue(db, limit);
  let queued = 0;
  for (const { id } of due) {
    const jobId = mailJobId(id);
    const existing = await queues.mail.getJob(jobId);
    if (!existing) {
      await queues.mail.add('send', { notificationId: id }, { jobId });
      queued += 1;
      continue;
    }
    const state = await existing.getState();
    try {
      if (state === 'failed') {
        await existing.retry('failed');
        queued += 1;
      } else if (state === 'completed') {
        // Completed yet the row is pending again (an admin retry): a fresh job; the processor
        // still sends only what is unsent.
        await existing.remove();
        await queues.mail.add('send', { notificationId: id }, { jobId });
        queued += 1;
      }
    } catch {
      /* another dispatcher got there first */
    }
  }
  return queued;
}
