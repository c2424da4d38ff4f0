import type { Knex } from 'knex';

export class PasswordResetRepository {
  constructor(private readonly db: Knex) {}

  async create(userId: number, tokenHash: string, expiresAt: Date): Promise<void> {
    await this.db('password_resets').insert({ user_id: userId, token_hash: tokenHash, expires_at: expiresAt });
  }

  /** Uses the token once: marks it used and returns its user, or null if unknown, used or expired. */
  async consume(tokenHash: string, now: Date, db: Knex): Promise<number | null> {
    const row = await db('password_resets').where({ token_hash: tokenHash }).forUpdate().first('id', 'user_id', 'expires_at', 'used_at');
    if (!row || row.used_at || new Date(row.expires_at) <= now) return null;
    await db('password_resets').where({ id: row.id }).update({ used_at: db.fn.now() });
    return row.user_id;
  }

  /** Other open links for the same user stop working once the password changed. */
  async closeOpenFor(userId: number, db: Knex): Promise<void> {
    await db('password_resets').where({ user_id: userId }).whereNull('used_at').update({ used_at: db.fn.now() });
  }
}
