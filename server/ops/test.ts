/**
 * `npm test`: a separate private MariaDB (its own port and data folder, so it runs beside `npm start`),
 * a fresh test database, migrations and seed, a type check, lint, the client build, then every test (unit,
 * API and browser) in one vitest run. Prints vitest's summary and, last, `tests: N passed, N failed`.
 * Extra arguments go to vitest (`npm test -- tests/unit`).
 */
process.env.NODE_ENV = 'test';

import { spawn } from 'node:child_process';
import { existsSync, readFileSync, rmSync } from 'node:fs';
import path from 'node:path';
import { DATA_DIR, PROJECT_ROOT, loadConfig } from '../config';
import { buildClientIfStale } from './client-build';
import { prepareDatabase } from './database';
import { prepareDemoRecordings } from './demo-files';
import { startRedis } from './redis';
import { holdRunLock } from './run-lock';
import { startMailFakeIfWanted } from './mail-fake';
import { onShutdown, shutdown } from './shutdown';

function run(command: string, args: string[], env: NodeJS.ProcessEnv = process.env): Promise<number> {
  return new Promise((resolve) => {
    const child = spawn(command, args, { cwd: PROJECT_ROOT, env, stdio: 'inherit' });
    child.on('exit', (code, signal) => resolve(code ?? (signal ? 1 : 0)));
  });
}

interface VitestJsonReport {
  numPassedTests: number;
  numFailedTests: number;
  numPendingTests?: number;
  numTodoTests?: number;
  /** Files and describe blocks that failed (with a failed test in them, or as a whole: a load or hook error) */
  numFailedTestSuites?: number;
}

const bin = (name: string) => path.join(PROJECT_ROOT, 'node_modules', '.bin', name);
// TypeScript 7's tsc; node_modules/.bin/tsc is TypeScript 6's, from the compiler API package that typescript-eslint needs.
const tsc7 = path.join(PROJECT_ROOT, 'node_modules', 'typescript7', 'bin', 'tsc');
const config = loadConfig();

await holdRunLock('test');
console.log(`fanlight test: starting the test MariaDB on 127.0.0.1:${config.db.port}`);
const { mariadb } = await prepareDatabase('test', config.db, { recreate: true, demoDir: config.demoRecordingsDir });
onShutdown(() => mariadb.stop());
// the test processes get REDIS_URL (127.0.0.1:36380 unless REDIS_URL names a real Redis)
const redis = await startRedis('test');
onShutdown(() => redis.stop());
rmSync(config.smtp.outboxDir, { recursive: true, force: true }); // each run reads only its own mail
await startMailFakeIfWanted(config);

prepareDemoRecordings(config);
console.log('fanlight test: type check');
const typecheck = await run(tsc7, ['--noEmit', '-p', 'tsconfig.json']);
if (typecheck !== 0) console.error('fanlight test: the type check failed (see above)');

console.log('fanlight test: lint');
const lint = await run(bin('eslint'), ['.', '--max-warnings', '0']);
if (lint !== 0) console.error('fanlight test: lint failed (see above; `npm run lint` runs it alone)');

console.log('fanlight test: building the client');
console.log(`fanlight test: client ${await buildClientIfStale(config.clientDir)}`);

const report = path.join(DATA_DIR, 'vitest-report.json');
rmSync(report, { force: true });
const vitest = await run(
  bin('vitest'),
  ['run', '--reporter=default', '--reporter=json', `--outputFile.json=${report}`, ...process.argv.slice(2)],
  { ...process.env, NODE_ENV: 'test', FANLIGHT_TEST_DATA: DATA_DIR },
);

let passed = 0;
let failed = 0;
let skipped = 0;
let brokenFiles = 0;
if (existsSync(report)) {
  const r = JSON.parse(readFileSync(report, 'utf8')) as VitestJsonReport;
  passed = r.numPassedTests;
  failed = r.numFailedTests;
  skipped = (r.numPendingTests ?? 0) + (r.numTodoTests ?? 0);
  // suites fail with their failed tests; with none failed, they failed as a whole (load or hook errors)
  brokenFiles = failed === 0 ? (r.numFailedTestSuites ?? 0) : 0;
} else if (vitest !== 0) {
  console.error('fanlight test: vitest wrote no report');
}
if (lint !== 0) console.error('fanlight test: lint failed, so the run fails (`npm run lint` to see why)');
console.log(`tests: ${passed} passed, ${failed} failed${skipped ? `, ${skipped} skipped` : ''}${brokenFiles ? `; ${brokenFiles} test files or blocks failed as a whole (see above)` : ''}`);
await shutdown(vitest !== 0 || typecheck !== 0 || lint !== 0 || failed > 0 ? 1 : 0);
