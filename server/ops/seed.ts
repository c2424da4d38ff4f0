/** `npm run db:seed`: seeds the demo into the configured database (idempotent). */
import { loadConfig } from '../config';
import { createDb } from '../db/knex';
import { seedDemo } from '../../seeds/index';

const db = createDb(loadConfig().db);
try {
  console.log(JSON.stringify(await seedDemo(db)));
} finally {
  await db.destroy();
}
