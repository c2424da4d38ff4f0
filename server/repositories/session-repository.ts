import type { Knex } from 'knex';
import { sessionsEndedFor } from '../services/cache-notices';

/** The express-session table (sid, sess JSON, expired): the session store's queries and ending sessions. */
export class SessionRepository {
  constructor(private readonly db: Knex) {}

  /** The stored session data of an unexpired session, or null. */
  async find(sid: string, now: Date): Promise<unknown | null> {
    const row = await this.db('sessions').select('sess').where('sid', sid).andWhere('expired', '>', now).first();
    if (!row) return null;
    return typeof row.sess === 'string' ? JSON.parse(row.sess) : row.sess;
  }

  /** Inserts or replaces a session (one statement, so concurrent saves of one session cannot collide). */
  async upsert(sid: string, sess: unknown, expires: Date): Promise<void> {
    await this.db('sessions')
      .insert({ sid, sess: JSON.stringify(sess), expired: expires })
      .onConflict('sid')
      .merge(['sess', 'expired']);
  }

  /** Moves an unexpired session's expiry (express-session's touch on every request when rolling). */
  async touch(sid: string, expires: Date, now: Date): Promise<void> {
    await this.db('sessions').where('sid', sid).andWhere('expired', '>', now).update({ expired: expires });
  }

  async remove(sid: string): Promise<void> {
    await this.db('sessions').where('sid', sid).delete();
  }

  async removeExpired(now: Date): Promise<number> {
    return this.db('sessions').where('expired', '<=', now).delete();
  }

  /** Ends every session of a user, except the one given (the caller's own). */
  async endAllFor(userId: number, exceptSid?: string, db: Knex = this.db): Promise<number> {
    const q = db('sessions').whereRaw("JSON_VALUE(sess, '$.userId') = ?", [String(userId)]);
    if (exceptSid) q.whereNot('sid', exceptSid);
    const ended = await q.delete();
    sessionsEndedFor(userId);
    return ended;
  }
}
