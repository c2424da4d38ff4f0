import type { Knex } from 'knex';

/** A lead files a view away: it stays readable (and its share links keep working) but takes no more changes. */
export async function up(knex: Knex): Promise<void> {
  if (await knex.schema.hasColumn('views', 'archived_at')) return;
  await knex.schema.alterTable('views', (t) => {
    t.dateTime('archived_at').nullable().after('created_by');
  });
}

export async function down(knex: Knex): Promise<void> {
  if (!(await knex.schema.hasColumn('views', 'archived_at'))) return;
  await knex.schema.alterTable('views', (t) => {
    t.dropColumn('archived_at');
  });
}
