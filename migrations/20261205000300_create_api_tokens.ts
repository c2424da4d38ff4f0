import type { Knex } from 'knex';

/**
 * Personal API tokens: a user's credential for scripts, for one project at one role, expiring; only the
 * SHA-256 of the secret is stored. Revoking keeps the row (the list shows it revoked).
 */
export async function up(knex: Knex): Promise<void> {
  if (await knex.schema.hasTable('api_tokens')) return;
  await knex.schema.createTable('api_tokens', (t) => {
    t.increments('id').primary();
    t.integer('user_id').unsigned().notNullable().references('users.id').onDelete('CASCADE');
    t.integer('project_id').unsigned().notNullable().references('projects.id').onDelete('CASCADE');
    t.enum('role', ['viewer', 'engineer', 'lead']).notNullable();
    t.string('name', 80).notNullable();
    t.specificType('token_hash', 'CHAR(64)').notNullable().unique();
    t.dateTime('expires_at').notNullable();
    t.dateTime('last_used_at').nullable();
    t.dateTime('revoked_at').nullable();
    t.dateTime('created_at').notNullable().defaultTo(knex.fn.now());
    // the token page lists a user's tokens, newest first
    t.index(['user_id', 'created_at']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('api_tokens');
}
