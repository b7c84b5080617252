/**
 * API contract of API tokens: how another system (an ERP, a label printer script) calls the API.
 * Imports nothing but zod.
 *
 * Routes (admin):
 *   GET    /api/tokens        → { tokens: ApiTokenRecord[] }
 *   POST   /api/tokens        body IssueTokenRequest → 201 { token: ApiTokenRecord, secret } (the secret is shown this once)
 *   POST   /api/tokens/:id/revoke → { token: ApiTokenRecord }
 *
 * A request sends `Authorization: Bearer <secret>`; it needs no cookie and no X-Requested-By
 * header, and is admitted exactly where the token's role is.
 */
import { z } from 'zod';
import { STAFF_ROLES } from './roles';

/** Every secret starts with this, so a leaked one is easy to recognise in logs and code. */
export const TOKEN_PREFIX = 'swt_';

export const issueTokenRequest = z.object({
  name: z.string().trim().min(1, 'Name what the token is for').max(80, 'At most 80 characters'),
  role: z.enum(STAFF_ROLES, { message: `One of: ${STAFF_ROLES.join(', ')}` }),
});
export type IssueTokenRequest = z.infer<typeof issueTokenRequest>;

export const apiTokenRecord = z.object({
  id: z.number().int(),
  name: z.string(),
  role: z.enum(STAFF_ROLES),
  /** The secret's first characters, to tell tokens apart. */
  prefix: z.string(),
  issuedBy: z.object({ id: z.number().int(), name: z.string() }),
  createdAt: z.string(),
  lastUsedAt: z.string().nullable(),
  revokedAt: z.string().nullable(),
});
export type ApiTokenRecord = z.infer<typeof apiTokenRecord>;

export const tokenListResponse = z.object({ tokens: z.array(apiTokenRecord) });
export const issueTokenResponse = z.object({ token: apiTokenRecord, secret: z.string() });
export type IssueTokenResponse = z.infer<typeof issueTokenResponse>;
