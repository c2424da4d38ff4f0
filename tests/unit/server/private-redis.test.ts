/**
 * server/ops/redis.ts: the private Redis starts over a stale pid file (a crash's leftover), answers PING
 * (the Redis protocol's inline command, answered "+PONG"), is adopted and left running by a second start,
 * and is gone after stop(); REDIS_URL set starts none.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, writeFileSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterEach, describe, expect, it } from 'vitest';
import { pingRedis, PrivateRedis, startRedis } from '../../../server/ops/redis';
import { REDIS_SERVER, redisServerInstalled } from '../../support/private-redis';

const installed = redisServerInstalled();
if (!installed) console.warn(`private Redis tests skipped: ${REDIS_SERVER} is absent (apt-get install redis-server).`);

function freePort(): Promise<number> {
  return new Promise((resolve) => {
    const s = createServer().listen(0, '127.0.0.1', () => {
      const { port } = s.address() as { port: number };
      s.close(() => resolve(port));
    });
  });
}

const started: PrivateRedis[] = [];
afterEach(async () => {
  for (const r of started.splice(0)) await r.stop();
});

describe.skipIf(!installed)('PrivateRedis', () => {
  it('starts over a stale pid file, is adopted by a second start, and stops', async () => {
    const dir = mkdtempSync(path.join(tmpdir(), 'fanlight-private-redis-'));
    const port = await freePort();
    // the pid of a process that has exited: what a crash leaves behind
    const dead = spawnSync(process.execPath, ['-e', 'process.pid']).pid!;
    writeFileSync(path.join(dir, 'redis-server.pid'), `${dead}\n`);
    const redis = new PrivateRedis('test', port, dir);
    started.push(redis);
    await redis.start();
    expect(redis.adopted).toBe(false);
    expect(await pingRedis(port)).toBe(true);

    const again = new PrivateRedis('test', port, dir);
    await again.start();
    expect(again.adopted).toBe(true);
    await again.stop(); // not its own: left running
    expect(await pingRedis(port)).toBe(true);

    await redis.stop();
    expect(await pingRedis(port)).toBe(false);
    expect(existsSync(redis.pidFile)).toBe(false);
  });

  it('starts nothing when REDIS_URL names a Redis', async () => {
    const before = process.env.REDIS_URL;
    process.env.REDIS_URL = 'redis://redis.example.invalid:6379';
    try {
      const r = await startRedis('test', () => {
        throw new Error('nothing should start');
      });
      expect(r.url).toBe('redis://redis.example.invalid:6379');
    } finally {
      if (before === undefined) delete process.env.REDIS_URL;
      else process.env.REDIS_URL = before;
    }
  });
});
