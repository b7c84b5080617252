import connectPgSimple from 'connect-pg-simple';
import { RedisStore } from 'connect-redis';
import session from 'express-session';
import type { Redis } from 'ioredis';
import passport from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import type pg from 'pg';
import type { SessionUser } from '../../src/contracts/auth';
import type { Db } from '../db/client';
import { loadSessionUser, verifyCredentials } from '../users/service';

const PgStore = connectPgSimple(session);

export const SESSION_COOKIE = 'spoolwright.sid';
const EIGHT_HOURS = 8 * 60 * 60 * 1000;

export type SessionStoreKind = 'postgres' | 'redis';

/**
 * Sessions kept on the server, so any number of API processes serve a user and a restarted API
 * keeps everyone signed in: in PostgreSQL (the default, table `session`: one SELECT per request, the
 * expiry written at most every TOUCH_EVERY_MS) or in Redis (`SESSION_STORE=redis`: one GET and one
 * EXPIRE per request, keys `sess:<id>`; faster, but then no one stays signed in while Redis is
 * away). The cookie holds only the signed session id.
 */
export function sessionMiddleware(opts: { kind: SessionStoreKind; pool: pg.Pool; redis: Redis | null; secret: string; secureCookies: boolean }) {
  const store =
    opts.kind === 'redis' && opts.redis
      ? new RedisStore({ client: opts.redis, prefix: 'sess:', ttl: EIGHT_HOURS / 1000 })
      : throttleTouch(new PgStore({ pool: opts.pool, tableName: 'session', createTableIfMissing: false, pruneSessionInterval: 15 * 60 }));
  return session({
    name: SESSION_COOKIE,
    secret: opts.secret,
    store,
    resave: false,
    saveUninitialized: false,
    rolling: true,
    proxy: opts.secureCookies,
    cookie: { httpOnly: true, sameSite: 'lax', secure: opts.secureCookies ? 'auto' : false, maxAge: EIGHT_HOURS },
  });
}

/** How often one process pushes a session's expiry forward in PostgreSQL at most. */
export const TOUCH_EVERY_MS = 5 * 60 * 1000;

/**
 * A rolling session's expiry moves on with every request; writing that to PostgreSQL on every
 * request (an UPDATE per read) is most of a signed-in request's cost. This process writes it at
 * most once per TOUCH_EVERY_MS per session, so a session still ends EIGHT_HOURS after its last use,
 * give or take those minutes.
 */
function throttleTouch<S extends session.Store>(store: S): S {
  const touched = new Map<string, number>();
  const touch = store.touch?.bind(store);
  if (!touch) return store;
  store.touch = (sid, sess, cb) => {
    const now = Date.now();
    const last = touched.get(sid);
    if (last !== undefined && now - last < TOUCH_EVERY_MS) return cb?.();
    if (touched.size > 100_000) touched.clear();
    touched.set(sid, now);
    touch(sid, sess, cb);
  };
  const destroy = store.destroy.bind(store);
  store.destroy = (sid, cb) => {
    touched.delete(sid);
    destroy(sid, cb);
  };
  return store;
}

/** passport-local against the users table; the session keeps only the user id. */
export function configurePassport(db: Db) {
  const p = new passport.Passport();
  p.use(
    new LocalStrategy({ usernameField: 'email', passwordField: 'password' }, (email, password, done) => {
      verifyCredentials(db, email, password).then((u) => done(null, u ?? false), done);
    }),
  );
  p.serializeUser((user, done) => done(null, (user as SessionUser).id));
  p.deserializeUser((id: number, done) => {
    loadSessionUser(db, id).then((u) => done(null, u ?? false), done);
  });
  return p;
}
