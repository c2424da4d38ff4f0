import type { Knex } from 'knex';

/**
 * A project's targets: limit curves of a track's level against speed (points as JSON [[rpm, dB], …],
 * ascending), one per track and weighting; versioned so colliding edits fail with 409.
 */
export async function up(knex: Knex): Promise<void> {
  if (await knex.schema.hasTable('targets')) return;
  await knex.schema.createTable('targets', (t) => {
    t.increments('id').primary();
    t.integer('project_id').unsigned().notNullable().references('projects.id').onDelete('CASCADE');
    // the track as text: order:48, family:1:2, overall
    t.string('track', 40).notNullable();
    t.enum('weighting', ['A', 'Z']).notNullable();
    t.text('points', 'mediumtext').notNullable();
    t.string('label', 120).nullable();
    t.integer('created_by').unsigned().nullable().references('users.id').onDelete('SET NULL');
    t.integer('version').unsigned().notNullable().defaultTo(1);
    t.dateTime('created_at').notNullable().defaultTo(knex.fn.now());
    t.dateTime('updated_at').notNullable().defaultTo(knex.fn.now());
    t.unique(['project_id', 'track', 'weighting']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('targets');
}
