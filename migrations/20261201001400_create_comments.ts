import type { Knex } from 'knex';

/**
 * Threads: a comment belongs to a view and, when mark_id is set, to one mark's thread (else to the view's
 * own thread). A comment by a member has author_id; one made through a share link has link_id and the
 * name its writer gave.
 */
export async function up(knex: Knex): Promise<void> {
  if (await knex.schema.hasTable('comments')) return;
  await knex.schema.createTable('comments', (t) => {
    t.increments('id').primary();
    t.integer('view_id').unsigned().notNullable().references('views.id').onDelete('CASCADE');
    t.integer('mark_id').unsigned().nullable().references('marks.id').onDelete('CASCADE');
    t.text('body').notNullable();
    t.integer('author_id').unsigned().nullable().references('users.id').onDelete('SET NULL');
    t.string('guest_name', 120).nullable();
    t.integer('link_id').unsigned().nullable().references('share_links.id').onDelete('SET NULL');
    t.dateTime('created_at').notNullable().defaultTo(knex.fn.now());
    t.index(['view_id', 'mark_id']);
    t.index(['mark_id']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('comments');
}
