import { Router } from 'express';
import type { Db } from '../db/client';
import { allowLoopbackOr } from '../http/access';
import { bearerAuth } from '../http/bearer';
import type { Metrics } from './metrics';

/**
 * GET /metrics — Prometheus text format, outside /api (no session, no cookie): a scraper on the
 * same machine, or an admin API token (`Authorization: Bearer …`) from anywhere.
 */
export function metricsRouter(db: Db, metrics: Metrics) {
  const r = Router();
  r.get('/metrics', bearerAuth(db), allowLoopbackOr('admin'), async (_req, res) => {
    const { contentType, body } = await metrics.render();
    res.set('Content-Type', contentType).set('Cache-Control', 'no-store').send(body);
  });
  return r;
}
