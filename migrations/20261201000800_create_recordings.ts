import type { Knex } from 'knex';

/** Metadata of a recording the team registered; the samples never leave the engineer's machine. */
export async function up(knex: Knex): Promise<void> {
  if (await knex.schema.hasTable('recordings')) return;
  await knex.schema.createTable('recordings', (t) => {
    t.increments('id').primary();
    t.integer('project_id').unsigned().notNullable().references('projects.id').onDelete('CASCADE');
    t.specificType('fingerprint', 'CHAR(64)').notNullable();
    t.string('name', 191).notNullable();
    t.double('sample_rate_hz').notNullable();
    t.double('duration_s').notNullable();
    t.json('channels').notNullable();
    t.json('speed_source').nullable();
    t.integer('registered_by').unsigned().nullable().references('users.id').onDelete('SET NULL');
    t.integer('version').unsigned().notNullable().defaultTo(1);
    t.dateTime('created_at').notNullable().defaultTo(knex.fn.now());
    t.dateTime('updated_at').notNullable().defaultTo(knex.fn.now());
    t.unique(['project_id', 'fingerprint']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('recordings');
}
