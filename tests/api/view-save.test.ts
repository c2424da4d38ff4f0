/**
 * A view saved whole (POST /api/projects/:id/views and PATCH /api/views/:id as multipart/form-data): state,
 * snapshot and marks in one transaction, so a refusal or a failure stores none of it.
 */
import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { makeProject, makeUser, sessionFor, type Session } from '../support/actors';
import { startTestApp } from '../support/test-app';
import { SNAPSHOT_TYPE, sampleState, snapshotBytes } from './view-fixtures';

const t = startTestApp();
afterAll(() => t.close());

const point = (x: number, text = '') => ({ kind: 'point', geometry: { x, y: 1000 }, text });

function saveNew(s: Session, projectId: number, view: unknown, snapshot: Buffer | null = snapshotBytes(16, 8)) {
  const req = s.agent.post(`/api/projects/${projectId}/views`).set('X-CSRF-Token', s.csrf).field('view', JSON.stringify(view));
  return snapshot ? req.attach('snapshot', snapshot, { filename: 'map.fls', contentType: SNAPSHOT_TYPE }) : req;
}

function saveChanges(s: Session, viewId: number, changes: unknown, snapshot: Buffer = snapshotBytes(24, 12)) {
  return s.agent
    .patch(`/api/views/${viewId}`)
    .set('X-CSRF-Token', s.csrf)
    .field('view', JSON.stringify(changes))
    .attach('snapshot', snapshot, { filename: 'map.fls', contentType: SNAPSHOT_TYPE });
}

const viewsTitled = async (title: string) => Number((await t.db('views').where({ title }).count({ n: '*' }))[0].n);

describe('a view saved whole', () => {
  let projectId: number;
  let engineer: Session;
  let viewer: Session;
  let outsider: Session;
  beforeAll(async () => {
    const e = await makeUser(t.db, 'whole-engineer', 'staff');
    const v = await makeUser(t.db, 'whole-viewer', 'guest');
    const o = await makeUser(t.db, 'whole-outsider', 'staff');
    projectId = await makeProject(t.db, [
      { id: e.id, role: 'engineer' },
      { id: v.id, role: 'viewer' },
    ]);
    engineer = await sessionFor(t.app, e.email);
    viewer = await sessionFor(t.app, v.email);
    outsider = await sessionFor(t.app, o.email);
  });

  it('Can save a view with its snapshot and marks in one request', async () => {
    const title = `Whole ${randomUUID()}`;
    const res = await saveNew(engineer, projectId, { title, recordingId: null, state: sampleState(), marks: [point(1000, 'carrier shift'), point(2000)] });
    expect(res.status).toBe(201);
    expect(res.body.view).toMatchObject({ title, projectId });
    expect(res.body.view.snapshot).toMatchObject({ width: 16, height: 8 });
    expect(res.body.marks.map((m: { text: string }) => m.text)).toEqual(['carrier shift', '']);
    const id = res.body.view.id;
    expect(await t.db('view_snapshots').where({ view_id: id }).first()).toBeDefined();
    expect(Number((await t.db('marks').where({ view_id: id }).count({ n: '*' }))[0].n)).toBe(2);
  });

  it('Stores nothing when the snapshot is malformed, missing, or a mark is invalid', async () => {
    const title = `Refused ${randomUUID()}`;
    const bad = Buffer.from(snapshotBytes(8, 8));
    bad.write('PNG!', 0, 'latin1');
    const malformed = await saveNew(engineer, projectId, { title, recordingId: null, state: sampleState(), marks: [point(1)] }, bad);
    expect(malformed.status).toBe(400);
    const missing = await saveNew(engineer, projectId, { title, recordingId: null, state: sampleState() }, null);
    expect(missing.status).toBe(400);
    expect(missing.body.error.fields.snapshot).toBeDefined();
    const badMark = await saveNew(engineer, projectId, {
      title,
      recordingId: null,
      state: sampleState(),
      marks: [point(1), { kind: 'box', geometry: { x0: 5, x1: 1, y0: 0, y1: 1 } }],
    });
    expect(badMark.status).toBe(400);
    expect(Object.keys(badMark.body.error.fields)).toContain('marks.1.geometry.x1');
    expect(await viewsTitled(title)).toBe(0);
  });

  it('Errors with 400 naming the field when the view part is not JSON', async () => {
    const res = await engineer.agent
      .post(`/api/projects/${projectId}/views`)
      .set('X-CSRF-Token', engineer.csrf)
      .field('view', '{"title":')
      .attach('snapshot', snapshotBytes(4, 4), { filename: 'map.fls', contentType: SNAPSHOT_TYPE });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.view).toMatch(/not valid JSON/);
  });

  it('Cannot save as viewer (403) or outsider (404)', async () => {
    const title = `Not allowed ${randomUUID()}`;
    expect((await saveNew(viewer, projectId, { title, recordingId: null, state: sampleState() })).status).toBe(403);
    expect((await saveNew(outsider, projectId, { title, recordingId: null, state: sampleState() })).status).toBe(404);
    expect(await viewsTitled(title)).toBe(0);
  });

  it('Can save changes whole from the version edited, and a stale save changes nothing', async () => {
    const made = await saveNew(engineer, projectId, { title: `Changes ${randomUUID()}`, recordingId: null, state: sampleState(), marks: [point(1)] });
    const id = made.body.view.id;
    const changed = await saveChanges(engineer, id, { version: made.body.view.version, state: sampleState({ polePairs: 3 }), marks: [point(2, 'new')] });
    expect(changed.status).toBe(200);
    expect(changed.body.view.version).toBe(made.body.view.version + 1);
    expect(changed.body.view.state.polePairs).toBe(3);
    expect(changed.body.view.snapshot).toMatchObject({ width: 24, height: 12 });
    expect(changed.body.marks).toHaveLength(1);
    const stale = await saveChanges(engineer, id, { version: made.body.view.version, state: sampleState({ polePairs: 5 }), marks: [point(3)] }, snapshotBytes(40, 20));
    expect(stale.status).toBe(409);
    expect(stale.body.current.version).toBe(changed.body.view.version);
    expect(Number((await t.db('marks').where({ view_id: id }).count({ n: '*' }))[0].n)).toBe(2);
    expect((await t.db('view_snapshots').where({ view_id: id }).first()).width).toBe(24);
  });

  it('still takes a plain JSON view (no snapshot) on the same path', async () => {
    const res = await engineer.request('POST', `/api/projects/${projectId}/views`, { title: `Plain ${randomUUID()}`, recordingId: null, state: sampleState() });
    expect(res.status).toBe(201);
    expect(res.body.view.snapshot).toBeNull();
  });
});
