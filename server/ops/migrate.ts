/** `npm run db:migrate`: applies pending migrations to the configured database (which must be running). */
import { loadConfig } from '../config';
import { createDb, migrateLatest } from '../db/knex';

const db = createDb(loadConfig().db);
try {
  const applied = await migrateLatest(db);
  console.log(applied.length ? `applied: ${applied.join(', ')}` : 'already up to date');
} finally {
  await db.destroy();
}
