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
import { LRUCache } from 'lru-cache';
import { SessionRepository } from '../repositories/session-repository';
import { onSessionsEnded } from '../services/cache-notices';

type Callback<T> = (err?: unknown, value?: T) => void;

const DAY_MS = 24 * 3600_000;

export interface KnexSessionStoreOptions {
  /** How often expired rows are deleted; 0 turns the sweep off. */
  cleanupIntervalMs?: number;
  /**
   * A session's expiry is moved in the table at most this often. express-session touches the session on
   * every answer (rolling cookies); writing each of those would be one committed write per request, the
   * largest single cost under load. A 7-day session whose stored expiry lags by minutes loses nothing.
   */
  touchEveryMs?: number;
  /**
   * A session read from the table is reused for this long: every request reads its session, and most read
   * the same one again within seconds. Sessions ended in this process (sign-out, password reset, account
   * disabled) are dropped at once; another server process sees them end within this time at the latest.
   */
  cacheMs?: number;
  now?: () => Date;
}

interface CachedSession {
  json: string;
  userId: number | undefined;
}

const TOUCHES_REMEMBERED = 50_000;

export class KnexSessionStore extends session.Store {
  private readonly sessions: SessionRepository;
  private readonly now: () => Date;
  private cleanupTimer: NodeJS.Timeout | undefined;
  private readonly touchEveryMs: number;
  /** sid → when its expiry was last written (oldest first, bounded). */
  private readonly lastWritten = new Map<string, number>();

  private readonly cache: LRUCache<string, CachedSession> | null;
  private readonly justEnded: LRUCache<number, true> | null;
  private readonly stopListening: () => void;

  constructor(
    db: Knex,
    { cleanupIntervalMs = 15 * 60_000, touchEveryMs = 5 * 60_000, cacheMs = 5000, now = () => new Date() }: KnexSessionStoreOptions = {},
  ) {
    super();
    this.sessions = new SessionRepository(db);
    this.now = now;
    this.touchEveryMs = touchEveryMs;
    this.cache = cacheMs > 0 ? new LRUCache({ max: 50_000, ttl: cacheMs }) : null;
    // sessions ended before their transaction committed must not be cached from a read in between
    this.justEnded = cacheMs > 0 ? new LRUCache({ max: 10_000, ttl: cacheMs }) : null;
    this.stopListening = onSessionsEnded((userId) => {
      this.justEnded?.set(userId, true);
      if (!this.cache) return;
      for (const [sid, entry] of this.cache.entries()) if (entry.userId === userId) this.cache.delete(sid);
    });
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

  private remember(sid: string, sess: unknown): void {
    if (!this.cache || !sess) return;
    const userId = (sess as { userId?: number }).userId;
    if (userId !== undefined && this.justEnded?.has(userId)) return;
    this.cache.set(sid, { json: JSON.stringify(sess), userId });
  }

  /** A fresh copy each time: express-session changes the object it is given. */
  private async read(sid: string): Promise<SessionData | null> {
    const cached = this.cache?.get(sid);
    if (cached && !(cached.userId !== undefined && this.justEnded?.has(cached.userId))) {
      return JSON.parse(cached.json) as SessionData;
    }
    const sess = (await this.sessions.find(sid, this.now())) as SessionData | null;
    this.remember(sid, sess);
    return sess;
  }

  override get(sid: string, callback: (err: unknown, session?: SessionData | null) => void): void {
    this.settle(() => this.read(sid), (err, value) => callback(err ?? null, err ? undefined : (value ?? null)));
  }

  private noteWritten(sid: string): void {
    this.lastWritten.delete(sid);
    this.lastWritten.set(sid, this.now().getTime());
    if (this.lastWritten.size > TOUCHES_REMEMBERED) this.lastWritten.delete(this.lastWritten.keys().next().value!);
  }

  override set(sid: string, sess: SessionData, callback?: (err?: unknown) => void): void {
    this.settle(
      () =>
        this.sessions.upsert(sid, sess, this.expiry(sess)).then(() => {
          this.noteWritten(sid);
          this.remember(sid, sess);
        }),
      (err) => callback?.(err),
    );
  }

  override touch(sid: string, sess: SessionData, callback?: (err?: unknown) => void): void {
    const last = this.lastWritten.get(sid);
    if (last !== undefined && this.now().getTime() - last < this.touchEveryMs) {
      this.settle(async () => undefined, (err) => callback?.(err));
      return;
    }
    this.settle(
      () => this.sessions.touch(sid, this.expiry(sess), this.now()).then(() => this.noteWritten(sid)),
      (err) => callback?.(err),
    );
  }

  override destroy(sid: string, callback?: (err?: unknown) => void): void {
    this.lastWritten.delete(sid);
    this.cache?.delete(sid);
    this.settle(() => this.sessions.remove(sid), (err) => callback?.(err));
  }

  /** Stops the expired-session sweep (tests and shutdown). */
  close(): void {
    this.stopListening();
    if (this.cleanupTimer) clearInterval(this.cleanupTimer);
    this.cleanupTimer = undefined;
  }
}
