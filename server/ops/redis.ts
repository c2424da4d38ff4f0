/**
 * A private Redis for campaign queues (tracker issue #18), like the private MariaDB: its own folder
 * (.data/redis-<mode>), its own port on 127.0.0.1, no persistence, started as a plain process and stopped
 * on shutdown. REDIS_URL set to a real Redis starts none; otherwise it is set to this one for the
 * processes started after it (the tests).
 */
import { spawn } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { connect } from 'node:net';
import path from 'node:path';
import { DATA_DIR } from '../config';
import { isAlive, sleep } from './process-state';

/** 36379 for `npm start` and `npm run dev`, 36380 for `npm test`, so both run side by side. */
export const REDIS_PORTS = { app: 36379, test: 36380 } as const;

function findRedisServer(): string {
  for (const dir of ['/usr/bin', '/usr/sbin', '/usr/local/bin']) {
    const candidate = path.join(dir, 'redis-server');
    if (existsSync(candidate)) return candidate;
  }
  throw new Error("redis-server not found: install Debian's redis-server (npm start does this with apt-get), or set REDIS_URL.");
}


/** True when a Redis answers PING on 127.0.0.1:port within a second. */
export function pingRedis(port: number): Promise<boolean> {
  return new Promise((resolve) => {
    const socket = connect({ host: '127.0.0.1', port });
    const done = (ok: boolean) => {
      socket.destroy();
      resolve(ok);
    };
    socket.setTimeout(1000, () => done(false));
    socket.once('error', () => done(false));
    socket.once('connect', () => socket.write('PING\r\n'));
    socket.once('data', (d) => done(d.toString().startsWith('+PONG')));
  });
}

export class PrivateRedis {
  readonly dir: string;
  readonly pidFile: string;
  private owned = false;
  /** True when start() found this instance already running (left running on stop). */
  adopted = false;

  constructor(
    readonly mode: 'app' | 'test',
    readonly port: number,
    dir = path.join(DATA_DIR, `redis-${mode}`),
  ) {
    this.dir = dir;
    this.pidFile = path.join(this.dir, 'redis-server.pid');
  }

  get url(): string {
    return `redis://127.0.0.1:${this.port}`;
  }

  private pidFromFile(): number | null {
    if (!existsSync(this.pidFile)) return null;
    const pid = Number(readFileSync(this.pidFile, 'utf8').trim());
    return Number.isInteger(pid) && pid > 0 ? pid : null;
  }

  async start(timeoutMs = 10_000): Promise<void> {
    mkdirSync(this.dir, { recursive: true });
    const pid = this.pidFromFile();
    // ours from an earlier start, or another checkout's on the same port: used as it is, left running
    if (await pingRedis(this.port)) {
      this.adopted = true;
      return;
    }
    // a pid file left by a crash (or a pid since reused by another process): not ours to signal
    if (pid) rmSync(this.pidFile, { force: true });
    const args = ['--port', String(this.port), '--bind', '127.0.0.1', '--dir', this.dir, '--save', '', '--appendonly', 'no', '--daemonize', 'no'];
    // detached: its own process group, so a Ctrl-C in the terminal reaches us and we stop it in order
    const child = spawn(findRedisServer(), args, { detached: true, stdio: 'ignore' });
    child.unref();
    writeFileSync(this.pidFile, `${child.pid}\n`);
    this.owned = true;
    const deadline = Date.now() + timeoutMs;
    while (Date.now() < deadline) {
      if (await pingRedis(this.port)) return;
      if (child.exitCode !== null) break;
      await sleep(100);
    }
    throw new Error(`Redis on 127.0.0.1:${this.port} did not answer within ${timeoutMs} ms (is the port taken? REDIS_URL points at another Redis).`);
  }

  /** Stops the instance if this process started it. */
  async stop(timeoutMs = 5000): Promise<void> {
    if (!this.owned) return;
    this.owned = false;
    const pid = this.pidFromFile();
    if (!pid) return;
    if (isAlive(pid)) process.kill(pid, 'SIGTERM');
    const deadline = Date.now() + timeoutMs;
    while (isAlive(pid) && Date.now() < deadline) await sleep(50);
    if (isAlive(pid)) process.kill(pid, 'SIGKILL');
    rmSync(this.pidFile, { force: true });
  }
}

/**
 * The Redis campaigns use in this mode: REDIS_URL when set (nothing started), else the private instance,
 * whose URL is then put in REDIS_URL for the processes started after it.
 */
export async function startRedis(mode: 'app' | 'test', log: (line: string) => void = console.log): Promise<{ url: string; stop: () => Promise<void> }> {
  if (process.env.REDIS_URL) return { url: process.env.REDIS_URL, stop: async () => {} };
  const redis = new PrivateRedis(mode, REDIS_PORTS[mode]);
  log(`fanlight: starting Redis on 127.0.0.1:${redis.port} (campaign queues)`);
  await redis.start();
  process.env.REDIS_URL = redis.url;
  return { url: redis.url, stop: () => redis.stop() };
}
