import { ConnectSessionKnexStore } from 'connect-session-knex';
import session from 'express-session';
import type { Knex } from 'knex';

declare module 'express-session' {
  interface SessionData {
    userId: number;
    csrfToken: string;
  }
}

export const SESSION_COOKIE = 'fanlight.sid';
const SESSION_DAYS = 7;

export function sessionMiddleware(db: Knex, secret: string) {
  const store = new ConnectSessionKnexStore({
    knex: db,
    tableName: 'sessions', // created by migrations/…_create_sessions.ts
    createTable: false,
    cleanupInterval: 15 * 60_000,
  });
  // The store checks its table once at start; with the database down that check fails, and every session
  // read fails again later with the real error, so the first failure needs no handler of its own.
  store.ready.catch(() => undefined);
  const middleware = session({
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
  return { middleware, store };
}
