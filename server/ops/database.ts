/** Brings up the private MariaDB for a mode, creates the database and user, migrates and seeds. */
import path from 'node:path';
import { DATA_DIR, type DbConfig } from '../config';
import { createDb, migrateLatest } from '../db/knex';
import { seedDemo, type SeedReport } from '../../seeds/index';
import { PrivateMariaDb } from './mariadb';

export interface PreparedDatabase {
  mariadb: PrivateMariaDb;
  applied: string[];
  seed: SeedReport;
}

export async function prepareDatabase(
  instance: 'app' | 'test' | 'bench' | 'load',
  db: DbConfig,
  { recreate = false, demoDir }: { recreate?: boolean; demoDir?: string } = {},
): Promise<PreparedDatabase> {
  const mariadb = new PrivateMariaDb({ baseDir: path.join(DATA_DIR, `mariadb-${instance}`), port: db.port });
  await mariadb.start();
  try {
    await mariadb.ensureDatabase({ database: db.database, user: db.user, password: db.password }, { recreate });
    const knex = createDb(db);
    try {
      const applied = await migrateLatest(knex);
      const seed = await seedDemo(knex, { demoDir });
      return { mariadb, applied, seed };
    } finally {
      await knex.destroy();
    }
  } catch (e) {
    await mariadb.stop();
    throw e;
  }
}
