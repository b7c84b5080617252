/**
 * A live change put into the board the client holds (applyBoardDelta): the card leaves its old
 * column and takes its place in the new one by the board's order (priority, due date, id), the
 * counts and hours follow when the old card was on screen, an older version changes nothing, a
 * card the filters no longer admit leaves, and a change the client cannot place exactly says that
 * the totals need asking for. Boards and cards here are made up by hand for the check.
 */
import { describe, expect, it } from 'vitest';
import type { BoardCard, BoardDelta, BoardResponse } from '../../src/contracts/board';
import { applyBoardDelta } from '../../src/features/floor/api';

const card = (id: number, stage: BoardCard['stage'], over: Partial<BoardCard> = {}): BoardCard => ({
  id,
  number: `WO-26-${String(id).padStart(5, '0')}`,
  stage,
  version: 1,
  quantity: 10,
  dueDate: '2026-12-10',
  priority: 0,
  assignee: null,
  station: null,
  customer: { id: 1, name: 'Made-up Coil Buyer' },
  orderNumber: 'SO-2026-00001',
  title: 'Test coil',
  enteredStageAt: '2026-12-01T08:00:00.000Z',
  late: false,
  atRisk: false,
  estimatedHours: 2,
  holdReason: null,
  allowedMoves: [],
  ...over,
});

function board(): BoardResponse {
  const winding = [card(1, 'winding', { priority: 1 }), card(2, 'winding')];
  const terminating = [card(3, 'terminating', { dueDate: '2026-12-05' }), card(4, 'terminating', { dueDate: '2026-12-20' })];
  return {
    today: '2026-12-02',
    columns: [
      { stage: 'winding', count: 5, estimatedHours: 10, cards: winding, nextCursor: 'x' },
      { stage: 'terminating', count: 2, estimatedHours: 4, cards: terminating, nextCursor: null },
    ],
    choices: { people: [], stations: [], customers: [] },
  };
}

const delta = (c: BoardCard, kind: BoardDelta['kind'] = 'move'): BoardDelta => ({ kind, id: c.id, number: c.number, stage: c.stage, version: c.version, at: '2026-12-02T09:00:00.000Z', card: c });
const col = (b: BoardResponse, stage: string) => b.columns.find((c) => c.stage === stage)!;

describe('applyBoardDelta', () => {
  it('moves a card shown in one column to its place in another, counts and hours following', () => {
    // Card 2 (2 h in winding) moves on: 1.5 h left, due 10 Dec — between card 3 (5 Dec) and card 4 (20 Dec).
    const moved = card(2, 'terminating', { version: 2, estimatedHours: 1.5 });
    const { data, totalsKnown } = applyBoardDelta(board(), delta(moved), {});
    expect(totalsKnown).toBe(true);
    expect(col(data, 'winding')).toMatchObject({ count: 4, estimatedHours: 8 });
    expect(col(data, 'winding').cards.map((c) => c.id)).toEqual([1]);
    expect(col(data, 'terminating')).toMatchObject({ count: 3, estimatedHours: 5.5 });
    expect(col(data, 'terminating').cards.map((c) => c.id)).toEqual([3, 2, 4]);
  });

  it('ignores a version older than the one shown', () => {
    const b = board();
    const { data } = applyBoardDelta(b, delta(card(1, 'terminating', { version: 1 })), {});
    expect(data).toBe(b);
  });

  it('takes a card out when the filters no longer admit it', () => {
    const reassigned = card(1, 'winding', { version: 2, priority: 1, assignee: { id: 9, name: 'Someone Else' } });
    const { data } = applyBoardDelta(board(), delta(reassigned), { assignee: 7 });
    expect(col(data, 'winding').cards.map((c) => c.id)).toEqual([2]);
    expect(col(data, 'winding').count).toBe(4);
  });

  it('does not append past the cards loaded, and asks for totals when the old card was not on screen', () => {
    // An unseen work order lands in winding after the loaded cards (a column with more pages).
    const unseen = card(50, 'winding', { version: 3, dueDate: '2027-01-01' });
    const { data, totalsKnown } = applyBoardDelta(board(), delta(unseen), {});
    expect(col(data, 'winding').cards.map((c) => c.id)).toEqual([1, 2]);
    expect(totalsKnown).toBe(false);
    // A new work order (a release) was nowhere before: its totals are known.
    expect(applyBoardDelta(board(), delta(card(51, 'terminating', { dueDate: '2026-12-30' }), 'release'), {}).totalsKnown).toBe(true);
  });
});
