/** Serves the API and the built client on one port. Used by `npm start` (through server/ops/start.ts). */
import type { Server } from 'node:http';
import { createApp } from './app';
import { loadConfig, type AppConfig } from './config';
import { createDb } from './db/knex';

/** How long a stopping server waits for requests in flight before it cuts their connections. */
export const STOP_GRACE_MS = 10_000;

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
    /**
     * Graceful stop: no new connections; requests in flight are answered (keep-alive connections close after
     * their answer); after STOP_GRACE_MS whatever still hangs is cut. Then the pool closes.
     */
    async stop() {
      const closed = new Promise<void>((resolve) => server.close(() => resolve()));
      server.closeIdleConnections();
      const idleSweep = setInterval(() => server.closeIdleConnections(), 100);
      const cut = setTimeout(() => server.closeAllConnections(), STOP_GRACE_MS);
      await closed;
      clearInterval(idleSweep);
      clearTimeout(cut);
      close();
      await db.destroy();
    },
  };
}

if (import.meta.url === `file://${process.argv[1]}`) {
  // the same process rules as the launchers: only SIGINT/SIGTERM stop it; a bug is logged, not fatal
  const { markServing, onShutdown } = await import('./ops/shutdown');
  const { url, stop } = await serve();
  console.log(`Fanlight API and app on ${url}`);
  onShutdown(stop);
  markServing();
}
