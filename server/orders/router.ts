import { Router } from 'express';
import { cancelOrderRequest, createOrderRequest, listOrdersQuery, updateOrderRequest } from '../../src/contracts/orders';
import type { Db } from '../db/client';
import { allow, currentUser } from '../http/access';
import { idParam, parse } from '../http/errors';
import * as orders from './service';

/** Roles that read orders (a customer only its own company's). */
export const ORDER_READERS = ['office', 'engineer', 'foreman', 'shipping', 'admin', 'customer'] as const;

export function ordersRouter(db: Db) {
  const r = Router();
  r.get('/orders', allow(...ORDER_READERS), async (req, res) => {
    res.json({ orders: await orders.listOrders(db, currentUser(req), parse(listOrdersQuery, req.query)) });
  });
  r.get('/orders/:id', allow(...ORDER_READERS), async (req, res) => {
    res.json({ order: await orders.getOrder(db, currentUser(req), idParam(req.params.id)) });
  });
  r.post('/orders', allow('office', 'admin'), async (req, res) => {
    res.status(201).json({ order: await orders.createOrder(db, parse(createOrderRequest, req.body), currentUser(req)) });
  });
  r.patch('/orders/:id', allow('office', 'admin'), async (req, res) => {
    const id = idParam(req.params.id);
    res.json({ order: await orders.updateOrder(db, id, parse(updateOrderRequest, req.body), currentUser(req)) });
  });
  r.post('/orders/:id/acknowledge', allow('office', 'admin'), async (req, res) => {
    res.json(await orders.acknowledgeOrder(db, idParam(req.params.id), currentUser(req)));
  });
  r.post('/orders/:id/cancel', allow('office', 'admin'), async (req, res) => {
    const id = idParam(req.params.id);
    const { reason } = parse(cancelOrderRequest, req.body);
    res.json({ order: await orders.cancelOrder(db, id, reason, currentUser(req)) });
  });
  return r;
}
