import connectPgSimple from 'connect-pg-simple';
import session from 'express-session';
import passport from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import type pg from 'pg';
import type { SessionUser } from '../../src/contracts/auth';
import type { Db } from '../db/client';
import { loadSessionUser, verifyCredentials } from '../users/service';

const PgStore = connectPgSimple(session);

export const SESSION_COOKIE = 'spoolwright.sid';
const EIGHT_HOURS = 8 * 60 * 60 * 1000;

/** Sessions stored in PostgreSQL, so any number of API processes can serve a user. */
export function sessionMiddleware(pool: pg.Pool, secret: string, secureCookies: boolean) {
  return session({
    name: SESSION_COOKIE,
    secret,
    store: new PgStore({ pool, tableName: 'session', createTableIfMissing: false, pruneSessionInterval: 15 * 60 }),
    resave: false,
    saveUninitialized: false,
    rolling: true,
    proxy: secureCookies,
    cookie: { httpOnly: true, sameSite: 'lax', secure: secureCookies ? 'auto' : false, maxAge: EIGHT_HOURS },
  });
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
