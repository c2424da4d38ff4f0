/**
 * A private MariaDB instance for one purpose (the app, or the tests): its own data folder under .data/,
 * its own port and socket on 127.0.0.1, started as a plain process (no system service, no systemd).
 */
import { spawn, spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import mysql from 'mysql2/promise';
import { isAlive, sleep } from './process-state';

export interface PrivateMariaDbOptions {
  /** Folder that holds data/, run/ and the error log, e.g. .data/mariadb-app */
  baseDir: string;
  port: number;
}

export interface DatabaseGrant {
  database: string;
  user: string;
  password: string;
}

const SOCKET_PATH_LIMIT = 100; // sun_path is 108 bytes on Linux; keep a margin.

function findBinary(name: string): string {
  for (const dir of ['/usr/sbin', '/usr/bin', '/usr/local/sbin', '/usr/local/bin']) {
    const candidate = path.join(dir, name);
    if (existsSync(candidate)) return candidate;
  }
  throw new Error(`${name} not found: install Debian's mariadb-server (npm start does this with apt-get).`);
}


export class PrivateMariaDb {
  readonly dataDir: string;
  readonly runDir: string;
  readonly socketPath: string;
  readonly pidFile: string;
  readonly errorLog: string;
  /** True when this process started mariadbd and so must stop it. */
  private owned = false;
  private supervisor: NodeJS.Timeout | undefined;
  /** True when start() found the instance already running. */
  adopted = false;
  private stopped = false;

  constructor(private readonly options: PrivateMariaDbOptions) {
    const base = path.resolve(options.baseDir);
    this.dataDir = path.join(base, 'data');
    this.runDir = path.join(base, 'run');
    this.pidFile = path.join(this.runDir, 'mariadbd.pid');
    this.errorLog = path.join(base, 'mariadbd.err');
    const socket = path.join(this.runDir, 'mariadbd.sock');
    // A deep checkout would overflow the socket path limit; fall back to a per-folder name in /tmp.
    this.socketPath =
      socket.length <= SOCKET_PATH_LIMIT
        ? socket
        : path.join(tmpdir(), `fanlight-${createHash('sha1').update(base).digest('hex').slice(0, 12)}.sock`);
  }

  get port(): number {
    return this.options.port;
  }

  private runningPid(): number | null {
    if (!existsSync(this.pidFile)) return null;
    const pid = Number(readFileSync(this.pidFile, 'utf8').trim());
    return Number.isInteger(pid) && pid > 0 && isAlive(pid) ? pid : null;
  }

  private initialise(): void {
    if (existsSync(path.join(this.dataDir, 'mysql'))) return;
    rmSync(this.dataDir, { recursive: true, force: true });
    mkdirSync(this.dataDir, { recursive: true });
    const result = spawnSync(
      findBinary('mariadb-install-db'),
      [
        '--no-defaults',
        `--datadir=${this.dataDir}`,
        '--user=root',
        '--auth-root-authentication-method=normal',
        '--skip-test-db',
      ],
      { encoding: 'utf8' },
    );
    if (result.status !== 0) {
      throw new Error(`mariadb-install-db failed (exit ${result.status}):\n${result.stderr || result.stdout}`);
    }
  }

  /** Opens a root connection over the private socket, or returns null when the server does not answer. */
  async rootConnection(): Promise<mysql.Connection | null> {
    try {
      return await mysql.createConnection({ socketPath: this.socketPath, user: 'root', multipleStatements: false });
    } catch {
      return null;
    }
  }

  async ping(): Promise<boolean> {
    const conn = await this.rootConnection();
    if (!conn) return false;
    await conn.end();
    return true;
  }

  /** Starts the instance (or adopts one already running on the same data folder) and waits until it answers. */
  async start(timeoutMs = 30_000): Promise<void> {
    mkdirSync(this.runDir, { recursive: true });
    this.adopted = false;
    if (this.runningPid() && (await this.ping())) {
      // Left running by an earlier start, or started by someone else: use it, and leave it running when we
      // stop (we never stop a database we did not start).
      this.adopted = true;
      return;
    }
    this.initialise();
    const args = [
      '--no-defaults', // must come first: keeps /etc/mysql (system socket, port 3306) out
      `--datadir=${this.dataDir}`,
      `--socket=${this.socketPath}`,
      `--port=${this.options.port}`,
      '--bind-address=127.0.0.1',
      `--pid-file=${this.pidFile}`,
      `--log-error=${this.errorLog}`,
      '--skip-name-resolve',
      '--character-set-server=utf8mb4',
      '--collation-server=utf8mb4_unicode_ci',
      '--innodb-buffer-pool-size=128M',
    ];
    if (process.getuid?.() === 0) args.push('--user=root');
    // detached: its own process group, so a Ctrl-C in the terminal reaches us and we stop it in order.
    const child = spawn(findBinary('mariadbd'), args, { detached: true, stdio: 'ignore' });
    child.unref();
    this.owned = true;
    const deadline = Date.now() + timeoutMs;
    while (Date.now() < deadline) {
      if (await this.ping()) return;
      if (child.exitCode !== null) break;
      await sleep(100);
    }
    const log = existsSync(this.errorLog) ? readFileSync(this.errorLog, 'utf8').split('\n').slice(-15).join('\n') : '';
    throw new Error(`MariaDB on 127.0.0.1:${this.options.port} did not answer within ${timeoutMs} ms.\n${log}`);
  }

  /** Creates the database and the application user (idempotent; the password follows the environment). */
  async ensureDatabase(grant: DatabaseGrant, { recreate = false } = {}): Promise<void> {
    const conn = await this.rootConnection();
    if (!conn) throw new Error('MariaDB is not running.');
    try {
      const db = conn.escapeId(grant.database);
      if (recreate) await conn.query(`DROP DATABASE IF EXISTS ${db}`);
      await conn.query(`CREATE DATABASE IF NOT EXISTS ${db} CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
      for (const host of ['127.0.0.1', 'localhost']) {
        await conn.query('CREATE USER IF NOT EXISTS ?@? IDENTIFIED BY ?', [grant.user, host, grant.password]);
        await conn.query('ALTER USER ?@? IDENTIFIED BY ?', [grant.user, host, grant.password]);
        await conn.query(`GRANT ALL PRIVILEGES ON ${db}.* TO ?@?`, [grant.user, host]);
      }
    } finally {
      await conn.end();
    }
  }

  /** Stops the instance if this process started it; waits for it to exit so the data is flushed. */
  async stop(timeoutMs = 30_000): Promise<void> {
    this.stopped = true;
    if (this.supervisor) clearInterval(this.supervisor);
    if (!this.owned) return;
    this.owned = false;
    await this.terminate('SIGTERM', timeoutMs);
  }

  /**
   * Ends the running mariadbd whoever started it (tests of the app's behaviour while its database is away):
   * SIGTERM is a clean shutdown, SIGKILL a crash that InnoDB recovers from at the next start.
   */
  async terminate(signal: 'SIGTERM' | 'SIGKILL' = 'SIGTERM', timeoutMs = 30_000): Promise<void> {
    const pid = this.runningPid();
    if (!pid) return;
    process.kill(pid, signal);
    const deadline = Date.now() + timeoutMs;
    while (isAlive(pid) && Date.now() < deadline) await sleep(50);
    if (isAlive(pid)) process.kill(pid, 'SIGKILL');
  }

  /** Stops watching (the instance itself keeps running). */
  unsupervise(): void {
    if (this.supervisor) clearInterval(this.supervisor);
    this.supervisor = undefined;
  }

  /** True while mariadbd's pid (from its pid file) is alive. */
  isRunning(): boolean {
    return this.runningPid() !== null;
  }

  /**
   * Watches the instance and starts it again when it dies (crash, OOM kill, a stray `kill`), waiting 1, 2, 4 …
   * up to 30 s between attempts; the wait resets once it has run for a minute. Says each step on `log`.
   */
  supervise(log: (line: string) => void = console.log, everyMs = 1000): void {
    let backoffMs = 1000;
    let nextAttempt = 0;
    let upSince = Date.now();
    let restarting = false;
    this.supervisor = setInterval(() => {
      if (this.stopped || restarting) return;
      if (this.isRunning()) {
        if (Date.now() - upSince > 60_000) backoffMs = 1000;
        return;
      }
      const now = Date.now();
      if (nextAttempt === 0) {
        log(`fanlight: MariaDB on 127.0.0.1:${this.port} is not running (see ${this.errorLog}); restarting it in ${backoffMs / 1000} s`);
        nextAttempt = now + backoffMs;
        return;
      }
      if (now < nextAttempt) return;
      restarting = true;
      this.start()
        .then(() => {
          if (this.stopped) return this.stop();
          upSince = Date.now();
          nextAttempt = 0;
          log(`fanlight: MariaDB on 127.0.0.1:${this.port} restarted`);
        })
        .catch((e: unknown) => {
          backoffMs = Math.min(backoffMs * 2, 30_000);
          nextAttempt = Date.now() + backoffMs;
          log(`fanlight: MariaDB did not restart (${(e as Error).message.split('\n')[0]}); next try in ${backoffMs / 1000} s`);
        })
        .finally(() => {
          restarting = false;
        });
    }, everyMs);
    this.supervisor.unref();
  }
}
