import { Router } from 'express';
import type { Deps } from '../deps';
import { publicRoute } from '../http/access';
import { checkHealth } from './service';

export function healthRouter(deps: Deps) {
  const r = Router();
  r.get('/health', publicRoute(), async (_req, res) => {
    const { ok, body } = await checkHealth(deps);
    res.status(ok ? 200 : 503).json(body);
  });
  return r;
}
