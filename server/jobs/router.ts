import { Router } from 'express';
import { QUEUES } from '../../jobs/queues';
import type { Role } from '../../src/contracts/roles';
import type { Deps } from '../deps';
import { allow, currentUser } from '../http/access';
import * as jobs from './service';

/** Every role that may read some queue's jobs; the service checks the queue itself. */
const jobReaders = [...new Set(Object.values(QUEUES).flatMap((q) => q.readers))] as Role[];

export function jobsRouter(deps: Deps) {
  const r = Router();
  r.get('/jobs', allow('admin'), async (_req, res) => {
    res.json({ jobs: await jobs.listFailedJobs(deps.queues) });
  });
  r.get('/jobs/:id', allow(...jobReaders), async (req, res) => {
    res.json(await jobs.jobState(deps.queues, String(req.params.id), currentUser(req)));
  });
  r.post('/jobs/:id/retry', allow('admin'), async (req, res) => {
    res.json(await jobs.retryJob(deps.queues, String(req.params.id)));
  });
  return r;
}
