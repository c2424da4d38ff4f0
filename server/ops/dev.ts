/**
 * `npm run dev`: the private MariaDB and the API on :3000 as in `npm start`, and the Vite dev server on
 * http://127.0.0.1:5173 with /api proxied to the API (hot reload for the client).
 */
import { loadConfig } from '../config';
import { startMailFakeIfWanted } from './mail-fake';
import { serve } from '../index';
import { printBanner } from './banner';
import { prepareDatabase } from './database';
import { prepareDemoRecordings } from './demo-files';
import { startRedis } from './redis';
import { markServing, onShutdown } from './shutdown';

process.env.PUBLIC_ORIGIN ??= 'http://127.0.0.1:5173'; // links in mail open the dev server
process.env.ALLOWED_ORIGINS ??= 'http://localhost:5173'; // the dev server by its other name
const config = loadConfig();
const { mariadb } = await prepareDatabase('app', config.db, { demoDir: config.demoRecordingsDir });
onShutdown(() => mariadb.stop());
mariadb.supervise();
const redis = await startRedis('app');
onShutdown(() => redis.stop());
prepareDemoRecordings(config);
const mailLine = await startMailFakeIfWanted(config);
const app = await serve(config);
onShutdown(() => app.stop());

const { createServer } = await import('vite');
process.env.API_PORT = String(config.port);
const vite = await createServer({ configFile: new URL('../../vite.config.ts', import.meta.url).pathname });
await vite.listen();
onShutdown(() => vite.close());
markServing();
printBanner('http://127.0.0.1:5173', [`  (API on ${app.url})`, ...(mailLine ? [mailLine] : [])]);
