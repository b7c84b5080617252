import { Router } from 'express';
import { updateShopSettingsRequest } from '../../src/contracts/settings';
import type { Db } from '../db/client';
import { allow } from '../http/access';
import { parse } from '../http/errors';
import { readShopSettings, updateShopSettings } from './admin';

export function settingsRouter(db: Db) {
  const r = Router();
  r.get('/settings', allow('admin', 'office', 'engineer', 'foreman', 'floor', 'shipping'), async (_req, res) => {
    res.json({ settings: await readShopSettings(db) });
  });
  r.patch('/settings', allow('admin'), async (req, res) => {
    res.json({ settings: await updateShopSettings(db, parse(updateShopSettingsRequest, req.body)) });
  });
  return r;
}
