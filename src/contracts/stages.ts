/**
 * The stages of a work order — the one list the client, the server and the database enum use.
 * Imports nothing but zod. Nothing else may repeat this list: import it.
 *
 * A work order walks the main flow in this order; `on_hold` and `rework` are side states it can
 * enter from a flow stage and leave back into the flow (the floor issue adds the move rules).
 */
import { z } from 'zod';

/** The main flow, in order. */
export const FLOW_STAGES = [
  'engineering',
  'ready',
  'winding',
  'terminating',
  'impregnating',
  'curing',
  'testing',
  'inspection',
  'packing',
  'shipped',
] as const;

/** Side states off the main flow. */
export const SIDE_STAGES = ['on_hold', 'rework'] as const;

/** Every stage: the flow, then the side states. */
export const STAGES = [...FLOW_STAGES, ...SIDE_STAGES] as const;
export type Stage = (typeof STAGES)[number];
export type FlowStage = (typeof FLOW_STAGES)[number];
export type SideStage = (typeof SIDE_STAGES)[number];

/** Plain words for each stage, for boards, tables and travelers. */
export const STAGE_LABELS: Record<Stage, string> = {
  engineering: 'Engineering',
  ready: 'Ready',
  winding: 'Winding',
  terminating: 'Terminating',
  impregnating: 'Impregnating',
  curing: 'Curing',
  testing: 'Testing',
  inspection: 'Inspection',
  packing: 'Packing',
  shipped: 'Shipped',
  on_hold: 'On hold',
  rework: 'Rework',
};

/** The stage a released work order starts in. */
export const RELEASED_STAGE: Stage = 'ready';

export const stageSchema = z.enum(STAGES, { error: `Stage: one of ${STAGES.join(', ')}` });

/** Position of a flow stage (0 = engineering); side states answer -1. */
export const flowIndex = (s: Stage) => (FLOW_STAGES as readonly string[]).indexOf(s);
