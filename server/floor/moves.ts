/**
 * The move table of the floor service: which stage moves are allowed and by which roles. One
 * table (MOVE_TABLE) plus the checks every move passes in order (checkMove). Pure: no database;
 * the service gathers the facts (the work order, who acts, the stage a hold was taken in, the
 * unit-test state) and asks here. The stage list is src/contracts/stages.ts.
 */
import type { Role } from '../../src/contracts/roles';
import { FLOOR_STAGES, type MoveRule } from '../../src/contracts/floor';
import { SIDE_STAGES, STAGES, flowIndex, type Stage } from '../../src/contracts/stages';

/** What kind of move a (from, to) pair is. */
export type MoveKind = 'forward' | 'back' | 'skip_ahead' | 'skip_back' | 'hold' | 'rework' | 'resume';

type MoveRow = {
  /** Roles that may make this kind of move (besides the gates and the rules below). */
  roles: readonly Role[];
  /** The note is: optional, a required reason (on_hold) or required (reverse moves, rework). */
  note: 'optional' | 'reason' | 'required';
  /** For floor staff: whose work they may move this way. */
  floorWork?: 'mine_or_unassigned' | 'mine';
  /** Plain words for messages. */
  words: string;
};

/**
 * THE move table. Floor staff move forward one flow stage at a time within the floor stages
 * (ready … packing) on work assigned to them or unassigned, and step back one stage on their own
 * work with a note; the foreman and the admin move anything anywhere, except past the gates
 * (checkMove). Mistakes are undone by a reverse move with a note, never by deleting history.
 */
export const MOVE_TABLE: Record<MoveKind, MoveRow> = {
  forward: { roles: ['floor', 'foreman', 'admin'], note: 'optional', floorWork: 'mine_or_unassigned', words: 'move it on one stage' },
  back: { roles: ['floor', 'foreman', 'admin'], note: 'required', floorWork: 'mine', words: 'step it back one stage' },
  skip_ahead: { roles: ['foreman', 'admin'], note: 'optional', words: 'move it ahead past a stage' },
  skip_back: { roles: ['foreman', 'admin'], note: 'required', words: 'send it back past a stage' },
  hold: { roles: ['foreman', 'admin'], note: 'reason', words: 'put it on hold' },
  rework: { roles: ['foreman', 'admin'], note: 'required', words: 'send it to rework' },
  resume: { roles: ['foreman', 'admin'], note: 'optional', words: 'take it off hold or out of rework' },
};

/** Roles the move route admits (everyone any row of the table lists). */
export const MOVERS = [...new Set(Object.values(MOVE_TABLE).flatMap((r) => r.roles))] as Role[];

const isSide = (s: Stage) => (SIDE_STAGES as readonly string[]).includes(s);
const isFloorStage = (s: Stage) => FLOOR_STAGES.includes(s);

/** The kind of a move between two different stages, neither shipped, not side → side. */
export function moveKind(from: Stage, to: Stage): MoveKind {
  if (to === 'on_hold') return 'hold';
  if (to === 'rework') return 'rework';
  if (isSide(from)) return 'resume';
  const d = flowIndex(to) - flowIndex(from);
  if (d === 1) return 'forward';
  if (d === -1) return 'back';
  return d > 0 ? 'skip_ahead' : 'skip_back';
}

/**
 * Whether every unit of a work order has its test passed or dispositioned.
 *   'not_tracked' — test records do not exist yet: nothing to check, nothing claimed.
 *   'clear'       — every unit passed or was dispositioned (from test records).
 *   'open'        — units still lack a passed test or a disposition.
 */
export type UnitTestState = { state: 'not_tracked' } | { state: 'clear' } | { state: 'open'; outstanding: number };

/** The facts a move is judged on. */
export type MoveFacts = {
  actor: { id: number; role: Role };
  workOrder: { stage: Stage; assigneeId: number | null };
  to: Stage;
  note?: string;
  /** While on_hold: the stage the hold was taken in (from its hold event); null otherwise. */
  heldFrom: Stage | null;
  /** The unit-test part of the packing gate (see unitTestGate in service.ts). */
  unitTests: UnitTestState;
  /** Winding data sent with the move, and the station it names or the work order has. */
  turnsCounter?: number;
  spoolLot?: string;
  stationId: number | null;
};

export type Refusal = {
  rule: MoveRule;
  message: string;
  fields?: Record<string, string>;
  /** The user can satisfy it by adding to the request (a note, the winding record). */
  supplyable?: boolean;
};

const refuse = (rule: MoveRule, message: string, fields?: Record<string, string>, supplyable = false): Refusal => ({ rule, message, fields, supplyable });

