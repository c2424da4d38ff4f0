import type { Knex } from 'knex';

/** Which mails a user wants; no row means every kind is on. */
export async function up(knex: Knex): Promise<void> {
  if (await knex.schema.hasTable('notification_settings')) return;
  await knex.schema.createTable('notification_settings', (t) => {
    t.integer('user_id').unsigned().primary().references('users.id').onDelete('CASCADE');
    t.boolean('replies').notNullable().defaultTo(true);
    t.boolean('mentions').notNullable().defaultTo(true);
    t.boolean('shares').notNullable().defaultTo(true);
    t.dateTime('updated_at').notNullable().defaultTo(knex.fn.now());
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('notification_settings');
}
