import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  if (await knex.schema.hasTable('users')) return;
  await knex.schema.createTable('users', (t) => {
    t.increments('id').primary();
    t.string('email', 191).notNullable().unique(); // 191: the utf8mb4 index limit
    t.string('name', 120).notNullable();
    t.string('password_hash', 100).notNullable();
    t.enum('site_role', ['admin', 'staff', 'guest']).notNullable().defaultTo('guest');
    t.dateTime('disabled_at').nullable();
    t.dateTime('created_at').notNullable().defaultTo(knex.fn.now());
    t.dateTime('updated_at').notNullable().defaultTo(knex.fn.now());
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('users');
}
