import { Router, type Express } from 'express';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { PROJECT_ROOT } from '../paths';
import { STAFF_ROLES } from '../../src/contracts/roles';
import type { Config } from '../config';
import { allow } from '../http/access';
import { listRoutes } from '../http/routes';
import { buildOpenApi } from './document';

/** GET /api/openapi.json — the API described for integrations; built once per process from the mounted routes. */
export function openApiRouter(config: Config) {
  const r = Router();
  let doc: Record<string, unknown> | undefined;
  r.get('/openapi.json', allow(...STAFF_ROLES), (req, res) => {
    const version = (JSON.parse(readFileSync(path.join(PROJECT_ROOT, 'package.json'), 'utf8')) as { version: string }).version;
    doc ??= buildOpenApi(listRoutes(req.app as Express), { version, serverUrl: config.publicUrl });
    res.json(doc);
  });
  return r;
}
