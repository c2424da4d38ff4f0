import type { Knex } from 'knex';

/** Password-reset requests; only the SHA-256 of the one-time token is stored. */
export async function up(knex: Knex): Promise<void> {
  if (await knex.schema.hasTable('password_resets')) return;
  await knex.schema.createTable('password_resets', (t) => {
    t.increments('id').primary();
    t.integer('user_id').unsigned().notNullable().references('users.id').onDelete('CASCADE');
    t.specificType('token_hash', 'CHAR(64)').notNullable().unique();
    t.dateTime('expires_at').notNullable();
    t.dateTime('used_at').nullable();
    t.dateTime('created_at').notNullable().defaultTo(knex.fn.now());
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('password_resets');
}
