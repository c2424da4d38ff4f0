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
      // a database that does not answer at all (host gone) fails a new connection within seconds
      connectTimeout: 3000,
    },
    // With the database away, a request waits at most this long for a pool connection, then answers 503
    // (server/db/db-errors.ts). Knex's mysql2 dialect marks a connection that saw an error as disposed and
    // the pool validates each one before lending it, so dead connections are dropped and new ones made.
    acquireConnectionTimeout: 4000,
    pool: { min: 0, max: 10, idleTimeoutMillis: 30_000 },
    migrations: { migrationSource, tableName: 'knex_migrations' },
  });
}

export async function migrateLatest(db: Knex): Promise<string[]> {
  const [, applied] = (await db.migrate.latest()) as [number, string[]];
  return applied;
}
