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
import { randomUUID } from 'node:crypto';
import { PrivateMariaDb } from '../../server/ops/mariadb';
import { ACTOR_PASSWORD, makeProject, makeUser } from '../support/actors';
import { openTestDb } from '../support/test-db';
import { SNAPSHOT_TYPE, sampleState, snapshotBytes } from './view-fixtures';

/** Starts `npm run serve`'s entry point on the test database; resolves with its port once it listens. */
async function startServer(): Promise<{ child: ReturnType<typeof spawn>; port: number; output: () => string }> {
  const child = spawn(process.execPath, ['--import', 'tsx', path.join(PROJECT_ROOT, 'server/index.ts')], {
    env: { ...process.env, NODE_ENV: 'test', PORT: '0', CLIENT_DIR: path.join(DATA_DIR, 'no-client') },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let out = '';
  child.stdout!.on('data', (d) => (out += d));
  child.stderr!.on('data', (d) => (out += d));
  const deadline = Date.now() + 30_000;
  while (!/on http:\/\/127\.0\.0\.1:(\d+)/.test(out) && Date.now() < deadline) await new Promise((r) => setTimeout(r, 50));
  const m = out.match(/on http:\/\/127\.0\.0\.1:(\d+)/);
  if (!m) throw new Error(`the server did not start: ${out}`);
  return { child, port: Number(m[1]), output: () => out };
}

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

  it('killed with SIGKILL during a load of whole-view saves: every acknowledged save is there whole, none half, and the session survives', async () => {
    const db = openTestDb();
    const engineer = await makeUser(db, 'sigkill', 'staff');
    const projectId = await makeProject(db, [{ id: engineer.id, role: 'engineer' }]);
    const first = await startServer();
    const base = `http://127.0.0.1:${first.port}`;
    const signin = await fetch(`${base}/api/auth/signin`, {
      method: 'POST',
      headers: { 'Content-Type': 'application/json' },
      body: JSON.stringify({ email: engineer.email, password: ACTOR_PASSWORD }),
    });
    const cookie = (signin.headers.get('set-cookie') ?? '').split(';')[0];
    const csrf = ((await (await fetch(`${base}/api/auth/csrf`, { headers: { Cookie: cookie } })).json()) as { token: string }).token;
    const tag = `sigkill ${randomUUID().slice(0, 8)}`;
    const acknowledged: number[] = [];
    let stop = false;
    const save = async (client: number, i: number) => {
      const form = new FormData();
      form.append('view', JSON.stringify({ title: `${tag} ${client}-${i}`, recordingId: null, state: sampleState(), marks: [{ kind: 'point', geometry: { x: 1, y: 2 }, text: 'a' }, { kind: 'point', geometry: { x: 3, y: 4 }, text: 'b' }] }));
      form.append('snapshot', new Blob([new Uint8Array(snapshotBytes(32, 16))], { type: SNAPSHOT_TYPE }), 'map.fls');
      try {
        const res = await fetch(`${base}/api/projects/${projectId}/views`, { method: 'POST', headers: { Cookie: cookie, 'X-CSRF-Token': csrf }, body: form });
        if (res.status === 201) acknowledged.push(((await res.json()) as { view: { id: number } }).view.id);
      } catch {
        // the server died under this request: its outcome is unknown to the client
      }
    };
    const load = Promise.all([0, 1, 2, 3].map(async (c) => { for (let i = 0; !stop && i < 500; i++) await save(c, i); }));
    await new Promise((r) => setTimeout(r, 1500));
    first.child.kill('SIGKILL');
    stop = true;
    await load;
    expect(acknowledged.length).toBeGreaterThan(0);

    const second = await startServer();
    try {
      const again = `http://127.0.0.1:${second.port}`;
      for (const id of acknowledged) {
        const res = await fetch(`${again}/api/views/${id}`, { headers: { Cookie: cookie } });
        expect(res.status).toBe(200); // the session made before the kill still signs in
        expect(((await res.json()) as { view: { snapshot: unknown } }).view.snapshot).not.toBeNull();
      }
      // whatever was stored is whole: every view of the run has its snapshot and both marks
      const rows = await db('views as v')
        .where('v.title', 'like', `${tag}%`)
        .select('v.id', db.raw('(select count(*) from marks m where m.view_id = v.id) as marks'), db.raw('(select count(*) from view_snapshots s where s.view_id = v.id) as snaps'));
      expect(rows.length).toBeGreaterThanOrEqual(acknowledged.length);
      for (const r of rows as { id: number; marks: number; snaps: number }[]) {
        expect([Number(r.marks), Number(r.snaps)]).toEqual([2, 1]);
      }
    } finally {
      second.child.kill('SIGTERM');
      await new Promise((r) => second.child.once('exit', r));
      await db.destroy();
    }
  }, 90_000);

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
