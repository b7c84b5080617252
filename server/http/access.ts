import type { NextFunction, Request, RequestHandler, Response } from 'express';
import { ROLES, type Role } from '../../src/contracts/roles';
import type { SessionUser } from '../../src/contracts/auth';
import { HttpError } from './errors';

/** Marks a handler with the rule it enforces, so a test can walk every route and find it. */
export type RuleHandler = RequestHandler & { accessRule: { public: true } | { roles: readonly Role[]; loopback?: true } };

/** Admits signed-in users whose role is listed; 401 when signed out, 403 for other roles. */
export function allow(...roles: Role[]): RuleHandler {
  for (const r of roles) if (!ROLES.includes(r)) throw new Error(`Unknown role ${r}`);
  const handler = ((req: Request, _res: Response, next: NextFunction) => {
    const user = req.user as SessionUser | undefined;
    if (!user) return next(new HttpError(401, 'unauthenticated', 'Sign in first'));
    if (!roles.includes(user.role)) return next(new HttpError(403, 'forbidden', 'Your role may not do this'));
    next();
  }) as RuleHandler;
  handler.accessRule = { roles };
  return handler;
}

/** Every signed-in role. */
export const anySignedIn = () => allow(...ROLES);

/** Declares a route open to anyone (health, sign-in). */
export function publicRoute(): RuleHandler {
  const handler = ((_req: Request, _res: Response, next: NextFunction) => next()) as RuleHandler;
  handler.accessRule = { public: true };
  return handler;
}

/** The signed-in user; only call behind `allow`. */
export function currentUser(req: Request): SessionUser {
  const user = req.user as SessionUser | undefined;
  if (!user) throw new HttpError(401, 'unauthenticated', 'Sign in first');
  return user;
}

/** Wraps an async handler (Express 5 forwards rejections itself; this keeps types tidy). */
export const handle =
  (fn: (req: Request, res: Response) => Promise<unknown> | unknown): RequestHandler =>
  async (req, res) => {
    await fn(req, res);
  };

/** A request made on this machine, not through a proxy (a forwarded request is never loopback). */
export function isDirectLoopback(req: Request): boolean {
  if (req.get('x-forwarded-for') || req.get('forwarded')) return false;
  const a = req.socket.remoteAddress ?? '';
  return a === '::1' || a.startsWith('127.') || a.startsWith('::ffff:127.');
}

/**
 * Admits a request from this machine itself (a scraper beside the app), or one signed in with one
 * of the roles (an API token: routes outside /api read no session); 401 / 403 otherwise.
 */
export function allowLoopbackOr(...roles: Role[]): RuleHandler {
  const inner = allow(...roles);
  const handler = ((req: Request, res: Response, next: NextFunction) => (isDirectLoopback(req) ? next() : inner(req, res, next))) as RuleHandler;
  handler.accessRule = { roles, loopback: true };
  return handler;
}
