import { Router } from 'express';
import { CoilSolveRequestSchema, CoilSpecSchema } from '../../src/contracts/coil';
import { allow } from '../http/access';
import { parse } from '../http/errors';
import * as coil from './service';

const CALCULATORS = ['engineer', 'office', 'foreman', 'admin'] as const;

/** Thin routes over the coil engine: SI in, the engine's result out unchanged. */
export function calculationsRouter() {
  const r = Router();
  r.post('/coil/calculate', allow(...CALCULATORS), (req, res) => {
    res.json(coil.calculate(parse(CoilSpecSchema, req.body)));
  });
  r.post('/coil/sweep', allow(...CALCULATORS), (req, res) => {
    res.json(coil.sweep(parse(CoilSpecSchema, req.body)));
  });
  r.get('/coil/reference', allow(...CALCULATORS), (_req, res) => {
    res.json(coil.reference());
  });
  r.post('/coil/profile', allow(...CALCULATORS), (req, res) => {
    res.json(coil.profile(parse(CoilSpecSchema, req.body)));
  });
  r.post('/coil/solve', allow(...CALCULATORS), (req, res) => {
    res.json(coil.solve(parse(CoilSolveRequestSchema, req.body)));
  });
  return r;
}
