import { Router, type NextFunction, type Request, type Response } from 'express';
import type { configurePassport } from './session';
import { loginRequest, type SessionUser } from '../../src/contracts/auth';
import { changePasswordRequest } from '../../src/contracts/users';
import type { Db } from '../db/client';
import { changeOwnPassword } from '../users/service';
import { anySignedIn, currentUser, publicRoute } from '../http/access';
import { HttpError, parse } from '../http/errors';
import type { LoginLimiter } from './limiter';
import { SESSION_COOKIE } from './session';

export function authRouter(passport: ReturnType<typeof configurePassport>, limiter: LoginLimiter, db: Db) {
  const r = Router();

  r.post('/auth/login', publicRoute(), async (req: Request, res: Response, next: NextFunction) => {
    if ((req.user as SessionUser | undefined)?.token) throw new HttpError(400, 'validation', 'A request with an API token needs no sign-in');
    const { email } = parse(loginRequest, req.body);
    const ip = req.ip ?? 'unknown';
    const wait = await limiter.blockedFor(email, ip);
    if (wait > 0) {
      res.set('Retry-After', String(wait));
      throw new HttpError(429, 'too_many_requests', `Too many failed sign-ins; try again in ${Math.ceil(wait / 60)} min`);
    }
    passport.authenticate('local', { session: false }, async (err: unknown, user: SessionUser | false) => {
      if (err) return next(err);
      if (!user) {
        await limiter.failed(email, ip);
        return next(new HttpError(401, 'unauthenticated', 'E-mail or password is not right'));
      }
      await limiter.succeeded(email, ip);
      // passport regenerates the session id here, so a planted id never becomes a signed-in one.
      req.login(user, (loginErr) => {
        if (loginErr) return next(loginErr);
        res.json({ user });
      });
    })(req, res, next);
  });

  r.post('/auth/logout', anySignedIn(), (req, res, next) => {
    if (currentUser(req).token) return void res.status(204).end();
    req.logout((err) => {
      if (err) return next(err);
      req.session.destroy(() => {
        res.clearCookie(SESSION_COOKIE);
        res.status(204).end();
      });
    });
  });

  r.get('/auth/me', anySignedIn(), (req, res) => {
    res.json({ user: currentUser(req) });
  });

  r.post('/auth/password', anySignedIn(), async (req, res) => {
    const me = currentUser(req);
    if (me.token) throw new HttpError(403, 'forbidden', 'An API token has no password');
    const user = await changeOwnPassword(db, me.id, parse(changePasswordRequest, req.body), req.sessionID);
    req.user = user;
    res.json({ user });
  });

  return r;
}
