import type { Knex } from 'knex';

/** What happened in a project, newest first on the Project page. */
export async function up(knex: Knex): Promise<void> {
  if (await knex.schema.hasTable('activity')) return;
  await knex.schema.createTable('activity', (t) => {
    t.bigIncrements('id').primary();
    t.integer('project_id').unsigned().notNullable().references('projects.id').onDelete('CASCADE');
    t.integer('actor_id').unsigned().nullable().references('users.id').onDelete('SET NULL');
    t.string('verb', 50).notNullable();
    t.string('object_type', 50).notNullable();
    t.string('object_id', 64).nullable();
    t.string('summary', 300).notNullable();
    t.dateTime('created_at').notNullable().defaultTo(knex.fn.now());
    t.index(['project_id', 'created_at']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('activity');
}
