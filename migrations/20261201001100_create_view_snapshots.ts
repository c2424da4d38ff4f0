import type { Knex } from 'knex';

/**
 * The compact snapshot of a view (quantised map, axes, tracks; see server/services/snapshot-codec.ts),
 * gzip-compressed. Kept in MariaDB rather than in files or an object store: a snapshot is small (a few
 * hundred kB at most, capped at 4 MB before compression), so the database stays the one thing to back up,
 * and a snapshot is written and removed in the same transaction as its view.
 */
export async function up(knex: Knex): Promise<void> {
  if (await knex.schema.hasTable('view_snapshots')) return;
  await knex.schema.createTable('view_snapshots', (t) => {
    t.integer('view_id').unsigned().primary().references('views.id').onDelete('CASCADE');
    t.string('content_type', 100).notNullable();
    t.specificType('gzip_bytes', 'LONGBLOB').notNullable();
    t.integer('raw_size').unsigned().notNullable();
    t.integer('width').unsigned().notNullable();
    t.integer('height').unsigned().notNullable();
    t.integer('uploaded_by').unsigned().nullable().references('users.id').onDelete('SET NULL');
    t.dateTime('created_at').notNullable().defaultTo(knex.fn.now());
    t.dateTime('updated_at').notNullable().defaultTo(knex.fn.now());
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('view_snapshots');
}
