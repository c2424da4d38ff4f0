/** Serves the API and the built client on one port. Used by `npm start` (through server/ops/start.ts). */
import type { Server } from 'node:http';
import { createApp } from './app';
import { loadConfig, type AppConfig } from './config';
import { createDb } from './db/knex';

export async function serve(config: AppConfig = loadConfig()): Promise<{ server: Server; url: string; stop(): Promise<void> }> {
  const db = createDb(config.db);
  const { app, close } = createApp({ config, db });
  const server = await new Promise<Server>((resolve, reject) => {
    const s = app.listen(config.port, config.host, (err?: Error) => (err ? reject(err) : resolve(s)));
  });
  const address = server.address();
  const port = typeof address === 'object' && address ? address.port : config.port;
  return {
    server,
    url: `http://${config.host}:${port}`,
    async stop() {
      const closed = new Promise<void>((resolve) => server.close(() => resolve()));
      server.closeAllConnections();
      await closed;
      close();
      await db.destroy();
    },
  };
}

if (import.meta.url === `file://${process.argv[1]}`) {
  // the same process rules as the launchers: only SIGINT/SIGTERM stop it; a bug is logged, not fatal
  const { onShutdown } = await import('./ops/shutdown');
  const { url, stop } = await serve();
  console.log(`Fanlight API and app on ${url}`);
  onShutdown(stop);
}
