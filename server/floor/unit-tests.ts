/**
 * The test-record check of the packing gate. Each unit's latest test record decides it; the rule
 * (passed or dispositioned units vs the good quantity, no open failure) is documented and
 * implemented in server/test-records/service.ts (unitTestStates). It answers 'clear' or 'open'
 * with the count outstanding; checkMove (moves.ts) refuses 'open'. A work order without records
 * is 'open': the server does not claim tests passed that nobody recorded.
 */
import type { Db, Tx } from '../db/client';
import { unitTestStates } from '../test-records/service';
import type { UnitTestState } from './moves';

export async function unitTestGate(db: Db | Tx, workOrderIds: number[]): Promise<Map<number, UnitTestState>> {
  return unitTestStates(db, workOrderIds);
}
