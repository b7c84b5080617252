import { Router } from 'express';
import { CoilSolveRequestSchema, CoilSpecSchema } from '../../src/contracts/coil';
import type { Db } from '../db/client';
import { allow } from '../http/access';
import { withShopHeatTransfer } from '../settings/service';
import { parse } from '../http/errors';
import * as coil from './service';

const CALCULATORS = ['engineer', 'office', 'foreman', 'admin'] as const;

/**
 * Thin routes over the coil engine: SI in, the engine's result out unchanged. A spec naming no
 * heat-transfer coefficient gets the shop's adopted default first (as a new draft does), so the
 * engineer's desk shows the numbers the saved sheet will have.
 */
export function calculationsRouter(db: Db) {
  const r = Router();
  const specOf = (body: unknown) => withShopHeatTransfer(db, parse(CoilSpecSchema, body));
  r.post('/coil/calculate', allow(...CALCULATORS), async (req, res) => {
    res.json(coil.calculate(await specOf(req.body)));
  });
  r.post('/coil/sweep', allow(...CALCULATORS), async (req, res) => {
    res.json(coil.sweep(await specOf(req.body)));
  });
  r.get('/coil/reference', allow(...CALCULATORS), (_req, res) => {
    res.json(coil.reference());
  });
  r.post('/coil/profile', allow(...CALCULATORS), async (req, res) => {
    res.json(coil.profile(await specOf(req.body)));
  });
  r.post('/coil/solve', allow(...CALCULATORS), async (req, res) => {
    const input = parse(CoilSolveRequestSchema, req.body);
    res.json(coil.solve({ ...input, spec: await withShopHeatTransfer(db, input.spec) }));
  });
  return r;
}
