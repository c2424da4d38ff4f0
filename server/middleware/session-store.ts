/**
 * express-session's store, on the `sessions` table in MariaDB.
 *
 * Our own rather than connect-session-knex 5.0.0: that package calls back with a database error and then
 * throws it again from get() and set(), never calls back from touch() when its query fails, and awaits a
 * table check made once at start that stays rejected for good if the database was down then. express-session
 * ignores the promises a store returns, so each of those became an unhandled rejection (which once stopped
 * the whole server) or a request that never answered. express-mysql-session would bring its own mysql2 and
 * pool beside Knex's. This store has one rule: every method calls back exactly once, with the error if there
 * is one, and nothing escapes it.
 */
import session, { type SessionData } from 'express-session';
import type { Knex } from 'knex';
import { SessionRepository } from '../repositories/session-repository';

type Callback<T> = (err?: unknown, value?: T) => void;

const DAY_MS = 24 * 3600_000;

export interface KnexSessionStoreOptions {
  /** How often expired rows are deleted; 0 turns the sweep off. */
  cleanupIntervalMs?: number;
  now?: () => Date;
}

export class KnexSessionStore extends session.Store {
  private readonly sessions: SessionRepository;
  private readonly now: () => Date;
  private cleanupTimer: NodeJS.Timeout | undefined;

  constructor(db: Knex, { cleanupIntervalMs = 15 * 60_000, now = () => new Date() }: KnexSessionStoreOptions = {}) {
    super();
    this.sessions = new SessionRepository(db);
    this.now = now;
    if (cleanupIntervalMs > 0) {
      this.cleanupTimer = setInterval(() => {
        this.sessions.removeExpired(this.now()).catch((e: unknown) => {
          console.warn(`fanlight: could not delete expired sessions (${(e as Error).message}); will try again`);
        });
      }, cleanupIntervalMs).unref();
    }
  }

  /** Runs `work` and calls back once: with its value, or with its error. Never throws, never leaves a rejection. */
  private settle<T>(work: () => Promise<T>, callback: Callback<T> | undefined): void {
    let called = false;
    const once: Callback<T> = (err, value) => {
      if (called) return;
      called = true;
      try {
        callback?.(err, value);
      } catch (e) {
        // A throwing callback is the caller's bug; report it without calling back a second time.
        console.error('fanlight: a session store callback threw:', e);
      }
    };
    let promise: Promise<T>;
    try {
      promise = work();
    } catch (e) {
      once(e);
      return;
    }
    promise.then(
      (value) => once(undefined, value),
      (err: unknown) => once(err),
    );
  }

  private expiry(sess: SessionData): Date {
    const expires = sess.cookie?.expires;
    if (expires) return new Date(expires);
    const maxAge = sess.cookie?.maxAge;
    return new Date(this.now().getTime() + (typeof maxAge === 'number' ? maxAge : DAY_MS));
  }

  override get(sid: string, callback: (err: unknown, session?: SessionData | null) => void): void {
    this.settle(() => this.sessions.find(sid, this.now()) as Promise<SessionData | null>, (err, value) =>
      callback(err ?? null, err ? undefined : (value ?? null)),
    );
  }

  override set(sid: string, sess: SessionData, callback?: (err?: unknown) => void): void {
    this.settle(() => this.sessions.upsert(sid, sess, this.expiry(sess)), (err) => callback?.(err));
  }

  override touch(sid: string, sess: SessionData, callback?: (err?: unknown) => void): void {
    this.settle(() => this.sessions.touch(sid, this.expiry(sess), this.now()), (err) => callback?.(err));
  }

  override destroy(sid: string, callback?: (err?: unknown) => void): void {
    this.settle(() => this.sessions.remove(sid), (err) => callback?.(err));
  }

  /** Stops the expired-session sweep (tests and shutdown). */
  close(): void {
    if (this.cleanupTimer) clearInterval(this.cleanupTimer);
    this.cleanupTimer = undefined;
  }
}
