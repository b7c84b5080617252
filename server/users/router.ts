import { Router } from 'express';
import { createUserRequest, updatePreferencesRequest, updateUserRequest } from '../../src/contracts/users';
import type { Db } from '../db/client';
import { allow, anySignedIn, currentUser } from '../http/access';
import { idParam, parse } from '../http/errors';
import * as users from './service';

export function usersRouter(db: Db) {
  const r = Router();
  r.get('/users', allow('admin'), async (_req, res) => {
    res.json({ users: await users.listUsers(db) });
  });
  r.get('/users/customer-options', allow('admin'), async (_req, res) => {
    res.json({ customers: await users.listCustomerOptions(db) });
  });
  r.post('/users', allow('admin'), async (req, res) => {
    res.status(201).json({ user: await users.createUser(db, parse(createUserRequest, req.body)) });
  });
  r.patch('/users/:id', allow('admin'), async (req, res) => {
    const id = idParam(req.params.id);
    res.json({ user: await users.updateUser(db, id, parse(updateUserRequest, req.body), currentUser(req).id) });
  });
  r.patch('/me', anySignedIn(), async (req, res) => {
    const user = await users.updatePreferences(db, currentUser(req).id, parse(updatePreferencesRequest, req.body));
    req.user = user;
    res.json({ user });
  });
  return r;
}
