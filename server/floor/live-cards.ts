/**
 * What the live feed sends a board for each change: the change and the work order's card as that
 * user sees it. The card's facts are read once per change and process (however many boards are
 * open), then each user's allowed moves are worked out from them.
 */
import type { SessionUser } from '../../src/contracts/auth';
import type { BoardDelta } from '../../src/contracts/board';
import type { FloorChange } from '../../src/contracts/floor';
import type { Db } from '../db/client';
import { cardFacts, toCard, type CardFacts } from './board';

/** How long one change's facts are kept for the streams still rendering it, ms. */
const KEEP_MS = 5_000;

export function createLiveCards(db: Db) {
  const reads = new Map<string, Promise<CardFacts | null>>();

  function factsOf(change: FloorChange) {
    const key = `${change.id}@${change.version}`;
    let p = reads.get(key);
    if (!p) {
      p = cardFacts(db, [change.id]).then((m) => m.get(change.id) ?? null);
      reads.set(key, p);
      setTimeout(() => reads.delete(key), KEEP_MS).unref();
      p.catch(() => reads.delete(key));
    }
    return p;
  }

  return {
    async enrich(change: FloorChange, user: SessionUser): Promise<BoardDelta> {
      const f = await factsOf(change);
      return { ...change, card: f ? toCard(f, user) : null };
    },
  };
}
