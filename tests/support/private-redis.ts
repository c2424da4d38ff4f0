/**
 * A throwaway redis-server for one test or bench run: a free port on 127.0.0.1, its folder in tmp, no
 * persistence; stopped (and its folder removed) by stop().
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync, mkdtempSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import path from 'node:path';

export const REDIS_SERVER = '/usr/bin/redis-server';

export function redisServerInstalled(): boolean {
  return existsSync(REDIS_SERVER);
}

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = createServer();
    s.once('error', reject);
    s.listen(0, '127.0.0.1', () => {
      const { port } = s.address() as { port: number };
      s.close(() => resolve(port));
    });
  });
}

export interface TestRedis {
  url: string;
  port: number;
  stop(): Promise<void>;
}

export async function startTestRedis(): Promise<TestRedis> {
  const port = await freePort();
  const dir = mkdtempSync(path.join(tmpdir(), 'fanlight-redis-'));
  const child: ChildProcess = spawn(REDIS_SERVER, ['--port', String(port), '--bind', '127.0.0.1', '--dir', dir, '--save', '', '--appendonly', 'no', '--daemonize', 'no'], {
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let log = '';
  child.stdout!.on('data', (d: Buffer) => (log += d.toString()));
  await new Promise<void>((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error(`redis-server on ${port} did not start within 10 s:\n${log}`)), 10_000);
    child.stdout!.on('data', () => {
      if (/Ready to accept connections/.test(log)) {
        clearTimeout(timer);
        resolve();
      }
    });
    child.once('exit', (code) => {
      clearTimeout(timer);
      reject(new Error(`redis-server exited (${code}):\n${log}`));
    });
  });
  return {
    url: `redis://127.0.0.1:${port}`,
    port,
    async stop() {
      if (child.exitCode === null) {
        const exited = new Promise((resolve) => child.once('exit', resolve));
        child.kill('SIGTERM');
        await exited;
      }
      rmSync(dir, { recursive: true, force: true });
    },
  };
}
