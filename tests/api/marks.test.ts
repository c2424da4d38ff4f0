import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { makeProject, makeUser, sessionFor, type Session } from '../support/actors';
import { startTestApp } from '../support/test-app';
import { insertView } from './view-fixtures';

const t = startTestApp();
afterAll(() => t.close());

describe('marks on a view and their threads', () => {
  let projectId: number;
  let viewId: number;
  let engineerId: number;
  let lead: Session;
  let engineer: Session;
  let otherEngineer: Session;
  let viewer: Session;
  let outsider: Session;

  beforeAll(async () => {
    const l = await makeUser(t.db, 'm-lead', 'staff');
    const e = await makeUser(t.db, 'm-engineer', 'staff');
    const e2 = await makeUser(t.db, 'm-engineer2', 'staff');
    const v = await makeUser(t.db, 'm-viewer', 'guest');
    const o = await makeUser(t.db, 'm-outsider', 'staff');
    projectId = await makeProject(t.db, [
      { id: l.id, role: 'lead' },
      { id: e.id, role: 'engineer' },
      { id: e2.id, role: 'engineer' },
      { id: v.id, role: 'viewer' },
    ]);
    engineerId = e.id;
    viewId = await insertView(t.db, projectId, e.id, 'Marks view');
    [lead, engineer, otherEngineer, viewer, outsider] = await Promise.all([l, e, e2, v, o].map((u) => sessionFor(t.app, u.email)));
  });

  const place = (s: Session, body: unknown) => s.request('POST', `/api/views/${viewId}/marks`, body);

  it('engineers place point, box and guide marks; viewers may not', async () => {
    const point = await place(engineer, { kind: 'point', geometry: { x: 6200, y: 10000 }, text: ' carrier jumps here ' });
    expect(point.status).toBe(201);
    expect(point.body.mark).toMatchObject({
      viewId,
      kind: 'point',
      geometry: { x: 6200, y: 10000 },
      text: 'carrier jumps here',
      version: 1,
      author: { id: engineerId, name: 'Test m-engineer' },
      commentCount: 0,
    });
    const box = await place(lead, { kind: 'box', geometry: { x0: 3000, x1: 4000, y0: 7800, y1: 8200 } });
    expect(box.status).toBe(201);
    expect(box.body.mark.text).toBe('');
    const guide = await place(otherEngineer, { kind: 'guide', geometry: { guide: { kind: 'order', order: 48 } }, text: 'order 48' });
    expect(guide.status).toBe(201);
    const family = await place(engineer, { kind: 'guide', geometry: { guide: { kind: 'family', m: 2, n: -1 } } });
    expect(family.body.mark.geometry).toEqual({ guide: { kind: 'family', m: 2, n: -1 } });

    expect((await place(viewer, { kind: 'point', geometry: { x: 1, y: 1 } })).status).toBe(403);
    expect((await place(outsider, { kind: 'point', geometry: { x: 1, y: 1 } })).status).toBe(404);

    const list = await viewer.request('GET', `/api/views/${viewId}/marks`);
    expect(list.status).toBe(200);
    expect(list.body.marks.map((m: { kind: string }) => m.kind).slice(0, 4)).toEqual(['point', 'box', 'guide', 'guide']);
  });

  it('checks the geometry against the kind and the length of the text, naming the fields', async () => {
    const box = await place(engineer, { kind: 'box', geometry: { x0: 5, x1: 1, y0: 0 } });
    expect(box.status).toBe(400);
    expect(Object.keys(box.body.error.fields).sort()).toEqual(['geometry.y1']);
    const reversed = await place(engineer, { kind: 'box', geometry: { x0: 5, x1: 1, y0: 0, y1: 1 } });
    expect(reversed.body.error.fields['geometry.x1']).toMatch(/right of x0/);
    const guide = await place(engineer, { kind: 'guide', geometry: { guide: { kind: 'family', m: 0, n: 1.5 } } });
    expect(Object.keys(guide.body.error.fields).sort()).toEqual(['geometry.guide.m', 'geometry.guide.n']);
    const pointAsBox = await place(engineer, { kind: 'point', geometry: { x0: 1, x1: 2, y0: 1, y1: 2 } });
    expect(Object.keys(pointAsBox.body.error.fields).sort()).toEqual(['geometry.x', 'geometry.y']);
    const kind = await place(engineer, { kind: 'circle', geometry: {} });
    expect(kind.body.error.fields.kind).toMatch(/point, box or guide/);
    const long = await place(engineer, { kind: 'point', geometry: { x: 1, y: 1 }, text: 'x'.repeat(2001) });
    expect(long.status).toBe(400);
    expect(long.body.error.fields.text).toMatch(/2000/);
    // plain text is kept as written, markup and all
    const plain = await place(engineer, { kind: 'point', geometry: { x: 1, y: 1 }, text: '<b>not bold</b> & 2·fc' });
    expect(plain.body.mark.text).toBe('<b>not bold</b> & 2·fc');
  });

  it('the author or a lead edits and deletes; a stale version gets 409 with the current mark', async () => {
    const mark = (await place(engineer, { kind: 'point', geometry: { x: 100, y: 200 }, text: 'first words' })).body.mark;
    const edit = await engineer.request('PATCH', `/api/marks/${mark.id}`, { version: 1, text: 'second words' });
    expect(edit.status).toBe(200);
    expect(edit.body.mark).toMatchObject({ text: 'second words', version: 2, geometry: { x: 100, y: 200 } });

    // the lead edited from what they saw at version 1
    const stale = await lead.request('PATCH', `/api/marks/${mark.id}`, { version: 1, text: 'lead words' });
    expect(stale.status).toBe(409);
    expect(stale.body.error).toMatchObject({ code: 'CONFLICT', message: expect.any(String), fields: { version: expect.any(String) } });
    expect(stale.body.current).toMatchObject({ id: mark.id, text: 'second words', version: 2 });

    const moved = await lead.request('PATCH', `/api/marks/${mark.id}`, { version: 2, kind: 'box', geometry: { x0: 1, x1: 2, y0: 3, y1: 4 } });
    expect(moved.status).toBe(200);
    expect(moved.body.mark).toMatchObject({ kind: 'box', geometry: { x0: 1, x1: 2, y0: 3, y1: 4 }, text: 'second words', version: 3 });

    const halfPlace = await engineer.request('PATCH', `/api/marks/${mark.id}`, { version: 3, geometry: { x: 1, y: 1 } });
    expect(halfPlace.status).toBe(400);
    expect(halfPlace.body.error.fields.kind).toBeDefined();
    const badGeometry = await engineer.request('PATCH', `/api/marks/${mark.id}`, { version: 3, kind: 'point', geometry: { x: 'left' } });
    expect(Object.keys(badGeometry.body.error.fields).sort()).toEqual(['geometry.x', 'geometry.y']);

    expect((await otherEngineer.request('PATCH', `/api/marks/${mark.id}`, { version: 3, text: 'not mine' })).status).toBe(403);
    expect((await viewer.request('PATCH', `/api/marks/${mark.id}`, { version: 3, text: 'not mine' })).status).toBe(403);
    expect((await outsider.request('PATCH', `/api/marks/${mark.id}`, { version: 3, text: 'not mine' })).status).toBe(404);
    expect((await otherEngineer.request('DELETE', `/api/marks/${mark.id}`)).status).toBe(403);
    expect((await engineer.request('DELETE', `/api/marks/${mark.id}`)).status).toBe(204);
    expect((await engineer.request('PATCH', `/api/marks/${mark.id}`, { version: 3, text: 'gone' })).status).toBe(404);

    const others = (await place(otherEngineer, { kind: 'point', geometry: { x: 1, y: 1 } })).body.mark;
    expect((await lead.request('DELETE', `/api/marks/${others.id}`)).status).toBe(204);
  });

  it('every member, viewers too, comments under a mark and under the view', async () => {
    const mark = (await place(engineer, { kind: 'point', geometry: { x: 5, y: 5 } })).body.mark;
    const reply = await viewer.request('POST', `/api/marks/${mark.id}/comments`, { body: '  heard it on the rig as well ' });
    expect(reply.status).toBe(201);
    expect(reply.body.comment).toMatchObject({
      viewId,
      markId: mark.id,
      body: 'heard it on the rig as well',
      author: { name: 'Test m-viewer', viaLink: false },
    });
    await engineer.request('POST', `/api/marks/${mark.id}/comments`, { body: 'thanks' });
    const onView = await viewer.request('POST', `/api/views/${viewId}/comments`, { body: 'a general remark' });
    expect(onView.status).toBe(201);
    expect(onView.body.comment.markId).toBeNull();

    const thread = await lead.request('GET', `/api/marks/${mark.id}/comments`);
    expect(thread.body.comments.map((c: { body: string }) => c.body)).toEqual(['heard it on the rig as well', 'thanks']);
    const viewThread = await lead.request('GET', `/api/views/${viewId}/comments`);
    expect(viewThread.body.comments.map((c: { body: string }) => c.body)).toContain('a general remark');
    expect(viewThread.body.comments.every((c: { markId: number | null }) => c.markId === null)).toBe(true);
    const marks = await viewer.request('GET', `/api/views/${viewId}/marks`);
    expect(marks.body.marks.find((m: { id: number }) => m.id === mark.id).commentCount).toBe(2);

    const empty = await viewer.request('POST', `/api/marks/${mark.id}/comments`, { body: '   ' });
    expect(empty.status).toBe(400);
    expect(empty.body.error.fields.body).toBeDefined();
    expect((await outsider.request('POST', `/api/marks/${mark.id}/comments`, { body: 'let me in' })).status).toBe(404);
    expect((await outsider.request('GET', `/api/marks/${mark.id}/comments`)).status).toBe(404);
    expect((await viewer.request('GET', '/api/marks/999999999/comments')).status).toBe(404);
  });
});