/**
 * Inspection signed: the move into packing comes from inspection (making the move is the
 * signature of whoever makes it), or returns from a hold that was taken in packing (it was signed
 * before the hold). Anything else — a jump from an earlier stage, leaving rework — is refused.
 */
export function inspectionSigned(from: Stage, heldFrom: Stage | null): boolean {
  return from === 'inspection' || (from === 'on_hold' && heldFrom === 'packing');
}

/** The packing gate: inspection signed, and no unit left untested (once test records exist). */
function packingGate(f: MoveFacts): Refusal | null {
  if (!inspectionSigned(f.workOrder.stage, f.heldFrom)) {
    return refuse('packing_gate', 'Packing needs inspection signed: move it into packing from inspection');
  }
  if (f.unitTests.state === 'open') {
    return refuse('packing_gate', `Packing needs every unit's test passed or dispositioned: ${f.unitTests.outstanding} unit(s) still open`);
  }
  // 'not_tracked': test records arrive with a later issue; nothing is claimed about tests here.
  return null;
}

/** Judges one move; null = allowed. Checks run in this order; the first refusal is the answer. */
export function checkMove(f: MoveFacts): Refusal | null {
  const from = f.workOrder.stage;
  const to = f.to;
  if (from === to) return refuse('same_stage', `It is already in ${to}`);
  if (from === 'shipped') return refuse('shipped_is_final', 'A shipped work order does not move');
  if (to === 'shipped') return refuse('shipped_by_shipment', 'Only a shipment sets a work order to shipped');
  if (isSide(from) && isSide(to)) return refuse('side_returns_to_flow', `Leaving ${from} goes back to a flow stage, chosen by the foreman`);

  const kind = moveKind(from, to);
  const row = MOVE_TABLE[kind];
  const role = f.actor.role;
  if (!row.roles.includes(role)) {
    if (role === 'floor') {
      if (kind === 'skip_ahead' || kind === 'skip_back') return refuse('floor_one_step', 'Floor staff move one stage at a time');
      return refuse('floor_stages_only', `Floor staff may not ${row.words}; ask the foreman`);
    }
    return refuse('floor_stages_only', `Your role may not ${row.words}`);
  }
  if (role === 'floor') {
    if (!isFloorStage(from) || !isFloorStage(to)) return refuse('floor_stages_only', `Floor staff move work only within ${FLOOR_STAGES.join(', ')}`);
    const mine = f.workOrder.assigneeId === f.actor.id;
    if (row.floorWork === 'mine' && !mine) return refuse('floor_back_own_only', 'Floor staff step back only work assigned to them');
    if (row.floorWork === 'mine_or_unassigned' && !mine && f.workOrder.assigneeId !== null) {
      return refuse('floor_not_yours', 'It is assigned to someone else; ask the foreman to reassign it');
    }
  }
  const note = f.note?.trim() ?? '';
  if (row.note === 'reason' && !note) return refuse('hold_needs_reason', 'Putting a work order on hold needs a reason', { note: 'Say why it is on hold' }, true);
  if (row.note === 'required' && !note) return refuse('note_required', `To ${row.words}, write a note saying why`, { note: 'Say why' }, true);

  if (to === 'packing') {
    const gate = packingGate(f);
    if (gate) return gate;
  }

  const leavingWindingForward = from === 'winding' && flowIndex(to) > flowIndex('winding');
  if (leavingWindingForward) {
    const missing: Record<string, string> = {};
    if (f.turnsCounter === undefined) missing.turnsCounter = 'Enter the turns counter reading';
    if (!f.spoolLot) missing.spoolLot = 'Enter the spool lot you wound from';
    if (f.stationId === null) missing.stationId = 'Pick the winding station';
    if (Object.keys(missing).length) return refuse('winding_record', 'Finishing winding records the turns counter, the spool lot and the station', missing, true);
  } else if (f.turnsCounter !== undefined || f.spoolLot !== undefined) {
    const fields: Record<string, string> = {};
    if (f.turnsCounter !== undefined) fields.turnsCounter = 'Recorded only when winding is finished';
    if (f.spoolLot !== undefined) fields.spoolLot = 'Recorded only when winding is finished';
    return refuse('winding_data_misplaced', 'The turns counter and spool lot are recorded when winding is finished', fields);
  }
  return null;
}

/**
 * The stages a user may move a work order to now: every stage the table allows, counting moves
 * that only need a note or the winding record as allowed (the client asks for them).
 */
export function allowedMoves(f: Omit<MoveFacts, 'to' | 'note' | 'turnsCounter' | 'spoolLot'>): Stage[] {
  return STAGES.filter((to) => {
    const r = checkMove({ ...f, to, note: 'x', stationId: f.stationId ?? 0, turnsCounter: undefined, spoolLot: undefined });
    return r === null || r.supplyable === true || r.rule === 'winding_record';
  });
}

