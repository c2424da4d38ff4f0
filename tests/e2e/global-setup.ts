/**
 * Serves the built client and the API from one in-process server on a free loopback port for the browser
 * tests; they read its address with inject('baseUrl').
 */
import type { Server } from 'node:http';
import type { TestProject } from 'vitest/node';
import { createApp } from '../../server/app';
import { loadConfig } from '../../server/config';
import { createDb } from '../../server/db/knex';

declare module 'vitest' {
  export interface ProvidedContext {
    baseUrl: string;
  }
}

export default async function setup(project: TestProject) {
  const config = loadConfig({ ...process.env, NODE_ENV: 'test' });
  const db = createDb(config.db);
  const fanlight = createApp({ config, db });
  const server = await new Promise<Server>((resolve) => {
    const s = fanlight.app.listen(0, '127.0.0.1', () => resolve(s));
  });
  const address = server.address();
  if (!address || typeof address === 'string') throw new Error('no address');
  project.provide('baseUrl', `http://127.0.0.1:${address.port}`);
  return async () => {
    const closed = new Promise<void>((resolve) => server.close(() => resolve()));
    server.closeAllConnections();
    await closed;
    fanlight.close();
    await db.destroy();
  };
}
