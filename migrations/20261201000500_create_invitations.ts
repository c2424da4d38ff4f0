import type { Knex } from 'knex';

/** Invitations to a project; only the SHA-256 of the one-time token is stored. */
export async function up(knex: Knex): Promise<void> {
  if (await knex.schema.hasTable('invitations')) return;
  await knex.schema.createTable('invitations', (t) => {
    t.increments('id').primary();
    t.integer('project_id').unsigned().notNullable().references('projects.id').onDelete('CASCADE');
    t.string('email', 191).notNullable();
    t.enum('role', ['lead', 'engineer', 'viewer']).notNullable();
    t.specificType('token_hash', 'CHAR(64)').notNullable().unique();
    t.integer('invited_by').unsigned().nullable().references('users.id').onDelete('SET NULL');
    t.dateTime('expires_at').notNullable();
    t.dateTime('accepted_at').nullable();
    t.integer('accepted_by').unsigned().nullable().references('users.id').onDelete('SET NULL');
    t.dateTime('created_at').notNullable().defaultTo(knex.fn.now());
    t.index(['project_id']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('invitations');
}
