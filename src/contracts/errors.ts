import { z } from 'zod';

/** Machine-readable error codes the API answers with. */
export const ERROR_CODES = [
  'validation',
  'bad_json',
  'unauthenticated',
  'forbidden',
  'csrf',
  /** Signed in with a password someone else chose: change it first (POST /api/auth/password). */
  'password_change_required',
  'not_found',
  'conflict',
  'rule',
  'too_many_requests',
  'payload_too_large',
  'unsupported_media_type',
  'unavailable',
  'internal',
] as const;
export type ErrorCode = (typeof ERROR_CODES)[number];

/** The one error shape of every API failure. */
export const apiErrorBody = z.object({
  error: z.object({
    code: z.string(),
    message: z.string(),
    fields: z.record(z.string(), z.string()).optional(),
    current: z.unknown().optional(),
    /** Which rule refused a move (see MOVE_RULES in floor.ts). */
    rule: z.string().optional(),
  }),
});
export type ApiErrorBody = z.infer<typeof apiErrorBody>;

/** Header every state-changing request must carry (cross-site request defence). */
export const CSRF_HEADER = 'X-Requested-By';
export const CSRF_VALUE = 'spoolwright';
