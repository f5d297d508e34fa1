import session from 'express-session';
import connectPgSimple from 'connect-pg-simple';
import passport from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import pg from 'pg';
import { AsyncLocalStorage } from 'node:async_hooks';
import type express from 'express';
import type { EntityManager } from '@mikro-orm/postgresql';
import type { AppDeps } from '../app-deps';
import { verifyCredentials } from '../modules/auth/auth.service';
import type { Actor } from './actor';
import { asQuery } from '../db/prepared-query';
import { logger } from '../lib/logger';
import { isDatabaseUnavailable } from '../lib/db-errors';

export const SESSION_COOKIE = 'pullbook.sid';

const isApiPath = (p: string) => p === '/api' || p.startsWith('/api/');
/** Session rows (Migration20261201220500). */
const SESSION_TABLE = 'http_session';

interface ActorRow {
  id: string;
  shop_id: string;
  role: Actor['role'];
  email: string;
  name: string;
  customer_id: string | null;
}

const toActorFromRow = (row: ActorRow): Actor => ({ id: row.id, shopId: row.shop_id, role: row.role, email: row.email, name: row.name, customerId: row.customer_id });

/**
 * The signed-in user read together with the session, handed to passport's deserializeUser in
 * the same request (one query instead of two on every request).
 */
interface SessionLoad {
  userId?: string;
  actor?: Actor | null;
}
const sessionLoad = new AsyncLocalStorage<SessionLoad>();

// Session and user in one prepared statement; the user columns are null when the session has
// no signed-in user, the user is gone, or the user is disabled. The id is cast (when it looks
// like one) rather than app_user.id cast to text, so the primary key index is used.
const SESSION_WITH_USER = {
  name: 'pullbook-session-with-user',
  text: `select s.sess, u.id, u.shop_id, u.role, u.email, u.name, u.customer_id
           from ${SESSION_TABLE} s
           left join app_user u on u.id = (case when s.sess->'passport'->>'user' ~* '^[0-9a-f-]{36}$' then (s.sess->'passport'->>'user')::uuid end)
                                and not u.disabled
          where s.sid = $1 and s.expire >= now()`,
};
const ACTIVE_USER = { name: 'pullbook-active-user', text: 'select id, shop_id, role, email, name, customer_id from app_user where id = $1 and not disabled' };

/**
 * Cookie sessions stored in PostgreSQL (table http_session), so any app instance can serve any
 * request. The user row is re-read on every request (with the session, in one query): disabling
 * a user or changing a role takes effect at once.
 */
export function installSessions(app: express.Express, deps: AppDeps) {
  const PgStore = connectPgSimple(session);
  /**
   * connect-pg-simple's store, with a read that also loads the session's user. Its other methods
   * are the library's; express-session calls touch() on every answered request, which (though
   * touching itself is off) starts the library's timer that prunes expired sessions.
   */
  class SessionStore extends PgStore {
    override get(sid: string, fn: (err: unknown, sess?: session.SessionData | null) => void) {
      pool.query<{ sess: session.SessionData & { passport?: { user?: string } } } & Partial<ActorRow>>(asQuery(SESSION_WITH_USER, [sid])).then(
        ({ rows: [row] }) => {
          if (!row) return fn(null, null);
          const load = sessionLoad.getStore();
          const userId = row.sess.passport?.user;
          if (load && userId) {
            load.userId = userId;
            load.actor = row.id ? toActorFromRow(row as ActorRow) : null;
          }
          return fn(null, row.sess);
        },
        (err) => fn(err),
      );
    }
  }
  const pool = new pg.Pool({ connectionString: deps.config.DATABASE_URL, max: 10 });
  // An idle connection cut by the server (restart, failover) is dropped by the pool and replaced
  // on the next query; without a listener the 'error' event would end the process.
  pool.on('error', (err) => logger.warn({ err }, 'session pool: an idle database connection was lost'));
  const secure = deps.config.PUBLIC_URL.startsWith('https://');
  if (secure) app.set('trust proxy', 1);

  app.use((_req, _res, next) => sessionLoad.run({}, next));
  const sessions = session({
    name: SESSION_COOKIE,
    // No touch on every request: a session lasts 12 h from sign-in (a working day), and reads
    // stay reads — one write per request would dominate the cost of light API calls.
    store: new SessionStore({
      pool,
      tableName: SESSION_TABLE,
      createTableIfMissing: false,
      pruneSessionInterval: 15 * 60,
      disableTouch: true,
      errorLog: (...args: unknown[]) => logger.warn({ detail: args.map(String) }, 'session store'),
    }),
    secret: deps.config.SESSION_SECRET,
    resave: false,
    saveUninitialized: false,
    rolling: false,
    cookie: { httpOnly: true, sameSite: 'lax', secure, maxAge: 12 * 3600 * 1000 },
  });
  // While the database is down, API requests fail (503 from the error handler), but the app
  // shell and static files need no session: they are served without one.
  app.use((req, res, next) =>
    sessions(req, res, (err?: unknown) => {
      if (!err || isApiPath(req.path) || !isDatabaseUnavailable(err)) return next(err);
      logger.warn({ err, reqId: res.locals.requestId }, 'session not read (database unavailable); serving without it');
      next();
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
  // Usually the user came with the session; otherwise one plain query (no ORM unit of work).
  passport.deserializeUser((id: string, done: (err: unknown, user?: Actor | false) => void) => {
    const load = sessionLoad.getStore();
    if (load?.userId === id && load.actor !== undefined) return done(null, load.actor ?? false);
    pool.query<ActorRow>(asQuery(ACTIVE_USER, [id])).then(
      ({ rows: [row] }) => done(null, row ? toActorFromRow(row) : false),
      (err) => done(err),
    );
  });

  app.use(passport.initialize());
  const passportSession = passport.session();
  // No session means it could not be read (see above): the request goes on signed out.
  app.use((req, res, next) => (req.session ? passportSession(req, res, next) : next()));

  return { close: () => pool.end() };
}
