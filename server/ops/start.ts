/**
 * `npm start`: private MariaDB and Redis (campaign queues, 127.0.0.1:36379) → database, user, migrations,
 * demo seed → client build → mail fake → app + API on http://127.0.0.1:3000 (PORT overrides). Ctrl-C stops
 * everything this started; the data stays in .data/.
 */
import { loadConfig } from '../config';
import { serve } from '../index';
import { printBanner } from './banner';
import { buildClientIfStale } from './client-build';
import { prepareDatabase } from './database';
import { prepareDemoRecordings } from './demo-files';
import { startRedis } from './redis';
import { startMailFakeIfWanted } from './mail-fake';
import { markServing, onShutdown } from './shutdown';

const config = loadConfig();
console.log(`fanlight: starting MariaDB on 127.0.0.1:${config.db.port}`);
const { mariadb, applied, seed } = await prepareDatabase('app', config.db, { demoDir: config.demoRecordingsDir });
if (mariadb.adopted) console.log('fanlight: MariaDB was already running; it is used as it is and left running when Fanlight stops');
onShutdown(() => mariadb.stop());
// If the database dies under the app, start it again (with a growing wait); the app answers 503 meanwhile.
mariadb.supervise();
const redis = await startRedis('app');
onShutdown(() => redis.stop());
if (applied.length) console.log(`fanlight: applied ${applied.length} migration(s)`);
if (seed.usersCreated || seed.projectCreated) console.log('fanlight: seeded the demo accounts and project');
if (seed.recordingsRegistered || seed.viewCreated) console.log('fanlight: seeded the demo recordings and the demo view');

console.log('fanlight: building the client');
console.log(`fanlight: client ${await buildClientIfStale(config.clientDir)}`);

prepareDemoRecordings(config);
const mailLine = await startMailFakeIfWanted(config);
const app = await serve(config);
onShutdown(() => app.stop());
printBanner(app.url, mailLine ? ['', mailLine] : []);
markServing();
