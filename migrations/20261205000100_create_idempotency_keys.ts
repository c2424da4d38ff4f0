import type { Knex } from 'knex';

/**
 * The first answer to each create a user sent with an Idempotency-Key, kept 24 h so that a retry of the same
 * request gets that answer again instead of storing a second record. The key is stored hashed; the answer
 * is stored encrypted with a key derived from the Idempotency-Key (only its sender can have it read back).
 */
export async function up(knex: Knex): Promise<void> {
  if (await knex.schema.hasTable('idempotency_keys')) return;
  await knex.schema.createTable('idempotency_keys', (t) => {
    t.increments('id').primary();
    t.integer('user_id').unsigned().notNullable().references('users.id').onDelete('CASCADE');
    t.specificType('key_hash', 'char(64)').notNullable();
    t.specificType('request_hash', 'char(64)').notNullable();
    // null while the first request is still being answered
    t.smallint('status_code').unsigned().nullable();
    t.specificType('response', 'mediumblob').nullable();
    t.dateTime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.unique(['user_id', 'key_hash']);
    t.index(['created_at']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('idempotency_keys');
}
