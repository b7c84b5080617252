import { Router } from 'express';
import {
  assignWorkOrdersRequest,
  createStationRequest,
  floorLoadQuery,
  listStationsQuery,
  moveWorkOrderRequest,
  updateStationRequest,
  updateWorkOrderRequest,
} from '../../src/contracts/floor';
import { STAFF_ROLES } from '../../src/contracts/roles';
import type { Deps } from '../deps';
import { allow, currentUser } from '../http/access';
import { idParam, parse } from '../http/errors';
import { createFloorFeed } from './feed';
import { MOVERS } from './moves';
import * as floor from './service';

export function floorRouter(deps: Pick<Deps, 'db' | 'config'>) {
  const { db } = deps;
  const feed = createFloorFeed(deps.config.databaseUrl);
  const r = Router();

  r.get('/stations', allow(...STAFF_ROLES), async (req, res) => {
    res.json({ stations: await floor.listStations(db, parse(listStationsQuery, req.query)) });
  });
  r.post('/stations', allow('admin'), async (req, res) => {
    res.status(201).json({ station: await floor.createStation(db, parse(createStationRequest, req.body)) });
  });
  r.patch('/stations/:id', allow('admin'), async (req, res) => {
    const id = idParam(req.params.id);
    res.json({ station: await floor.updateStation(db, id, parse(updateStationRequest, req.body)) });
  });

  r.post('/work-orders/assign', allow('foreman', 'admin'), async (req, res) => {
    res.json({ workOrders: await floor.assignWorkOrders(db, currentUser(req), parse(assignWorkOrdersRequest, req.body)) });
  });
  r.post('/work-orders/:id/move', allow(...MOVERS), async (req, res) => {
    const id = idParam(req.params.id);
    res.json(await floor.moveWorkOrder(db, currentUser(req), id, parse(moveWorkOrderRequest, req.body)));
  });
  r.patch('/work-orders/:id', allow('foreman', 'admin'), async (req, res) => {
    const id = idParam(req.params.id);
    res.json(await floor.updateWorkOrder(db, currentUser(req), id, parse(updateWorkOrderRequest, req.body)));
  });

  r.get('/floor/load', allow('foreman', 'admin'), async (req, res) => {
    res.json(await floor.floorLoad(db, currentUser(req), parse(floorLoadQuery, req.query).days));
  });
  r.get('/floor/my-work', allow('floor', 'foreman'), async (req, res) => {
    res.json({ workOrders: await floor.myWork(db, currentUser(req)) });
  });
  r.get('/floor/events', allow(...STAFF_ROLES), async (req, res) => {
    await feed.stream(req, res);
  });
  return r;
}
