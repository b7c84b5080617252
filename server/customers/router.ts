import { Router } from 'express';
import { createCustomerRequest, listCustomersQuery, updateCustomerRequest } from '../../src/contracts/customers';
import type { Db } from '../db/client';
import { allow, currentUser } from '../http/access';
import { idParam, parse } from '../http/errors';
import * as customers from './service';

export function customersRouter(db: Db) {
  const r = Router();
  r.get('/customers', allow('office', 'engineer', 'foreman', 'shipping', 'admin'), async (req, res) => {
    const { q } = parse(listCustomersQuery, req.query);
    res.json({ customers: await customers.listCustomers(db, q) });
  });
  r.get('/customers/:id', allow('office', 'engineer', 'foreman', 'shipping', 'admin', 'customer'), async (req, res) => {
    res.json({ customer: await customers.getCustomer(db, currentUser(req), idParam(req.params.id)) });
  });
  r.post('/customers', allow('office', 'admin'), async (req, res) => {
    res.status(201).json({ customer: await customers.createCustomer(db, parse(createCustomerRequest, req.body), currentUser(req)) });
  });
  r.patch('/customers/:id', allow('office', 'admin'), async (req, res) => {
    const id = idParam(req.params.id);
    res.json({ customer: await customers.updateCustomer(db, id, parse(updateCustomerRequest, req.body), currentUser(req)) });
  });
  return r;
}
