import { createHash, randomBytes } from 'node:crypto';
import { and, desc, eq, isNull, lt, or } from 'drizzle-orm';
import { alias } from 'drizzle-orm/pg-core';
import type { SessionUser } from '../../src/contracts/auth';
import { TOKEN_PREFIX, type ApiTokenRecord, type IssueTokenRequest } from '../../src/contracts/tokens';
import type { Db } from '../db/client';
import { apiTokens, users } from '../db/schema';
import { notFound, ruleBroken } from '../http/errors';
import { toSessionUser } from '../users/service';

/** SHA-256 of a secret, hex: what the table keeps (a secret of 32 random bytes needs no slow hash). */
export const hashToken = (secret: string) => createHash('sha256').update(secret, 'utf8').digest('hex');

/** A new secret: the prefix and 32 random bytes, base64url. */
export const newSecret = () => TOKEN_PREFIX + randomBytes(32).toString('base64url');

/** Last use is written at most this often per token, so a busy integration does not write on every call. */
const LAST_USED_EVERY_MS = 60_000;

const issuer = alias(users, 'issuer');

function toRecord(t: typeof apiTokens.$inferSelect, issuedBy: { id: number; name: string }): ApiTokenRecord {
  return {
    id: t.id,
    name: t.name,
    role: t.role as ApiTokenRecord['role'],
    prefix: t.prefix,
    issuedBy,
    createdAt: t.createdAt.toISOString(),
    lastUsedAt: t.lastUsedAt?.toISOString() ?? null,
    revokedAt: t.revokedAt?.toISOString() ?? null,
  };
}

export async function listTokens(db: Db): Promise<ApiTokenRecord[]> {
  const rows = await db
    .select({ t: apiTokens, issuerId: issuer.id, issuerName: issuer.name })
    .from(apiTokens)
    .innerJoin(issuer, eq(issuer.id, apiTokens.issuedBy))
    .orderBy(desc(apiTokens.createdAt), desc(apiTokens.id));
  return rows.map((r) => toRecord(r.t, { id: r.issuerId, name: r.issuerName }));
}

/** Issues a token; the secret is returned this once and only its hash is stored. */
export async function issueToken(db: Db, input: IssueTokenRequest, actor: SessionUser) {
  if (actor.token) throw ruleBroken('A token cannot issue tokens; sign in as an admin');
  const secret = newSecret();
  const [row] = await db
    .insert(apiTokens)
    .values({ name: input.name, role: input.role, tokenHash: hashToken(secret), prefix: secret.slice(0, TOKEN_PREFIX.length + 6), issuedBy: actor.id })
    .returning();
  return { token: toRecord(row, { id: actor.id, name: actor.name }), secret };
}

export async function revokeToken(db: Db, id: number, actor: SessionUser): Promise<ApiTokenRecord> {
  await db
    .update(apiTokens)
    .set({ revokedAt: new Date(), revokedBy: actor.id })
    .where(and(eq(apiTokens.id, id), isNull(apiTokens.revokedAt)));
  const [row] = await db
    .select({ t: apiTokens, issuerId: issuer.id, issuerName: issuer.name })
    .from(apiTokens)
    .innerJoin(issuer, eq(issuer.id, apiTokens.issuedBy))
    .where(eq(apiTokens.id, id));
  if (!row) throw notFound('No such token');
  return toRecord(row.t, { id: row.issuerId, name: row.issuerName });
}

/**
 * The user a bearer secret stands for: the issuing admin's identity in the token's role, or
 * null when the secret is unknown, revoked, or its issuer is no longer an active admin.
 */
export async function authenticateToken(db: Db, secret: string): Promise<SessionUser | null> {
  if (!secret.startsWith(TOKEN_PREFIX) || secret.length > 200) return null;
  const [row] = await db
    .select({ t: apiTokens, issuer: users })
    .from(apiTokens)
    .innerJoin(users, eq(users.id, apiTokens.issuedBy))
    .where(and(eq(apiTokens.tokenHash, hashToken(secret)), isNull(apiTokens.revokedAt)));
  if (!row || !row.issuer.active || row.issuer.role !== 'admin') return null;
  const now = new Date();
  await db
    .update(apiTokens)
    .set({ lastUsedAt: now })
    .where(and(eq(apiTokens.id, row.t.id), or(isNull(apiTokens.lastUsedAt), lt(apiTokens.lastUsedAt, new Date(now.getTime() - LAST_USED_EVERY_MS)))));
  const base = toSessionUser(row.issuer);
  return { ...base, mustChangePassword: undefined, role: row.t.role, customerId: null, token: { id: row.t.id, name: row.t.name } };
}
