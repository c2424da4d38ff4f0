import type { Knex } from 'knex';

/** The express-session store table, in the shape connect-session-knex reads and writes. */
export async function up(knex: Knex): Promise<void> {
  if (await knex.schema.hasTable('sessions')) return;
  await knex.schema.createTable('sessions', (t) => {
    t.string('sid', 191).primary();
    t.json('sess').notNullable();
    t.dateTime('expired').notNullable().index();
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('sessions');
}
