import { Router } from 'express';
import { approveBuildSheetRequest, draftBuildSheetRequest, releaseBuildSheetRequest } from '../../src/contracts/build-sheets';
import type { Deps } from '../deps';
import { queueTravelersAfterRelease } from '../travelers/service';
import { allow, currentUser } from '../http/access';
import { idParam, parse } from '../http/errors';
import * as sheets from './service';

/** Roles that read the engineering queue, lines and sheets. */
export const SHEET_READERS = ['engineer', 'admin', 'office', 'foreman'] as const;
/** Roles that draft, approve and release sheets. */
export const SHEET_WRITERS = ['engineer', 'admin'] as const;

export function buildSheetsRouter(deps: Deps) {
  const { db } = deps;
  const r = Router();
  r.get('/engineering/queue', allow(...SHEET_READERS), async (_req, res) => {
    res.json({ lines: await sheets.engineeringQueue(db) });
  });
  r.get('/order-lines/:id', allow(...SHEET_READERS), async (req, res) => {
    res.json(await sheets.getOrderLine(db, idParam(req.params.id)));
  });
  r.post('/order-lines/:id/build-sheet', allow(...SHEET_WRITERS), async (req, res) => {
    const id = idParam(req.params.id);
    res.status(201).json(await sheets.draftBuildSheet(db, id, parse(draftBuildSheetRequest, req.body), currentUser(req)));
  });
  r.get('/build-sheets/:id', allow(...SHEET_READERS), async (req, res) => {
    res.json(await sheets.getBuildSheet(db, idParam(req.params.id)));
  });
  r.get('/build-sheets/:id/stock-check', allow(...SHEET_READERS), async (req, res) => {
    res.json(await sheets.stockCheck(db, idParam(req.params.id)));
  });
  r.post('/build-sheets/:id/approve', allow(...SHEET_WRITERS), async (req, res) => {
    const id = idParam(req.params.id);
    res.json(await sheets.approveBuildSheet(db, id, parse(approveBuildSheetRequest, req.body ?? {}), currentUser(req)));
  });
  r.post('/build-sheets/:id/release', allow(...SHEET_WRITERS), async (req, res) => {
    const id = idParam(req.params.id);
    const user = currentUser(req);
    const released = await sheets.releaseBuildSheet(db, id, parse(releaseBuildSheetRequest, req.body ?? {}), user);
    // After the commit: the new work orders' travelers go on the print queue.
    const travelerJob = await queueTravelersAfterRelease(db, deps.queues, released.workOrders.map((w) => w.id), user);
    res.json({ ...released, travelerJob });
  });
  return r;
}
