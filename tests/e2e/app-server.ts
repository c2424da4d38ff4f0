/**
 * The built client and the API served from one in-process server on a loopback port, as `npm start`
 * serves them. The server listens first so that the links in mail (PUBLIC_ORIGIN) point at the real
 * port. Used by the browser tests' global setup, and by a test that stops the server and starts a new
 * one on the same port.
 */
import { createServer } from 'node:http';
import { createApp } from '../../server/app';
import { loadConfig } from '../../server/config';
import { createDb } from '../../server/db/knex';

export interface AppServer {
  baseUrl: string;
  port: number;
  stop(): Promise<void>;
}

export async function startAppServer(port = 0): Promise<AppServer> {
  const server = createServer();
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, '127.0.0.1', () => resolve());
  });
  const address = server.address();
  if (!address || typeof address === 'string') throw new Error('no address');
  const baseUrl = `http://127.0.0.1:${address.port}`;
  const config = { ...loadConfig({ ...process.env, NODE_ENV: 'test' }), publicOrigin: baseUrl };
  const db = createDb(config.db);
  const fanlight = createApp({ config, db });
  server.on('request', fanlight.app);
  return {
    baseUrl,
    port: address.port,
    stop: async () => {
      const closed = new Promise<void>((resolve) => server.close(() => resolve()));
      server.closeAllConnections();
      await closed;
      fanlight.close();
      await db.destroy();
    },
  };
}
