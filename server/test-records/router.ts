import { Router } from 'express';
import { STAFF_ROLES } from '../../src/contracts/roles';
import { adoptHeatTransferRequest } from '../../src/contracts/settings';
import { approveRequest, createInstrumentRequest, dispositionRequest, recordTestRequest, serialsRequest, updateInstrumentRequest } from '../../src/contracts/test-records';
import type { Db } from '../db/client';
import { allow, currentUser } from '../http/access';
import { idParam, parse } from '../http/errors';
import * as tests from './service';

export function testRecordsRouter(db: Db) {
  const r = Router();
  r.get('/instruments', allow(...STAFF_ROLES), async (_req, res) => {
    res.json({ instruments: await tests.listInstruments(db) });
  });
  r.post('/instruments', allow('admin', 'foreman'), async (req, res) => {
    res.status(201).json({ instrument: await tests.createInstrument(db, parse(createInstrumentRequest, req.body)) });
  });
  r.patch('/instruments/:id', allow('admin', 'foreman'), async (req, res) => {
    const id = idParam(req.params.id);
    res.json({ instrument: await tests.updateInstrument(db, id, parse(updateInstrumentRequest, req.body)) });
  });

  r.post('/work-orders/:id/serials', allow('floor', 'foreman', 'admin'), async (req, res) => {
    const id = idParam(req.params.id);
    res.status(201).json({ serials: await tests.nextSerials(db, id, parse(serialsRequest, req.body).count) });
  });
  r.post('/work-orders/:id/test-records', allow('floor', 'foreman', 'admin'), async (req, res) => {
    const id = idParam(req.params.id);
    res.status(201).json(await tests.recordTest(db, currentUser(req), id, parse(recordTestRequest, req.body)));
  });
  r.get('/work-orders/:id/test-records', allow(...STAFF_ROLES), async (req, res) => {
    res.json(await tests.workOrderTests(db, idParam(req.params.id)));
  });

  r.post('/nonconformances/:id/disposition', allow('foreman', 'admin'), async (req, res) => {
    const id = idParam(req.params.id);
    res.json(await tests.disposition(db, currentUser(req), id, parse(dispositionRequest, req.body)));
  });
  r.post('/nonconformances/:id/approve', allow('engineer'), async (req, res) => {
    const id = idParam(req.params.id);
    res.json(await tests.approve(db, currentUser(req), id, parse(approveRequest, req.body ?? {}).note));
  });

  r.get('/quality/summary', allow('foreman', 'engineer', 'admin', 'office'), async (_req, res) => {
    res.json(await tests.qualitySummary(db));
  });
  r.get('/quality/design-feedback', allow('engineer', 'admin'), async (_req, res) => {
    res.json(await tests.designFeedback(db));
  });
  r.post('/quality/design-feedback/adopt', allow('engineer', 'admin'), async (req, res) => {
    res.json(await tests.adoptHeatTransfer(db, currentUser(req), parse(adoptHeatTransferRequest, req.body)));
  });
  return r;
}
