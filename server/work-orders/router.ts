import { Router } from 'express';
import { ROLES } from '../../src/contracts/roles';
import { listWorkOrdersQuery } from '../../src/contracts/work-orders';
import type { Db } from '../db/client';
import { allow, currentUser } from '../http/access';
import { idParam, parse } from '../http/errors';
import * as workOrders from './service';

/** Every staff role reads work orders; a customer only its own company's (the service scopes). */
export const WORK_ORDER_READERS = ROLES;

export function workOrdersRouter(db: Db) {
  const r = Router();
  r.get('/work-orders', allow(...WORK_ORDER_READERS), async (req, res) => {
    res.json({ workOrders: await workOrders.listWorkOrders(db, currentUser(req), parse(listWorkOrdersQuery, req.query)) });
  });
  r.get('/work-orders/:id', allow(...WORK_ORDER_READERS), async (req, res) => {
    res.json(await workOrders.getWorkOrder(db, currentUser(req), idParam(req.params.id)));
  });
  return r;
}
