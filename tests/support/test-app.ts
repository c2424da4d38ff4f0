import type { Knex } from 'knex';
import supertest from 'supertest';
import { createApp, type FanlightApp } from '../../server/app';
import { openTestDb, testConfig } from './test-db';

export interface TestApp {
  db: Knex;
  app: FanlightApp['app'];
  /** A supertest agent keeps cookies between requests, like one browser. */
  agent(): ReturnType<typeof supertest.agent>;
  close(): Promise<void>;
}

export function startTestApp(): TestApp {
  const config = testConfig();
  const db = openTestDb();
  const fanlight = createApp({ config, db });
  return {
    db,
    app: fanlight.app,
    agent: () => supertest.agent(fanlight.app),
    async close() {
      fanlight.close();
      await db.destroy();
    },
  };
}
