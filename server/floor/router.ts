import { Router } from 'express';
import { z } from 'zod';
import {
  assignWorkOrdersRequest,
  createStationRequest,
  floorLoadQuery,
  listStationsQuery,
  moveWorkOrderRequest,
  updateStationRequest,
  updateWorkOrderRequest,
} from '../../src/contracts/floor';
import { boardColumnQuery, boardQuery, boardStageParam } from '../../src/contracts/board';
import type { SessionUser } from '../../src/contracts/auth';
import { STAFF_ROLES } from '../../src/contracts/roles';
import type { Deps } from '../deps';
import { allow, currentUser } from '../http/access';
import { idParam, parse } from '../http/errors';
import * as boards from './board';
import { localDate } from './estimate';
import { createFloorFeed } from './feed';
import { createLiveCards } from './live-cards';
import { MOVERS } from './moves';
import { createReadCache } from './read-cache';
import * as floor from './service';

/**
 * Whose answer a cached board is: cards' allowed moves depend on the role, and for floor staff on
 * the person (they move their own work or unassigned work).
 */
const viewerKey = (u: SessionUser) => (u.role === 'floor' ? `floor:${u.id}` : u.role);
/** A cache key from parsed query values (defined values only, in a fixed order). */
const queryKey = (q: Record<string, unknown>) =>
  Object.keys(q)
    .sort()
    .filter((k) => q[k] !== undefined)
    .map((k) => `${k}=${String(q[k])}`)
    .join('&');

export function floorRouter(deps: Pick<Deps, 'db' | 'config'>) {
  const { db } = deps;
  const live = createLiveCards(db);
  const feed = createFloorFeed(deps.config.databaseUrl, live.enrich);
  const cache = createReadCache(feed);
  const r = Router();

  r.get('/board', allow(...STAFF_ROLES), async (req, res) => {
    const q = parse(boardQuery, req.query);
    const user = currentUser(req);
    const today = localDate();
    await cache.send(req, res, `board|${viewerKey(user)}|${today}|${queryKey(q)}`, () => boards.board(db, user, q, today));
  });
  r.get('/board/columns/:stage', allow(...STAFF_ROLES), async (req, res) => {
    const { stage } = parse(z.object({ stage: boardStageParam }), req.params);
    const q = parse(boardColumnQuery, req.query);
    const user = currentUser(req);
    const today = localDate();
    await cache.send(req, res, `column|${stage}|${viewerKey(user)}|${today}|${queryKey(q)}`, () => boards.boardColumn(db, user, stage, q, today));
  });

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
    const { days } = parse(floorLoadQuery, req.query);
    const today = localDate();
    await cache.send(req, res, `load|${today}|${days}`, () => floor.floorLoad(db, currentUser(req), days, today));
  });
  r.get('/floor/my-work', allow('floor', 'foreman'), async (req, res) => {
    res.json({ workOrders: await floor.myWork(db, currentUser(req)) });
  });
  r.get('/floor/events', allow(...STAFF_ROLES), async (req, res) => {
    await feed.stream(req, res, currentUser(req));
  });
  return r;
}
