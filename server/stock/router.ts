import { Router } from 'express';
import { listSpoolsQuery, receiveSpoolRequest } from '../../src/contracts/stock';
import type { Db } from '../db/client';
import { allow, currentUser } from '../http/access';
import { parse } from '../http/errors';
import * as stock from './service';

export function stockRouter(db: Db) {
  const r = Router();
  r.get('/spools', allow('engineer', 'office', 'foreman', 'admin'), async (req, res) => {
    res.json({ spools: await stock.listSpools(db, parse(listSpoolsQuery, req.query)) });
  });
  r.post('/spools', allow('office', 'engineer', 'admin'), async (req, res) => {
    res.status(201).json({ spool: await stock.receiveSpool(db, parse(receiveSpoolRequest, req.body), currentUser(req)) });
  });
  return r;
}
