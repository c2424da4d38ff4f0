/**
 * The server under database faults, against the real test MariaDB: connections killed from the server side
 * and the database stopped and started again, each during a write load. The app must stay up in this same
 * process, answer every request with success or 503 DATABASE_UNAVAILABLE (never a 500, never a dropped
 * connection), be healthy again within 5 s without a restart, and lose no write it acknowledged.
 */
import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { makeProject, makeUser, ACTOR_PASSWORD } from '../support/actors';
import { healthyWithin, listen, loadUntil, send, signIn, type Answer, type HttpSession, type Listening } from '../support/http-load';
import { startTestApp } from '../support/test-app';
import { killAppConnections, testMariaDb } from '../support/test-mariadb';
import { insertView } from './view-fixtures';

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

describe('database faults', () => {
  const t = startTestApp();
  const mariadb = testMariaDb();
  let server: Listening;
  let session: HttpSession;
  let viewId: number;
  const rejections: unknown[] = [];
  const onRejection = (e: unknown) => rejections.push(e);

  beforeAll(async () => {
    process.on('unhandledRejection', onRejection);
    const engineer = await makeUser(t.db, 'faults', 'staff');
    const projectId = await makeProject(t.db, [{ id: engineer.id, role: 'engineer' }]);
    viewId = await insertView(t.db, projectId, engineer.id, 'Fault target');
    server = await listen(t.app);
    session = await signIn(server.url, engineer.email, ACTOR_PASSWORD);
  });

  afterAll(async () => {
    process.off('unhandledRejection', onRejection);
    // whatever happened above, leave the test database running for the tests after this file
    if (!mariadb.isRunning()) await mariadb.start();
    await server?.close();
    await t.close();
  });

  /** One write (a point mark with a unique text) or one read, alternating. */
  const step = (run: string) => (client: number, i: number) => {
    if (i % 3 === 2) return send(server.url, session, 'GET', `/api/views/${viewId}/marks`);
    const text = `${run} ${client}-${i}`;
    return send(server.url, session, 'POST', `/api/views/${viewId}/marks`, { kind: 'point', geometry: { x: i, y: client }, text }, text);
  };

  async function expectAcknowledgedWritesKept(answers: Answer[]) {
    const acknowledged = answers.filter((a) => a.status === 201);
    expect(acknowledged.length).toBeGreaterThan(0);
    const rows = await t.db('marks').whereIn('body', acknowledged.map((a) => a.tag)).select('id', 'body');
    const byId = new Map(rows.map((r: { id: number; body: string }) => [r.id, r.body]));
    for (const a of acknowledged) {
      const mark = (a.body as { mark: { id: number; text: string } }).mark;
      expect(byId.get(mark.id)).toBe(a.tag);
    }
  }

  function expectOnlySuccessOr503(answers: Answer[]) {
    const statuses = new Set(answers.map((a) => a.status));
    const broken = answers.filter((a) => a.status === 0);
    expect(broken.map((a) => a.body), `${broken.length} of ${answers.length} requests got no answer`).toEqual([]);
    for (const s of statuses) expect([200, 201, 503]).toContain(s);
    for (const a of answers.filter((x) => x.status === 503)) {
      expect((a.body as { error: { code: string } }).error.code).toBe('DATABASE_UNAVAILABLE');
    }
  }

  it('keeps answering when its pool connections are killed from the server side during a load', async () => {
    const run = `kill-${randomUUID().slice(0, 6)}`;
    const started = Date.now();
    const load = loadUntil(4, started + 3000, step(run));
    await sleep(800);
    let killed = await killAppConnections(mariadb);
    await sleep(400);
    killed += await killAppConnections(mariadb);
    const answers = await load;
    expect(killed).toBeGreaterThan(0);
    expectOnlySuccessOr503(answers);
    expect(await healthyWithin(server.url, 5000)).toBeLessThan(5000);
    // the same process answers new writes again
    const after = await send(server.url, session, 'POST', `/api/views/${viewId}/marks`, { kind: 'point', geometry: { x: 0, y: 0 }, text: `${run} after` }, `${run} after`);
    expect(after.status).toBe(201);
    await expectAcknowledgedWritesKept([...answers, after]);
    expect(rejections).toEqual([]);
  });

  it('uses a MariaDB that was already running and leaves it running when it stops', async () => {
    const adopter = testMariaDb();
    await adopter.start();
    expect(adopter.adopted).toBe(true);
    await adopter.stop();
    expect(mariadb.isRunning()).toBe(true);
    expect((await fetch(`${server.url}/api/health`)).status).toBe(200);
  });

  it('starts a MariaDB that died again, says so, and the app is healthy after it without a restart', async () => {
    const supervisor = testMariaDb();
    const log: string[] = [];
    supervisor.supervise((line) => log.push(line), 100);
    try {
      await mariadb.terminate('SIGKILL'); // a crash: InnoDB recovers at the next start
      expect((await fetch(`${server.url}/api/health`)).status).toBe(503);
      const deadline = Date.now() + 30_000;
      while (!log.some((l) => l.includes('restarted')) && Date.now() < deadline) await sleep(100);
      expect(log[0]).toMatch(/is not running .*restarting it in 1 s/);
      expect(log.some((l) => l.includes('restarted'))).toBe(true);
      expect(await healthyWithin(server.url, 5000)).toBeLessThan(5000);
      const after = await send(server.url, session, 'GET', `/api/views/${viewId}/marks`);
      expect(after.status).toBe(200);
    } finally {
      supervisor.unsupervise();
    }
  });

  it('answers 503 while MariaDB is stopped and succeeds again once it is back, in the same process', async () => {
    const run = `stop-${randomUUID().slice(0, 6)}`;
    const started = Date.now();
    const load = loadUntil(3, started + 6000, step(run));
    await sleep(700);
    await mariadb.terminate('SIGTERM');
    expect(mariadb.isRunning()).toBe(false);
    await sleep(1500);
    const whileAway = await fetch(`${server.url}/api/health`);
    expect(whileAway.status).toBe(503);
    expect(await whileAway.json()).toEqual({ ok: false, db: false });
    const writeWhileAway = await send(server.url, session, 'POST', `/api/views/${viewId}/marks`, { kind: 'point', geometry: { x: 1, y: 1 }, text: 'while away' });
    expect(writeWhileAway.status).toBe(503);
    expect(writeWhileAway.body).toMatchObject({ error: { code: 'DATABASE_UNAVAILABLE' } });
    await mariadb.start();
    const back = Date.now();
    const answers = await load;
    expectOnlySuccessOr503(answers);
    expect(answers.some((a) => a.status === 503)).toBe(true);
    expect(answers.some((a) => a.status === 201 && a.atMs > back)).toBe(true);
    expect(await healthyWithin(server.url, 5000)).toBeLessThan(5000);
    await expectAcknowledgedWritesKept(answers);
    expect(rejections).toEqual([]);
  });
});
