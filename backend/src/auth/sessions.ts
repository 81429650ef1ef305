import { randomBytes } from 'node:crypto';
import connectPgSimple from 'connect-pg-simple';
import type { RequestHandler, Request } from 'express';
import session from 'express-session';
import type { SessionConfig } from '../config';
import type { Database } from '../db/database';
import type { Logger } from '../logger';

export const SESSION_COOKIE = 'spanledger.sid';

/** connect-pg-simple accepts any object with pg-promise's `any`; this one runs on Knex's own pool. */
function knexQueryRunner(db: Database) {
  return {
    async any(sql: string, parameters: unknown[]) {
      const connection = (await db.client.acquireConnection()) as { query(sql: string, values: unknown[]): Promise<{ rows: unknown[] }> };
      try {
        return (await connection.query(sql, parameters)).rows;
      } finally {
        await db.client.releaseConnection(connection);
      }
    },
  };
}

/**
 * Sessions in PostgreSQL (`user_sessions`). The cookie is HttpOnly and SameSite=Lax; every
 * response pushes its expiry forward, so it lapses after the idle timeout.
 */
export function sessions(config: SessionConfig, db: Database, logger: Logger): RequestHandler {
  const PgStore = connectPgSimple(session);
  const store = new PgStore({
    pgPromise: knexQueryRunner(db),
    tableName: 'user_sessions',
    createTableIfMissing: false,
    errorLog: (...parts: unknown[]) => logger.error({ parts }, 'session store error'),
  });
  return session({
    name: SESSION_COOKIE,
    secret: config.secret,
    store,
    resave: false,
    saveUninitialized: false,
    rolling: true,
    cookie: { httpOnly: true, sameSite: 'lax', secure: config.secureCookies, maxAge: config.idleTimeoutMs, path: '/' },
  });
}

/** Puts the session's user on `req.user`, ending sessions older than the absolute timeout. */
export function currentUser(config: SessionConfig): RequestHandler {
  return (req, _res, next) => {
    const { user, signedInAt } = req.session;
    if (!user || signedInAt === undefined) return next();
    if (Date.now() - signedInAt > config.absoluteTimeoutMs) {
      // Regenerating destroys the stored session and leaves an empty one, so the request goes on signed out.
      req.session.regenerate((error) => next(error));
      return;
    }
    req.user = user;
    next();
  };
}

/** Starts a new session under a new id for the user who just signed in, so an id known before sign-in is worthless. */
export function startSignedInSession(req: Request, user: Express.User): Promise<string> {
  return new Promise((resolve, reject) => {
    req.session.regenerate((error) => {
      if (error) return reject(error);
      const xsrfToken = randomBytes(32).toString('base64url');
      Object.assign(req.session, { user, signedInAt: Date.now(), xsrfToken });
      req.session.save((saveError) => (saveError ? reject(saveError) : resolve(xsrfToken)));
    });
  });
}

export function endSession(req: Request): Promise<void> {
  return new Promise((resolve, reject) => req.session.destroy((error) => (error ? reject(error) : resolve())));
}
