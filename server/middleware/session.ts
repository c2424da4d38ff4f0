import type { RequestHandler } from 'express';
import session from 'express-session';
import { isDatabaseUnavailable } from '../db/db-errors';
import type { Knex } from 'knex';
import { KnexSessionStore } from './session-store';

declare module 'express-session' {
  interface SessionData {
    userId: number;
    csrfToken: string;
  }
}

export const SESSION_COOKIE = 'fanlight.sid';
const SESSION_DAYS = 7;

export function sessionMiddleware(db: Knex, secret: string) {
  // the table comes from migrations/…_create_sessions.ts
  const store = new KnexSessionStore(db);
  const sessions = session({
    name: SESSION_COOKIE,
    secret,
    store,
    resave: false,
    saveUninitialized: false,
    rolling: true,
    cookie: {
      httpOnly: true,
      sameSite: 'lax',
      secure: 'auto', // Secure exactly when the request came over TLS (req.secure, honouring trust proxy)
      maxAge: SESSION_DAYS * 24 * 3600_000,
    },
  });
  /**
   * express-session saves or touches the session after the answer is written and, when that fails, calls
   * `next(err)` a second time. By then the answer is complete (and perhaps already was an error answer), so
   * the late error would reach Express's final handler, which destroys the connection: the client's next
   * request on that keep-alive connection would then fail. A late error is logged instead; the session is
   * saved again on the next request.
   */
  const middleware: RequestHandler = (req, res, next) => {
    sessions(req, res, (err?: unknown) => {
      if (err && res.headersSent) {
        if (!isDatabaseUnavailable(err)) {
          console.warn(`fanlight: session not saved after answering ${req.method} ${req.originalUrl}: ${(err as Error)?.message ?? String(err)}`);
        }
        return;
      }
      next(err);
    });
  };
  return { middleware, store };
}
