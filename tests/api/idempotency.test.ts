/**
 * Idempotency-Key on creates (server/middleware/idempotency.ts; IETF draft-ietf-httpapi-idempotency-key-header):
 * the same key from the same user within 24 h answers the first answer and stores nothing new.
 */
import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { makeProject, makeUser, sessionFor, type Session } from '../support/actors';
import { startTestApp } from '../support/test-app';
import { insertView } from './view-fixtures';

describe('Idempotency-Key on creates', () => {
  const t = startTestApp();
  let engineer: Session;
  let otherEngineer: Session;
  let engineerId: number;
  let viewId: number;
  let projectId: number;

  beforeAll(async () => {
    const a = await makeUser(t.db, 'idem-a', 'staff');
    const b = await makeUser(t.db, 'idem-b', 'staff');
    engineerId = a.id;
    projectId = await makeProject(t.db, [
      { id: a.id, role: 'engineer' },
      { id: b.id, role: 'engineer' },
    ]);
    viewId = await insertView(t.db, projectId, a.id, 'Idempotency target');
    engineer = await sessionFor(t.app, a.email);
    otherEngineer = await sessionFor(t.app, b.email);
  });
  afterAll(() => t.close());

  const postMark = (s: Session, key: string | null, text: string) => {
    const req = s.agent.post(`/api/views/${viewId}/marks`).set('X-CSRF-Token', s.csrf);
    if (key) req.set('Idempotency-Key', key);
    return req.send({ kind: 'point', geometry: { x: 1, y: 2 }, text });
  };
  const marksWith = async (text: string) => (await t.db('marks').where({ body: text }).count({ n: '*' }))[0].n;

  it('Can send the same create twice and get one record and the first answer again', async () => {
    const key = randomUUID();
    const text = `twice ${key}`;
    const first = await postMark(engineer, key, text);
    const second = await postMark(engineer, key, text);
    expect(first.status).toBe(201);
    expect(second.status).toBe(201);
    expect(second.body).toEqual(first.body);
    expect(second.headers['idempotent-replayed']).toBe('true');
    expect(first.headers['idempotent-replayed']).toBeUndefined();
    expect(Number(await marksWith(text))).toBe(1);
  });

  it('Can send the same create twice at once and get one record', async () => {
    const key = randomUUID();
    const text = `at once ${key}`;
    const answers = await Promise.all([postMark(engineer, key, text), postMark(engineer, key, text), postMark(engineer, key, text)]);
    expect(answers.map((a) => a.status)).toEqual([201, 201, 201]);
    const ids = new Set(answers.map((a) => a.body.mark.id));
    expect(ids.size).toBe(1);
    expect(Number(await marksWith(text))).toBe(1);
  });

  it('Creates two records for two keys, and for no key at all', async () => {
    const text = `two keys ${randomUUID()}`;
    await postMark(engineer, randomUUID(), text).expect(201);
    await postMark(engineer, randomUUID(), text).expect(201);
    await postMark(engineer, null, text).expect(201);
    await postMark(engineer, null, text).expect(201);
    expect(Number(await marksWith(text))).toBe(4);
  });

  it('Scopes a key to its user: another user with the same key gets a record of their own', async () => {
    const key = randomUUID();
    const text = `two users ${key}`;
    const mine = await postMark(engineer, key, text).expect(201);
    const theirs = await postMark(otherEngineer, key, text).expect(201);
    expect(theirs.body.mark.id).not.toBe(mine.body.mark.id);
    expect(Number(await marksWith(text))).toBe(2);
  });

  it('Errors with 422 when a key is reused for a different request', async () => {
    const key = randomUUID();
    await postMark(engineer, key, `first ${key}`).expect(201);
    const other = await postMark(engineer, key, `second ${key}`);
    expect(other.status).toBe(422);
    expect(other.body.error.code).toBe('IDEMPOTENCY_KEY_REUSED');
    expect(Number(await marksWith(`second ${key}`))).toBe(0);
  });

  it('Gives the key back when the first request failed, so a retry runs', async () => {
    const key = randomUUID();
    const bad = await engineer.agent
      .post(`/api/views/${viewId}/marks`)
      .set('X-CSRF-Token', engineer.csrf)
      .set('Idempotency-Key', key)
      .send({ kind: 'box', geometry: { x0: 2, x1: 1, y0: 0, y1: 1 } });
    expect(bad.status).toBe(400);
    expect(await t.db('idempotency_keys').where({ user_id: engineerId }).whereRaw('status_code IS NULL').count({ n: '*' })).toEqual([{ n: 0 }]);
    const bodyAgainWithSameKey = await engineer.agent
      .post(`/api/views/${viewId}/marks`)
      .set('X-CSRF-Token', engineer.csrf)
      .set('Idempotency-Key', key)
      .send({ kind: 'box', geometry: { x0: 2, x1: 1, y0: 0, y1: 1 } });
    expect(bodyAgainWithSameKey.status).toBe(400);
  });

  it('Runs a create again once its key is older than 24 hours', async () => {
    const key = randomUUID();
    const text = `expired ${key}`;
    await postMark(engineer, key, text).expect(201);
    await t.db('idempotency_keys').where({ user_id: engineerId }).update({ created_at: new Date(Date.now() - 25 * 3600_000) });
    const again = await postMark(engineer, key, text).expect(201);
    expect(again.headers['idempotent-replayed']).toBeUndefined();
    expect(Number(await marksWith(text))).toBe(2);
  });

  it('Replays a share link with its address, and keeps the answer unreadable in the database', async () => {
    const key = randomUUID();
    const send = () =>
      engineer.agent.post(`/api/views/${viewId}/links`).set('X-CSRF-Token', engineer.csrf).set('Idempotency-Key', key).send({});
    const first = await send().expect(201);
    const again = await send().expect(201);
    expect(again.body.url).toBe(first.body.url);
    expect(Number((await t.db('share_links').where({ view_id: viewId }).count({ n: '*' }))[0].n)).toBe(1);
    const token = String(first.body.url).split('/').pop()!;
    const rows = await t.db('idempotency_keys').where({ user_id: engineerId }).select('key_hash', 'response');
    for (const r of rows) {
      expect(r.key_hash).not.toBe(key);
      expect(Buffer.from(r.response ?? '').includes(token)).toBe(false);
    }
  });

  it('Works for views and comments too (a retried save stores one view)', async () => {
    const key = randomUUID();
    const title = `Idempotent view ${key}`;
    const state = (await t.db('views').where({ id: viewId }).first()).state;
    const body = { title, recordingId: null, state: typeof state === 'string' ? JSON.parse(state) : state };
    const create = () =>
      engineer.agent.post(`/api/projects/${projectId}/views`).set('X-CSRF-Token', engineer.csrf).set('Idempotency-Key', key).send(body);
    const [a, b] = await Promise.all([create(), create()]);
    expect(a.status).toBe(201);
    expect(b.body).toEqual(a.body);
    expect(Number((await t.db('views').where({ title }).count({ n: '*' }))[0].n)).toBe(1);

    const commentKey = randomUUID();
    const comment = () =>
      engineer.agent.post(`/api/views/${viewId}/comments`).set('X-CSRF-Token', engineer.csrf).set('Idempotency-Key', commentKey).send({ body: `once ${commentKey}` });
    await comment().expect(201);
    await comment().expect(201);
    expect(Number((await t.db('comments').where({ body: `once ${commentKey}` }).count({ n: '*' }))[0].n)).toBe(1);
  });

  it('Errors with 400 naming the header when the key is malformed', async () => {
    const res = await postMark(engineer, 'short', 'bad key');
    expect(res.status).toBe(400);
    expect(res.body.error.fields['Idempotency-Key']).toBeDefined();
  });
});
