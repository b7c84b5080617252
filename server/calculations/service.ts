import type { CoilSolveRequest, CoilSpec } from '../../src/contracts/coil';
import { CoilSpecError, designCoil, solveCoil, sweepWireSizes } from '../coil';
import { badRequest } from '../http/errors';

/** Runs the engine; a spec it refuses becomes 400 `validation` naming the field. */
function run<T>(fn: () => T): T {
  try {
    return fn();
  } catch (e) {
    if (e instanceof CoilSpecError) throw badRequest(e.message, { [e.field]: e.message.replace(`${e.field}: `, '') });
    throw e;
  }
}

export const calculate = (spec: CoilSpec) => run(() => designCoil(spec));
export const sweep = (spec: CoilSpec) => run(() => sweepWireSizes(spec));
export const solve = (req: CoilSolveRequest) => run(() => solveCoil(req.spec, req.target));
