import { createHash, randomBytes } from 'node:crypto';
import connectPgSimple from 'connect-pg-simple';
import type { RequestHandler, Request } from 'express';
import session from 'express-session';
import type { SessionConfig } from '../config';
import type { Database } from '../db/database';
import type { Logger } from '../logger';

export const SESSION_COOKIE = 'spanledger.sid';

/**
 * connect-pg-simple accepts any object with pg-promise's `any`; this one runs on Knex's own pool.
 * Its few statements never change, so each is prepared once per connection and then only
 * executed: the session read runs on every request, and parsing and planning it again each time
 * costs the database more than the read itself.
 */
function knexQueryRunner(db: Database) {
  // Named by their text, so two stores on one pool can never give one name to different statements.
  const statementName = (sql: string) => `session-store-${createHash('sha256').update(sql).digest('hex').slice(0, 24)}`;
  return {
    async any(sql: string, parameters: unknown[]) {
      const connection = (await db.client.acquireConnection()) as { query(query: { name: string; text: string; values: unknown[] }): Promise<{ rows: unknown[] }> };
      try {
        return (await connection.query({ name: statementName(sql), text: sql, values: parameters })).rows;
      } finally {
        await db.client.releaseConnection(connection);
      }
    },
  };
}

/** A session's stored expiry lags its last request by at most this (or a tenth of the idle timeout, if less). */
const MAX_TOUCH_INTERVAL_MS = 60_000;
/** Past this many sessions the memory of recent touches is swept of those old enough to be written again. */
const MAX_REMEMBERED_TOUCHES = 10_000;

/**
 * Sessions in PostgreSQL (`user_sessions`). The cookie is HttpOnly and SameSite=Lax; every
 * response pushes its expiry forward, so it lapses after the idle timeout (the stored expiry is
 * written at most once a minute, so a session may lapse up to that much sooner).
 */
export function sessions(config: SessionConfig, db: Database, logger: Logger): RequestHandler {
  const PgStore = connectPgSimple(session);
  const touchIntervalMs = Math.min(MAX_TOUCH_INTERVAL_MS, config.idleTimeoutMs / 10);

  /** Writes a session's new expiry at most once per interval: one write a minute per person, not one per request. */
  class PgStoreWithSparingTouch extends PgStore {
    private readonly lastTouchedAt = new Map<string, number>();

    override touch(sid: string, sessionData: session.SessionData, done?: (error?: unknown) => void): void {
      const now = Date.now();
      const last = this.lastTouchedAt.get(sid);
      if (last !== undefined && now - last < touchIntervalMs) {
        done?.();
        return;
      }
      if (this.lastTouchedAt.size > MAX_REMEMBERED_TOUCHES) this.forgetTouchesBefore(now - touchIntervalMs);
      this.lastTouchedAt.set(sid, now);
      super.touch(sid, sessionData, done);
    }

    private forgetTouchesBefore(time: number): void {
      for (const [sid, touchedAt] of this.lastTouchedAt) if (touchedAt < time) this.lastTouchedAt.delete(sid);
    }
  }

  const store = new PgStoreWithSparingTouch({
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
