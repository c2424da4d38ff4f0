import type { Knex } from 'knex';

/** Direct access to the express-session table (connect-session-knex's shape) for ending sessions. */
export class SessionRepository {
  constructor(private readonly db: Knex) {}

  /** Ends every session of a user, except the one given (the caller's own). */
  async endAllFor(userId: number, exceptSid?: string, db: Knex = this.db): Promise<number> {
    const q = db('sessions').whereRaw("JSON_VALUE(sess, '$.userId') = ?", [String(userId)]);
    if (exceptSid) q.whereNot('sid', exceptSid);
    return q.delete();
  }
}
