/** `npm run db:seed`: seeds the demo into the configured database (idempotent). */
import { loadConfig } from '../config';
import { createDb } from '../db/knex';
import { seedDemo } from '../../seeds/index';

const config = loadConfig();
const db = createDb(config.db);
try {
  console.log(JSON.stringify(await seedDemo(db, { demoDir: config.demoRecordingsDir })));
} finally {
  await db.destroy();
}
