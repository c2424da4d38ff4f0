import type { Knex } from 'knex';

/** Marks placed on a view's map (point, box or guide), with a short text; versioned so colliding edits fail with 409. */
export async function up(knex: Knex): Promise<void> {
  if (await knex.schema.hasTable('marks')) return;
  await knex.schema.createTable('marks', (t) => {
    t.increments('id').primary();
    t.integer('view_id').unsigned().notNullable().references('views.id').onDelete('CASCADE');
    t.enum('kind', ['point', 'box', 'guide']).notNullable();
    t.json('geometry').notNullable();
    t.text('body').notNullable();
    t.integer('author_id').unsigned().nullable().references('users.id').onDelete('SET NULL');
    t.integer('version').unsigned().notNullable().defaultTo(1);
    t.dateTime('created_at').notNullable().defaultTo(knex.fn.now());
    t.dateTime('updated_at').notNullable().defaultTo(knex.fn.now());
    t.index(['view_id']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('marks');
}
