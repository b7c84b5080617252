import { Router, type Response } from 'express';
import type { Readable } from 'node:stream';
import { travelerBatchRequest } from '../../src/contracts/travelers';
import type { Deps } from '../deps';
import { allow, currentUser } from '../http/access';
import { idParam, parse } from '../http/errors';
import * as travelers from './service';

const PRINTERS = ['engineer', 'foreman', 'office', 'admin'] as const;
const READERS = ['engineer', 'foreman', 'office', 'admin', 'floor', 'shipping'] as const;

function sendPdf(res: Response, file: { body: Readable; size?: number; filename: string }) {
  res.setHeader('Content-Type', 'application/pdf');
  res.setHeader('Content-Disposition', `inline; filename="${file.filename}"`);
  if (file.size !== undefined) res.setHeader('Content-Length', String(file.size));
  file.body.pipe(res);
}

export function travelersRouter(deps: Deps) {
  const r = Router();
  r.post('/work-orders/:id/traveler', allow(...PRINTERS), async (req, res) => {
    res.status(202).json(await travelers.requestTraveler(deps.db, deps.queues, idParam(req.params.id), currentUser(req)));
  });
  r.get('/work-orders/:id/traveler', allow(...READERS), async (req, res) => {
    res.json(await travelers.travelerInfo(deps.db, idParam(req.params.id)));
  });
  r.get('/work-orders/:id/traveler.pdf', allow(...READERS), async (req, res) => {
    sendPdf(res, await travelers.latestTravelerFile(deps.db, deps.storage, idParam(req.params.id)));
  });
  r.post('/travelers/batch', allow(...PRINTERS), async (req, res) => {
    res.status(202).json(await travelers.requestBatch(deps.db, deps.queues, parse(travelerBatchRequest, req.body), currentUser(req)));
  });
  r.get('/traveler-batches/:key.pdf', allow(...PRINTERS), async (req, res) => {
    sendPdf(res, await travelers.batchFile(deps.storage, String(req.params.key)));
  });
  return r;
}
