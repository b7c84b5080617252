import { Router } from 'express';
import { createShipmentRequest, listShipmentsQuery, shipmentDocumentKind } from '../../src/contracts/shipments';
import type { Deps } from '../deps';
import { allow, currentUser } from '../http/access';
import { idParam, notFound, parse } from '../http/errors';
import { documentFile, queueDocuments } from './documents';
import * as portal from './portal';
import * as shipments from './service';

/** Roles that read shipments; shipping and admin create them. */
const READERS = ['shipping', 'foreman', 'office', 'admin'] as const;
const SHIPPERS = ['shipping', 'admin'] as const;

export function shipmentsRouter(deps: Deps) {
  const { db } = deps;
  const r = Router();
  r.get('/shipping/ready', allow('shipping', 'foreman', 'admin'), async (_req, res) => {
    res.json(await shipments.readyToShip(db));
  });
  r.post('/shipments', allow(...SHIPPERS), async (req, res) => {
    res.status(201).json(await shipments.createShipment(db, deps.queues, currentUser(req), parse(createShipmentRequest, req.body)));
  });
  r.get('/shipments', allow(...READERS), async (req, res) => {
    res.json({ shipments: await shipments.listShipments(db, parse(listShipmentsQuery, req.query)) });
  });
  r.get('/shipments/:id', allow(...READERS), async (req, res) => {
    res.json(await shipments.openShipment(db, deps.queues, idParam(req.params.id)));
  });
  r.get('/shipments/:id/documents/:kind', allow(...READERS, 'customer'), async (req, res) => {
    const kind = shipmentDocumentKind.safeParse(req.params.kind);
    if (!kind.success) throw notFound('No such document');
    const file = await documentFile(db, deps.storage, currentUser(req), idParam(req.params.id), kind.data);
    res.setHeader('Content-Type', 'application/pdf');
    res.setHeader('Content-Disposition', `inline; filename="${file.filename}"`);
    res.setHeader('Content-Length', String(file.size));
    file.body.pipe(res);
  });
  r.post('/shipments/:id/documents', allow(...SHIPPERS), async (req, res) => {
    const id = idParam(req.params.id);
    await shipments.getShipment(db, id);
    res.status(202).json(await queueDocuments(db, deps.queues, id, true));
  });
  return r;
}

/** The customer's read-only view (their own company only; the services scope every query). */
export function portalRouter(deps: Deps) {
  const { db } = deps;
  const r = Router();
  r.get('/portal/orders', allow('customer'), async (req, res) => {
    res.json({ orders: await portal.listPortalOrders(db, currentUser(req)) });
  });
  r.get('/portal/orders/:id', allow('customer'), async (req, res) => {
    res.json(await portal.getPortalOrder(db, currentUser(req), idParam(req.params.id)));
  });
  r.get('/portal/shipments', allow('customer'), async (req, res) => {
    res.json({ shipments: await portal.listPortalShipments(db, currentUser(req)) });
  });
  r.get('/portal/shipments/:id', allow('customer'), async (req, res) => {
    res.json(await portal.getPortalShipment(db, currentUser(req), idParam(req.params.id)));
  });
  return r;
}
