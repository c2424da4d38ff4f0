/**
 * The project store under load: N signed-in clients on loopback, each sending requests back to back for a
 * fixed time, a mix of four in equal parts (the projects list, one project, its views, and creating a mark).
 * The API runs in a child process (as `npm run serve` runs it) on a private MariaDB of its own (port 33309),
 * so client and server each have a core. Every acknowledged create is checked to be stored afterwards.
 * Bounded in time and count; loopback only.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { Agent, request } from 'node:http';
import { mkdirSync } from 'node:fs';
import path from 'node:path';
import bcrypt from 'bcryptjs';
import { DATA_DIR, PROJECT_ROOT, loadConfig } from '../../server/config';
import { createDb } from '../../server/db/knex';
import { prepareDatabase } from '../../server/ops/database';

export interface LoadRun {
  clients: number;
  seconds: number;
  requests: number;
  perSecond: number;
  p50Ms: number;
  p99Ms: number;
  failures: number;
  writesAcknowledged: number;
  writesMissing: number;
}

const BENCH_PASSWORD = 'load-bench-password';

interface Client {
  cookie: string;
  csrf: string;
}

function call(agent: Agent, port: number, method: string, pathName: string, headers: Record<string, string>, body?: string) {
  return new Promise<{ status: number; body: string; headers: Record<string, string | string[] | undefined> }>((resolve, reject) => {
    const req = request({ host: '127.0.0.1', port, method, path: pathName, agent, headers }, (res) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => resolve({ status: res.statusCode ?? 0, body: Buffer.concat(chunks).toString('utf8'), headers: res.headers }));
      res.on('error', reject);
    });
    req.on('error', reject);
    if (body) req.end(body);
    else req.end();
  });
}

function percentile(sorted: number[], p: number): number {
  return sorted[Math.min(sorted.length - 1, Math.floor((p / 100) * sorted.length))];
}

async function waitForLine(child: ChildProcess, pattern: RegExp, timeoutMs: number): Promise<string> {
  return new Promise((resolve, reject) => {
    let seen = '';
    const timer = setTimeout(() => reject(new Error(`server did not start: ${seen}`)), timeoutMs);
    const onData = (d: Buffer) => {
      seen += d.toString();
      const m = seen.match(pattern);
      if (m) {
        clearTimeout(timer);
        resolve(m[1]);
      }
    };
    child.stdout?.on('data', onData);
    child.stderr?.on('data', (d: Buffer) => (seen += d.toString()));
  });
}

export async function runApiLoadBench(log: (line: string) => void, plan = [20, 200], seconds = Number(process.env.FANLIGHT_LOAD_SECONDS ?? 20)): Promise<LoadRun[]> {
  const env = { ...process.env, NODE_ENV: 'test', DB_PORT: '33309', DB_NAME: 'fanlight_load' };
  const config = loadConfig(env);
  const { mariadb } = await prepareDatabase('load', config.db, { recreate: true });
  const db = createDb(config.db);
  const maxClients = Math.max(...plan);
  // A cheap hash (cost 4) so that signing in 200 clients takes no time; the server checks it as any other.
  const hash = await bcrypt.hash(BENCH_PASSWORD, 4);
  const users: { id: number; email: string }[] = [];
  for (let i = 0; i < maxClients; i++) {
    const email = `load-${i}@fanlight.test`;
    const [id] = await db('users').insert({ email, name: `Load ${i}`, password_hash: hash, site_role: 'staff' });
    users.push({ id, email });
  }
  const [projectId] = await db('projects').insert({ name: 'Load project', description: 'the load benchmark' });
  await db('project_members').insert(users.map((u) => ({ project_id: projectId, user_id: u.id, role: 'engineer' })));
  const [viewId] = await db('views').insert({
    project_id: projectId,
    title: 'Load view',
    state: JSON.stringify({ stateVersion: 1 }),
    created_by: users[0].id,
  });
  for (let i = 0; i < 30; i++) {
    await db('views').insert({ project_id: projectId, title: `Load view ${i}`, state: JSON.stringify({ stateVersion: 1 }), created_by: users[i % users.length].id });
  }

  const clientDir = path.join(DATA_DIR, 'load-no-client');
  mkdirSync(clientDir, { recursive: true });
  const profile = process.env.FANLIGHT_LOAD_PROFILE ? ['--cpu-prof', `--cpu-prof-dir=${process.env.FANLIGHT_LOAD_PROFILE}`] : [];
  const server = spawn(process.execPath, [...profile, '--import', 'tsx', path.join(PROJECT_ROOT, 'server/index.ts')], {
    env: { ...env, PORT: '0', SESSION_SECRET: 'load-bench-secret', CLIENT_DIR: clientDir },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  const runs: LoadRun[] = [];
  try {
    const url = await waitForLine(server, /Fanlight API and app on (http:\/\/\S+)/, 30_000);
    const port = Number(new URL(url).port);
    const agent = new Agent({ keepAlive: true, maxSockets: maxClients });
    const clients: Client[] = [];
    for (const u of users) {
      const res = await call(agent, port, 'POST', '/api/auth/signin', { 'Content-Type': 'application/json' }, JSON.stringify({ email: u.email, password: BENCH_PASSWORD }));
      if (res.status !== 200) throw new Error(`sign-in answered ${res.status}: ${res.body}`);
      const cookie = String((res.headers['set-cookie'] as string[])[0]).split(';')[0];
      const csrf = JSON.parse((await call(agent, port, 'GET', '/api/auth/csrf', { Cookie: cookie })).body).token as string;
      clients.push({ cookie, csrf });
    }
    for (const n of plan) {
      const latencies: number[] = [];
      const acknowledged: number[] = [];
      let failures = 0;
      let serial = 0;
      const until = Date.now() + seconds * 1000;
      const maxPerClient = 100_000;
      const started = performance.now();
      await Promise.all(
        clients.slice(0, n).map(async (c, ci) => {
          for (let i = 0; i < maxPerClient && Date.now() < until; i++) {
            const op = (i + ci) % 4;
            const headers: Record<string, string> = { Cookie: c.cookie, Accept: 'application/json' };
            const t0 = performance.now();
            try {
              let res;
              if (op === 0) res = await call(agent, port, 'GET', '/api/projects', headers);
              else if (op === 1) res = await call(agent, port, 'GET', `/api/projects/${projectId}`, headers);
              else if (op === 2) res = await call(agent, port, 'GET', `/api/projects/${projectId}/views`, headers);
              else {
                const text = `load ${n} ${ci} ${serial++}`;
                res = await call(
                  agent,
                  port,
                  'POST',
                  `/api/views/${viewId}/marks`,
                  { ...headers, 'Content-Type': 'application/json', 'X-CSRF-Token': c.csrf },
                  JSON.stringify({ kind: 'point', geometry: { x: i, y: ci }, text }),
                );
                if (res.status === 201) acknowledged.push(JSON.parse(res.body).mark.id as number);
              }
              if (res.status >= 400) failures += 1;
            } catch {
              failures += 1;
            }
            latencies.push(performance.now() - t0);
          }
        }),
      );
      const elapsedS = (performance.now() - started) / 1000;
      latencies.sort((a, b) => a - b);
      const stored = acknowledged.length
        ? Number((await db('marks').whereIn('id', acknowledged).count({ n: '*' }))[0].n)
        : 0;
      const run: LoadRun = {
        clients: n,
        seconds: elapsedS,
        requests: latencies.length,
        perSecond: latencies.length / elapsedS,
        p50Ms: percentile(latencies, 50),
        p99Ms: percentile(latencies, 99),
        failures,
        writesAcknowledged: acknowledged.length,
        writesMissing: acknowledged.length - stored,
      };
      runs.push(run);
      log(
        `${n} clients, ${elapsedS.toFixed(1)} s: ${run.requests} requests, ${run.perSecond.toFixed(0)}/s, p50 ${run.p50Ms.toFixed(1)} ms, ` +
          `p99 ${run.p99Ms.toFixed(1)} ms, ${failures} failed; ${run.writesAcknowledged} creates acknowledged, ${run.writesMissing} missing`,
      );
    }
    agent.destroy();
  } finally {
    server.kill('SIGTERM');
    await new Promise((r) => server.once('exit', r));
    await db.destroy();
    await mariadb.stop();
  }
  return runs;
}

if (import.meta.url === `file://${process.argv[1]}`) {
  await runApiLoadBench((line) => console.log(`  ${line}`));
}
