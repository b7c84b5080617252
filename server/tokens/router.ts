import { Router } from 'express';
import { issueTokenRequest } from '../../src/contracts/tokens';
import type { Db } from '../db/client';
import { allow, currentUser } from '../http/access';
import { idParam, parse } from '../http/errors';
import * as tokens from './service';

export function tokensRouter(db: Db) {
  const r = Router();
  r.get('/tokens', allow('admin'), async (_req, res) => {
    res.json({ tokens: await tokens.listTokens(db) });
  });
  r.post('/tokens', allow('admin'), async (req, res) => {
    res.status(201).json(await tokens.issueToken(db, parse(issueTokenRequest, req.body), currentUser(req)));
  });
  r.post('/tokens/:id/revoke', allow('admin'), async (req, res) => {
    res.json({ token: await tokens.revokeToken(db, idParam(req.params.id), currentUser(req)) });
  });
  return r;
}
