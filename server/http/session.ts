import session from 'express-session';
import connectPgSimple from 'connect-pg-simple';
import passport from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import pg from 'pg';
import type express from 'express';
import type { EntityManager } from '@mikro-orm/postgresql';
import type { AppDeps } from '../app-deps';
import { User } from '../modules/users/user.entity';
import { toActor, verifyCredentials } from '../modules/auth/auth.service';
import type { Actor } from './actor';

export const SESSION_COOKIE = 'pullbook.sid';

/**
 * Cookie sessions stored in PostgreSQL (table http_session), so any app instance can serve any
 * request. The user row is re-read on every request: disabling a user or changing a role takes
 * effect at once.
 */
export function installSessions(app: express.Express, deps: AppDeps) {
  const PgStore = connectPgSimple(session);
  const pool = new pg.Pool({ connectionString: deps.config.DATABASE_URL, max: 10 });
  const secure = deps.config.PUBLIC_URL.startsWith('https://');
  if (secure) app.set('trust proxy', 1);

  app.use(
    session({
      name: SESSION_COOKIE,
      // No touch on every request: a session lasts 12 h from sign-in (a working day), and reads
      // stay reads — one write per request would dominate the cost of light API calls.
      store: new PgStore({ pool, tableName: 'http_session', createTableIfMissing: false, pruneSessionInterval: 15 * 60, disableTouch: true }),
      secret: deps.config.SESSION_SECRET,
      resave: false,
      saveUninitialized: false,
      rolling: false,
      cookie: { httpOnly: true, sameSite: 'lax', secure, maxAge: 12 * 3600 * 1000 },
    }),
  );

  passport.use(
    new LocalStrategy({ usernameField: 'email', passwordField: 'password', passReqToCallback: true }, (req, email, password, done) => {
      const em = req.res!.locals.em as EntityManager;
      verifyCredentials(em, email, password, req.ip ?? 'unknown').then(
        (user) => done(null, user ?? false),
        (err) => done(err),
      );
    }),
  );
  passport.serializeUser((actor, done) => done(null, (actor as Actor).id));
  passport.deserializeUser((id: string, done) => {
    deps.orm.em
      .fork()
      .findOne(User, { id })
      .then(
        (user) => done(null, user && !user.disabled ? toActor(user) : false),
        (err) => done(err),
      );
  });

  app.use(passport.initialize());
  app.use(passport.session());

  return { close: () => pool.end() };
}
