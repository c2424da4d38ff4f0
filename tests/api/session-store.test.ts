/**
 * The session store (server/middleware/session-store.ts) against a live and a dead database: every method
 * calls back exactly once, with the error when the database fails, and nothing is thrown or left rejected.
 */
import { randomUUID } from 'node:crypto';
import type { SessionData } from 'express-session';
import { afterAll, afterEach, beforeEach, describe, expect, it } from 'vitest';
import { createDb } from '../../server/db/knex';
import { KnexSessionStore } from '../../server/middleware/session-store';
import { SessionRepository } from '../../server/repositories/session-repository';
import { openTestDb, testConfig } from '../support/test-db';

const sessionData = (userId: number, maxAgeMs = 3600_000): SessionData =>
  ({ cookie: { originalMaxAge: maxAgeMs, maxAge: maxAgeMs, expires: new Date(Date.now() + maxAgeMs) }, userId }) as unknown as SessionData;

/** Calls a store method and collects every callback call for a while after. */
async function calls(invoke: (cb: (...args: unknown[]) => void) => void, settleMs = 300): Promise<unknown[][]> {
  const seen: unknown[][] = [];
  let thrown: unknown = null;
  try {
    invoke((...args) => seen.push(args));
  } catch (e) {
    thrown = e;
  }
  expect(thrown).toBeNull();
  const deadline = Date.now() + 8000;
  while (seen.length === 0 && Date.now() < deadline) await new Promise((r) => setTimeout(r, 20));
  await new Promise((r) => setTimeout(r, settleMs)); // a second call would come within this
  return seen;
}

describe('KnexSessionStore', () => {
  const rejections: unknown[] = [];
  const onRejection = (e: unknown) => rejections.push(e);
  beforeEach(() => {
    rejections.length = 0;
    process.on('unhandledRejection', onRejection);
  });
  afterEach(() => {
    process.off('unhandledRejection', onRejection);
  });

  describe('with the database up', () => {
    const db = openTestDb();
    // no cache and no touch throttle: each call reaches the table
    const store = new KnexSessionStore(db, { cleanupIntervalMs: 0, cacheMs: 0, touchEveryMs: 0 });
    afterAll(() => {
      store.close();
      return db.destroy();
    });

    it('keeps, reads, touches and ends a session, each callback once', async () => {
      const sid = randomUUID();
      expect(await calls((cb) => store.set(sid, sessionData(42), cb))).toEqual([[undefined]]);
      const got = await calls((cb) => store.get(sid, cb));
      expect(got).toHaveLength(1);
      expect(got[0][0]).toBeNull();
      expect((got[0][1] as { userId: number }).userId).toBe(42);
      expect(await calls((cb) => store.touch(sid, sessionData(42, 7 * 86_400_000), cb))).toEqual([[undefined]]);
      const row = await db('sessions').where({ sid }).first();
      expect(new Date(row.expired).getTime()).toBeGreaterThan(Date.now() + 6 * 86_400_000);
      expect(await calls((cb) => store.destroy(sid, cb))).toEqual([[undefined]]);
      expect(await calls((cb) => store.get(sid, cb))).toEqual([[null, null]]);
      expect(rejections).toEqual([]);
    });

    it('moves the stored expiry at most once per touch interval, and reuses a read session for the cache time', async () => {
      const cached = new KnexSessionStore(db, { cleanupIntervalMs: 0, cacheMs: 60_000, touchEveryMs: 60_000 });
      try {
        const sid = randomUUID();
        await calls((cb) => cached.set(sid, sessionData(43, 3600_000), cb));
        const before = (await db('sessions').where({ sid }).first()).expired;
        expect(await calls((cb) => cached.touch(sid, sessionData(43, 7 * 86_400_000), cb))).toEqual([[undefined]]);
        expect((await db('sessions').where({ sid }).first()).expired).toEqual(before); // within the interval: no write
        await db('sessions').where({ sid }).update({ sess: JSON.stringify({ userId: 43, changedInTable: true }) });
        const got = await calls((cb) => cached.get(sid, cb));
        expect(got[0][1]).not.toHaveProperty('changedInTable'); // from the cache
        // a copy each time: changing what get() gave does not change the next answer
        (got[0][1] as { userId: number }).userId = 1;
        expect(((await calls((cb) => cached.get(sid, cb)))[0][1] as { userId: number }).userId).toBe(43);
        // sessions ended for a user (password reset, account disabled) leave the cache at once
        await new SessionRepository(db).endAllFor(43);
        expect(await calls((cb) => cached.get(sid, cb))).toEqual([[null, null]]);
      } finally {
        cached.close();
      }
    });

    it('does not return an expired session', async () => {
      const sid = randomUUID();
      await db('sessions').insert({ sid, sess: JSON.stringify({ userId: 7 }), expired: new Date(Date.now() - 1000) });
      expect(await calls((cb) => store.get(sid, cb))).toEqual([[null, null]]);
    });
  });

  describe('with the database away', () => {
    // A port nothing listens on stands for a database that is down.
    const dead = createDb({ ...testConfig().db, port: 1 });
    const store = new KnexSessionStore(dead, { cleanupIntervalMs: 0 });
    afterAll(() => {
      store.close();
      return dead.destroy();
    });

    it.each([
      ['get', (cb: (...a: unknown[]) => void) => store.get('some-sid', cb)],
      ['set', (cb: (...a: unknown[]) => void) => store.set('some-sid', sessionData(1), cb)],
      ['touch', (cb: (...a: unknown[]) => void) => store.touch('some-sid', sessionData(1), cb)],
      ['destroy', (cb: (...a: unknown[]) => void) => store.destroy('some-sid', cb)],
    ])('%s calls back once with the error, throws nothing and leaves no rejection', async (_name, invoke) => {
      const seen = await calls(invoke);
      expect(seen).toHaveLength(1);
      expect(seen[0][0]).toBeInstanceOf(Error);
      expect((seen[0][0] as { code?: string }).code).toBe('ECONNREFUSED');
      expect(rejections).toEqual([]);
    });

    it('a callback that throws is reported, not called again and not left as a rejection', async () => {
      let count = 0;
      store.get('some-sid', () => {
        count += 1;
        throw new Error('a buggy caller');
      });
      const deadline = Date.now() + 8000;
      while (count === 0 && Date.now() < deadline) await new Promise((r) => setTimeout(r, 20));
      await new Promise((r) => setTimeout(r, 500));
      expect(count).toBe(1);
      expect(rejections).toEqual([]);
    });
  });
});
