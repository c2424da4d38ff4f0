import type { Knex } from 'knex';

/** Saved views of a recording: the Bench state as JSON, versioned so colliding edits fail with 409. */
export async function up(knex: Knex): Promise<void> {
  if (await knex.schema.hasTable('views')) return;
  await knex.schema.createTable('views', (t) => {
    t.increments('id').primary();
    t.integer('project_id').unsigned().notNullable().references('projects.id').onDelete('CASCADE');
    t.integer('recording_id').unsigned().nullable().references('recordings.id').onDelete('SET NULL');
    t.string('title', 191).notNullable();
    t.json('state').notNullable();
    t.integer('version').unsigned().notNullable().defaultTo(1);
    t.integer('created_by').unsigned().nullable().references('users.id').onDelete('SET NULL');
    t.dateTime('created_at').notNullable().defaultTo(knex.fn.now());
    t.dateTime('updated_at').notNullable().defaultTo(knex.fn.now());
    t.index(['project_id']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('views');
}
