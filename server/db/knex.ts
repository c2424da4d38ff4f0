import knex, { type Knex } from 'knex';
import type { DbConfig } from '../config';
import { migrationSource } from './migration-source';

export function createDb(db: DbConfig): Knex {
  return knex({
    client: 'mysql2',
    connection: {
      host: db.host,
      port: db.port,
      user: db.user,
      password: db.password,
      database: db.database,
      charset: 'utf8mb4',
      timezone: 'Z', // store and read DATETIME as UTC
      dateStrings: false,
    },
    pool: { min: 0, max: 10 },
    migrations: { migrationSource, tableName: 'knex_migrations' },
  });
}

export async function migrateLatest(db: Knex): Promise<string[]> {
  const [, applied] = (await db.migrate.latest()) as [number, string[]];
  return applied;
}
