/** The test database that `npm test` prepared (server/ops/test.ts): migrated and seeded with the demo. */
import type { Knex } from 'knex';
import { loadConfig } from '../../server/config';
import { createDb } from '../../server/db/knex';

export function testConfig() {
  const config = loadConfig({ ...process.env, NODE_ENV: 'test' });
  if (config.env !== 'test') throw new Error('API tests run only against the test database (npm test).');
  return config;
}

export function openTestDb(): Knex {
  return createDb(testConfig().db);
}
