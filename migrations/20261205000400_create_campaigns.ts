import type { Knex } from 'knex';

/**
 * Test campaigns (one preset over many recordings) and their results, one per file: the unique
 * (campaign_id, file_hash) makes a second post of a file store nothing. The summary's two levels are
 * columns of their own so the results table sorts by them in the database.
 */
export async function up(knex: Knex): Promise<void> {
  if (!(await knex.schema.hasTable('campaigns'))) {
    await knex.schema.createTable('campaigns', (t) => {
      t.increments('id').primary();
      t.integer('project_id').unsigned().notNullable().references('projects.id').onDelete('CASCADE');
      t.string('name', 120).notNullable();
      t.text('preset', 'mediumtext').notNullable();
      t.integer('total').unsigned().nullable();
      // {file: {tag: value}} as JSON
      t.text('tags', 'mediumtext').notNullable();
      t.integer('created_by').unsigned().nullable().references('users.id').onDelete('SET NULL');
      t.dateTime('created_at').notNullable().defaultTo(knex.fn.now());
      t.dateTime('updated_at').notNullable().defaultTo(knex.fn.now());
      // the project's list, newest first
      t.index(['project_id', 'created_at']);
    });
  }
  if (!(await knex.schema.hasTable('campaign_results'))) {
    await knex.schema.createTable('campaign_results', (t) => {
      t.increments('id').primary();
      t.integer('campaign_id').unsigned().notNullable().references('campaigns.id').onDelete('CASCADE');
      t.string('file', 500).notNullable();
      // SHA-256 hex of the file name: the unique key (a 500-character name is too long for one)
      t.specificType('file_hash', 'CHAR(64)').notNullable();
      t.boolean('ok').notNullable();
      t.string('error', 2000).nullable();
      t.text('tags', 'mediumtext').notNullable();
      t.text('summary', 'mediumtext').nullable();
      t.text('inverter', 'mediumtext').nullable();
      t.double('peak_db').nullable();
      t.double('overall_db').nullable();
      t.dateTime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
      t.unique(['campaign_id', 'file_hash']);
      // the sorts of the results table (file, arrival, levels, failures); counts per campaign use ok
      t.index(['campaign_id', 'file']);
      t.index(['campaign_id', 'created_at']);
      t.index(['campaign_id', 'peak_db']);
      t.index(['campaign_id', 'overall_db']);
      t.index(['campaign_id', 'ok']);
    });
  }
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('campaign_results');
  await knex.schema.dropTableIfExists('campaigns');
}
