/**
 * HOOK POINT for the test-record check of the packing gate.
 *
 * The packing gate needs every unit's test passed or dispositioned. Test records do not exist
 * yet (they arrive with a later issue), so there is nothing to check: this answers
 * `{ state: 'not_tracked' }` for every work order. It never answers 'clear' — the server does not
 * claim tests passed that nobody recorded. The test-record issue replaces the body with a lookup
 * (units with a passing or dispositioned record vs the work order's quantity) answering 'clear'
 * or 'open' with the count outstanding; checkMove (moves.ts) already refuses 'open'.
 */
import type { Db, Tx } from '../db/client';
import type { UnitTestState } from './moves';

export async function unitTestGate(_db: Db | Tx, workOrderIds: number[]): Promise<Map<number, UnitTestState>> {
  return new Map(workOrderIds.map((id) => [id, { state: 'not_tracked' } as const]));
}
