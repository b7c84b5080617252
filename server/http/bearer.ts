import type { NextFunction, Request, RequestHandler, Response } from 'express';
import type { SessionUser } from '../../src/contracts/auth';
import type { Db } from '../db/client';
import { authenticateToken } from '../tokens/service';
import { HttpError } from './errors';

/** True when this request authenticated with an API token (`Authorization: Bearer …`). */
export const isTokenRequest = (req: Request) => Boolean((req.user as SessionUser | undefined)?.token);

/**
 * `Authorization: Bearer <secret>`: the request acts as the token says and never touches the
 * session (no cookie is read or set). An unknown or revoked secret is 401 at once — it does not
 * fall back to a cookie.
 */
export function bearerAuth(db: Db): RequestHandler {
  return async (req: Request, _res: Response, next: NextFunction) => {
    const header = req.get('authorization');
    if (!header) return next();
    const m = /^Bearer\s+(\S+)\s*$/i.exec(header);
    if (!m) return next(new HttpError(401, 'unauthenticated', 'The Authorization header must read "Bearer <token>"'));
    const user = await authenticateToken(db, m[1]);
    if (!user) return next(new HttpError(401, 'unauthenticated', 'This API token is unknown or revoked'));
    req.user = user;
    next();
  };
}

/** Runs `inner` (the session middlewares) only for requests that did not come with a token. */
export const unlessToken =
  (inner: RequestHandler): RequestHandler =>
  (req, res, next) =>
    isTokenRequest(req) ? next() : inner(req, res, next);

const OPEN_WHILE_CHANGE_REQUIRED = new Set(['GET /auth/me', 'POST /auth/logout', 'POST /auth/password', 'PATCH /me']);

/**
 * A user who must change their password (the first admin after `npm run setup`) may only read
 * who they are, choose their units, sign out and change it; every other route answers 403 `password_change_required`.
 */
export const requirePasswordChange: RequestHandler = (req, _res, next) => {
  const user = req.user as SessionUser | undefined;
  if (!user?.mustChangePassword || OPEN_WHILE_CHANGE_REQUIRED.has(`${req.method} ${req.path}`)) return next();
  next(new HttpError(403, 'password_change_required', 'Choose a new password before anything else (POST /api/auth/password)'));
};
