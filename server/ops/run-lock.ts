/**
 * One `npm test` at a time per checkout: two runs would share the test MariaDB, and the second would
 * stop it under the first. A second run waits for the first (proper-lockfile: a lock directory whose
 * mtime the holder keeps fresh, so a run that was killed leaves a lock that goes stale on its own).
 */
import { mkdirSync } from 'node:fs';
import path from 'node:path';
import lockfile from 'proper-lockfile';
import { DATA_DIR } from '../config';
import { onShutdown } from './shutdown';

const WAIT_MS = 30 * 60 * 1000;

export async function holdRunLock(name: string): Promise<void> {
  mkdirSync(DATA_DIR, { recursive: true });
  const options = { lockfilePath: path.join(DATA_DIR, `${name}.lock`), stale: 20_000, update: 5_000, realpath: false };
  let release: () => Promise<void>;
  try {
    release = await lockfile.lock(DATA_DIR, options);
  } catch (e) {
    if ((e as { code?: string }).code !== 'ELOCKED') throw e;
    console.log(`fanlight ${name}: another run holds ${options.lockfilePath}; waiting for it to finish`);
    release = await lockfile.lock(DATA_DIR, { ...options, retries: { retries: WAIT_MS / 2000, factor: 1, minTimeout: 2000, maxTimeout: 2000 } });
  }
  onShutdown(() => release().catch(() => undefined));
}
