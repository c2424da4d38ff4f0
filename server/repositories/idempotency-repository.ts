import type { Knex } from 'knex';

export interface IdempotencyRecord {
  id: number;
  requestHash: string;
  /** null while the first request is still being answered */
  statusCode: number | null;
  response: Buffer | null;
  createdAt: Date;
}

const isDuplicateKey = (e: unknown) => (e as { code?: string }).code === 'ER_DUP_ENTRY';

/** The idempotency_keys table: one row per (user, key), claimed before the create runs. */
export class IdempotencyRepository {
  constructor(private readonly db: Knex) {}

  /** Claims the key for this request; null when another request holds it already. */
  async claim(userId: number, keyHash: string, requestHash: string): Promise<number | null> {
    try {
      const [id] = await this.db('idempotency_keys').insert({ user_id: userId, key_hash: keyHash, request_hash: requestHash });
      return Number(id);
    } catch (e) {
      if (isDuplicateKey(e)) return null;
      throw e;
    }
  }

  async find(userId: number, keyHash: string): Promise<IdempotencyRecord | null> {
    const r = await this.db('idempotency_keys')
      .select('id', 'request_hash', 'status_code', 'response', 'created_at')
      .where({ user_id: userId, key_hash: keyHash })
      .first();
    if (!r) return null;
    return {
      id: r.id,
      requestHash: r.request_hash,
      statusCode: r.status_code,
      response: r.response,
      createdAt: new Date(r.created_at),
    };
  }

  async complete(id: number, statusCode: number, response: Buffer): Promise<void> {
    await this.db('idempotency_keys').where({ id }).update({ status_code: statusCode, response });
  }

  /** Gives a key back (the first request failed, so a retry may run it again). */
  async release(id: number): Promise<void> {
    await this.db('idempotency_keys').where({ id }).delete();
  }

  async removeOlderThan(cutoff: Date): Promise<number> {
    return this.db('idempotency_keys').where('created_at', '<', cutoff).delete();
  }
}
