/**
 * The server as a process: a graceful stop on SIGTERM (the request in flight is answered, new connections
 * are refused, then the pool closes and the process exits 0), and a private MariaDB that starts after an
 * unclean stop left its pid and socket files behind.
 */
import { spawn } from 'node:child_process';
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { connect } from 'node:net';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { DATA_DIR, PROJECT_ROOT } from '../../server/config';
import { PrivateMariaDb } from '../../server/ops/mariadb';

function rawRequest(port: number, head: string) {
  const socket = connect(port, '127.0.0.1');
  let answer = '';
  socket.on('data', (d) => (answer += d.toString()));
  const ended = new Promise<string>((resolve) => {
    socket.on('close', () => resolve(answer));
    socket.on('error', () => resolve(answer));
  });
  socket.write(head);
  return { socket, ended };
}

describe('the server process', () => {
  it('on SIGTERM answers the request in flight, refuses new connections, closes the pool and exits 0', async () => {
    const child = spawn(process.execPath, ['--import', 'tsx', path.join(PROJECT_ROOT, 'server/index.ts')], {
      env: { ...process.env, NODE_ENV: 'test', PORT: '0', CLIENT_DIR: path.join(DATA_DIR, 'no-client') },
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    let out = '';
    child.stdout.on('data', (d) => (out += d));
    child.stderr.on('data', (d) => (out += d));
    const exited = new Promise<number | null>((resolve) => child.on('exit', (code) => resolve(code)));
    const deadline = Date.now() + 30_000;
    while (!/on http:\/\/127\.0\.0\.1:(\d+)/.test(out) && Date.now() < deadline) await new Promise((r) => setTimeout(r, 50));
    const port = Number(out.match(/on http:\/\/127\.0\.0\.1:(\d+)/)![1]);

    // a sign-in whose body is still on its way when the stop comes
    const body = JSON.stringify({ email: 'nobody@fanlight.test', password: 'not the password' });
    const inFlight = rawRequest(port, `POST /api/auth/signin HTTP/1.1\r\nHost: x\r\nContent-Type: application/json\r\nContent-Length: ${body.length}\r\n\r\n${body.slice(0, 5)}`);
    await new Promise((r) => setTimeout(r, 300));
    child.kill('SIGTERM');
    await new Promise((r) => setTimeout(r, 300));
    const refused = await new Promise<boolean>((resolve) => {
      const s = connect(port, '127.0.0.1');
      s.on('connect', () => {
        s.destroy();
        resolve(false);
      });
      s.on('error', () => resolve(true));
    });
    expect(refused).toBe(true);
    inFlight.socket.write(body.slice(5));
    const answer = await inFlight.ended;
    expect(answer).toMatch(/^HTTP\/1\.1 401 /);
    expect(answer).toContain('INVALID_CREDENTIALS');
    expect(await exited).toBe(0);
  }, 60_000);

  it('a private MariaDB comes up after an unclean stop left stale pid and socket files', async () => {
    const base = mkdtempSync(path.join(DATA_DIR, 'mariadb-stale-'));
    const db = new PrivateMariaDb({ baseDir: base, port: 33319 });
    try {
      mkdirSync(path.join(base, 'run'), { recursive: true });
      // a pid that is certainly not a running mariadbd, and a socket file nobody listens on
      writeFileSync(db.pidFile, '999999\n');
      writeFileSync(db.socketPath, '');
      await db.start();
      expect(db.isRunning()).toBe(true);
      expect(await db.ping()).toBe(true);
    } finally {
      await db.stop();
      rmSync(base, { recursive: true, force: true });
    }
  }, 60_000);
});
