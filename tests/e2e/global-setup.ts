/**
 * Serves the built client and the API from one in-process server on a free loopback port for the browser
 * tests; they read its address with inject('baseUrl'). The server listens first so that the links in
 * mail (PUBLIC_ORIGIN) point at the real port.
 */
import { createServer } from 'node:http';
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
  const server = createServer();
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', () => resolve()));
  const address = server.address();
  if (!address || typeof address === 'string') throw new Error('no address');
  const baseUrl = `http://127.0.0.1:${address.port}`;
  const config = { ...loadConfig({ ...process.env, NODE_ENV: 'test' }), publicOrigin: baseUrl };
  const db = createDb(config.db);
  const fanlight = createApp({ config, db });
  server.on('request', fanlight.app);
  project.provide('baseUrl', baseUrl);
  return async () => {
    const closed = new Promise<void>((resolve) => server.close(() => resolve()));
    server.closeAllConnections();
    await closed;
    fanlight.close();
    await db.destroy();
  };
}
