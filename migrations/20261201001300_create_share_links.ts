import type { Knex } from 'knex';

/** Read-only links to one view for people without an account; only the SHA-256 of the token is stored. */
export async function up(knex: Knex): Promise<void> {
  if (await knex.schema.hasTable('share_links')) return;
  await knex.schema.createTable('share_links', (t) => {
    t.increments('id').primary();
    t.integer('view_id').unsigned().notNullable().references('views.id').onDelete('CASCADE');
    t.specificType('token_hash', 'CHAR(64)').notNullable().unique();
    t.boolean('may_reply').notNullable().defaultTo(false);
    t.dateTime('expires_at').nullable();
    t.dateTime('revoked_at').nullable();
    t.integer('created_by').unsigned().nullable().references('users.id').onDelete('SET NULL');
    t.dateTime('created_at').notNullable().defaultTo(knex.fn.now());
    t.index(['view_id']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('share_links');
}
