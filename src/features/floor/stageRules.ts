/**
 * What the floor screens need to know about moves before asking the server: which columns the
 * board shows, the next stage, and whether a move will need a note or the winding record. The
 * server's move table decides for real (a refused move answers 422 naming the rule); this only
 * lets the screens ask for the note up front instead of after a refusal.
 */
import { FLOW_STAGES, SIDE_STAGES, STAGE_LABELS, flowIndex, type Stage } from '../../contracts/stages';

/** The board's columns (the contract's list). */
export { BOARD_STAGES } from '../../contracts/board';

const isSide = (s: Stage) => (SIDE_STAGES as readonly string[]).includes(s);

/** The next flow stage, or null (side states and the end of the flow have none). */
export function nextStage(s: Stage): Stage | null {
  const i = flowIndex(s);
  if (i < 0 || i >= FLOW_STAGES.length - 1) return null;
  return FLOW_STAGES[i + 1] ?? null;
}

export function previousStage(s: Stage): Stage | null {
  const i = flowIndex(s);
  if (i <= 0) return null;
  return FLOW_STAGES[i - 1] ?? null;
}

/** 'reason' (a hold), 'required' (rework, any backward move) or 'optional'. */
export type NoteNeed = 'reason' | 'required' | 'optional';

export function noteNeed(from: Stage, to: Stage): NoteNeed {
  if (to === 'on_hold') return 'reason';
  if (to === 'rework') return 'required';
  if (isSide(from) || isSide(to)) return 'optional';
  return flowIndex(to) < flowIndex(from) ? 'required' : 'optional';
}

/** Leaving winding forward records the turns counter, the spool lot and the station. */
export const needsWindingRecord = (from: Stage, to: Stage) => from === 'winding' && flowIndex(to) > flowIndex('winding');

/** A move described in plain words: "Winding → Terminating". */
export const moveWords = (from: Stage, to: Stage) => `${STAGE_LABELS[from]} → ${STAGE_LABELS[to]}`;

/** How far back a move goes, for the button's look. */
export function moveDirection(from: Stage, to: Stage): 'forward' | 'back' | 'side' {
  if (isSide(to) || isSide(from)) return 'side';
  return flowIndex(to) > flowIndex(from) ? 'forward' : 'back';
}
