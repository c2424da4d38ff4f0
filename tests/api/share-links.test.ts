import { afterAll, beforeAll, describe, expect, it, vi, type MockInstance } from 'vitest';
import { hashToken, newToken } from '../../server/services/tokens';
import { makeProject, makeUser, sessionFor, type Session } from '../support/actors';
import { startTestApp } from '../support/test-app';
import { binaryParser, insertSnapshot, insertView, snapshotBytes } from './view-fixtures';

const t = startTestApp();
afterAll(() => t.close());

const tokenOf = (url: string) => url.split('/shared/')[1];

describe('share links', () => {
  let viewId: number;
  let markId: number;
  let lead: Session;
  let engineer: Session;
  let viewer: Session;
  let outsider: Session;
  const snapshot = snapshotBytes(8, 4);

  beforeAll(async () => {
    const l = await makeUser(t.db, 's-lead', 'staff');
    const e = await makeUser(t.db, 's-engineer', 'staff');
    const v = await makeUser(t.db, 's-viewer', 'guest');
    const o = await makeUser(t.db, 's-outsider', 'staff');
    const projectId = await makeProject(t.db, [
      { id: l.id, role: 'lead' },
      { id: e.id, role: 'engineer' },
      { id: v.id, role: 'viewer' },
    ]);
    await t.db('projects').where({ id: projectId }).update({ name: 'E-axle CA-7 inverter study' });
    viewId = await insertView(t.db, projectId, e.id, 'Shared carrier view');
    await insertSnapshot(t.db, viewId, snapshot);
    [lead, engineer, viewer, outsider] = await Promise.all([l, e, v, o].map((u) => sessionFor(t.app, u.email)));
    markId = (await engineer.request('POST', `/api/views/${viewId}/marks`, { kind: 'point', geometry: { x: 1, y: 2 }, text: 'look here' })).body.mark.id;
    await viewer.request('POST', `/api/marks/${markId}/comments`, { body: 'on the mark' });
    await viewer.request('POST', `/api/views/${viewId}/comments`, { body: 'on the view' });
  });

  it('an engineer makes a read-only link; anyone holding it reads the view, marks, threads and snapshot without an account', async () => {
    const made = await engineer.request('POST', `/api/views/${viewId}/links`, {});
    expect(made.status).toBe(201);
    expect(made.body.url).toMatch(/^http:\/\/[^/]+\/shared\/[A-Za-z0-9_-]{43}$/);
    expect(made.body.link).toMatchObject({ viewId, mayReply: false, expiresAt: null, revokedAt: null, status: 'active', createdBy: 'Test s-engineer' });
    const token = tokenOf(made.body.url);
    // only the hash is stored
    expect(await t.db('share_links').where({ token_hash: token }).first()).toBeUndefined();
    expect(await t.db('share_links').where({ token_hash: hashToken(token) }).first()).toBeDefined();

    const anonymous = t.agent();
    const shared = await anonymous.get(`/api/shared/${token}`);
    expect(shared.status).toBe(200);
    expect(shared.body).toMatchObject({
      view: { id: viewId, title: 'Shared carrier view', projectName: 'E-axle CA-7 inverter study', hasSnapshot: true },
      mayReply: false,
    });
    expect(shared.body.view.state.stateVersion).toBe(1);
    expect(shared.body.marks.map((m: { text: string }) => m.text)).toEqual(['look here']);
    expect(shared.body.comments.map((c: { body: string; markId: number | null }) => [c.body, c.markId])).toEqual([
      ['on the mark', markId],
      ['on the view', null],
    ]);
    // no member's e-mail travels with a shared view
    expect(JSON.stringify(shared.body)).not.toMatch(/@fanlight\.test/);

    const snap = await anonymous.get(`/api/shared/${token}/snapshot`).buffer(true).parse(binaryParser);
    expect(snap.status).toBe(200);
    expect(snap.headers['content-encoding']).toBe('gzip');
    expect(Buffer.compare(snap.body as Buffer, snapshot)).toBe(0);

    const reply = await anonymous.post(`/api/shared/${token}/comments`).send({ name: 'Supplier engineer', body: 'may I reply?' });
    expect(reply.status).toBe(403);
    expect(reply.body.error.message).toMatch(/read-only/);
  });

  it('a link with mayReply takes named replies under the view or one of its marks', async () => {
    const made = await lead.request('POST', `/api/views/${viewId}/links`, { mayReply: true, expiresAt: new Date(Date.now() + 86_400_000).toISOString() });
    expect(made.status).toBe(201);
    expect(made.body.link).toMatchObject({ mayReply: true, expiresAt: expect.any(String) });
    const token = tokenOf(made.body.url);
    const onView = await t.agent().post(`/api/shared/${token}/comments`).send({ name: 'Motor supplier', body: 'we see the same at 8 kHz' });
    expect(onView.status).toBe(201);
    expect(onView.body.comment).toMatchObject({ markId: null, body: 'we see the same at 8 kHz', author: { id: null, name: 'Motor supplier', viaLink: true } });
    const onMark = await t.agent().post(`/api/shared/${token}/comments`).send({ name: 'Motor supplier', body: 'and here', markId });
    expect(onMark.status).toBe(201);
    expect(onMark.body.comment.markId).toBe(markId);
    const wrongMark = await t.agent().post(`/api/shared/${token}/comments`).send({ name: 'Motor supplier', body: 'x', markId: 999999999 });
    expect(wrongMark.status).toBe(400);
    expect(wrongMark.body.error.fields.markId).toBeDefined();
    const noName = await t.agent().post(`/api/shared/${token}/comments`).send({ body: 'who am I' });
    expect(noName.status).toBe(400);
    expect(noName.body.error.fields.name).toBeDefined();

    const thread = await viewer.request('GET', `/api/views/${viewId}/comments`);
    expect(thread.body.comments.map((c: { author: { name: string } }) => c.author.name)).toContain('Motor supplier');
  });

  it('a revoked or an expired link answers 404 with a clear message; an unknown one too', async () => {
    const made = await engineer.request('POST', `/api/views/${viewId}/links`, { mayReply: true });
    const token = tokenOf(made.body.url);
    expect((await t.agent().get(`/api/shared/${token}`)).status).toBe(200);
    expect((await viewer.request('DELETE', `/api/links/${made.body.link.id}`)).status).toBe(403);
    expect((await outsider.request('DELETE', `/api/links/${made.body.link.id}`)).status).toBe(404);
    expect((await lead.request('DELETE', `/api/links/${made.body.link.id}`)).status).toBe(204);
    for (const path of [`/api/shared/${token}`, `/api/shared/${token}/snapshot`]) {
      const res = await t.agent().get(path);
      expect(res.status, path).toBe(404);
      expect(res.body.error).toMatchObject({ code: 'NOT_FOUND', message: expect.stringMatching(/revoked/) });
    }
    expect((await t.agent().post(`/api/shared/${token}/comments`).send({ name: 'x', body: 'y' })).status).toBe(404);

    const later = await engineer.request('POST', `/api/views/${viewId}/links`, { expiresAt: new Date(Date.now() + 60_000).toISOString() });
    const lateToken = tokenOf(later.body.url);
    await t.db('share_links').where({ id: later.body.link.id }).update({ expires_at: new Date(Date.now() - 1000) });
    const expired = await t.agent().get(`/api/shared/${lateToken}`);
    expect(expired.status).toBe(404);
    expect(expired.body.error.message).toMatch(/expired on \d{4}-\d{2}-\d{2} \d{2}:\d{2} UTC/);

    const unknown = await t.agent().get(`/api/shared/${newToken()}`);
    expect(unknown.status).toBe(404);
    expect(unknown.body.error.message).toMatch(/not valid/);
    expect((await t.agent().get('/api/shared/short')).status).toBe(404);

    const listed = (await engineer.request('GET', `/api/views/${viewId}/links`)).body.links as { id: number; status: string }[];
    expect(listed.find((l) => l.id === made.body.link.id)!.status).toBe('revoked');
    expect(listed.find((l) => l.id === later.body.link.id)!.status).toBe('expired');
  });

  it('only engineers and leads make and list links; a past expiry is refused', async () => {
    expect((await viewer.request('POST', `/api/views/${viewId}/links`, {})).status).toBe(403);
    expect((await viewer.request('GET', `/api/views/${viewId}/links`)).status).toBe(403);
    expect((await outsider.request('GET', `/api/views/${viewId}/links`)).status).toBe(404);
    const past = await engineer.request('POST', `/api/views/${viewId}/links`, { expiresAt: '2020-01-01T00:00:00Z', mayReply: 'yes' });
    expect(past.status).toBe(400);
    expect(Object.keys(past.body.error.fields).sort()).toEqual(['expiresAt', 'mayReply']);
  });

  describe('the token stays secret', () => {
    let spies: MockInstance[] = [];
    const logged = () => spies.flatMap((s) => s.mock.calls.map((args) => args.map((a) => (a instanceof Error ? `${a.message} ${a.stack}` : String(a))).join(' ')));

    beforeAll(() => {
      spies = (['log', 'error', 'warn', 'info', 'debug'] as const).map((m) => vi.spyOn(console, m));
    });
    afterAll(() => {
      for (const s of spies) s.mockRestore();
    });

    it('appears in the creation answer only: never in list answers, activity or the server log', async () => {
      const made = await engineer.request('POST', `/api/views/${viewId}/links`, { mayReply: true });
      const token = tokenOf(made.body.url);
      expect(token).toHaveLength(43);
      expect(JSON.stringify(made.body.link)).not.toContain(token);

      // use the link every way there is, including failures
      await t.agent().get(`/api/shared/${token}`).expect(200);
      await t.agent().get(`/api/shared/${token}/snapshot`).expect(200);
      await t.agent().post(`/api/shared/${token}/comments`).send({ name: 'Reader', body: 'thanks' }).expect(201);
      await t.agent().post(`/api/shared/${token}/comments`).send({ name: '', body: '' }).expect(400);

      const list = await engineer.request('GET', `/api/views/${viewId}/links`);
      expect(list.status).toBe(200);
      const listed = JSON.stringify(list.body);
      expect(listed).not.toContain(token);
      expect(listed).not.toContain(hashToken(token));
      expect(list.body.links[0]).not.toHaveProperty('url');
      expect(list.body.links[0]).not.toHaveProperty('token');
      const view = JSON.stringify((await engineer.request('GET', `/api/views/${viewId}`)).body);
      expect(view).not.toContain(token);
      const activity = JSON.stringify((await lead.request('GET', `/api/projects/${(await t.db('views').where({ id: viewId }).first('project_id')).project_id}/activity`)).body);
      expect(activity).not.toContain(token);

      await lead.request('DELETE', `/api/links/${made.body.link.id}`).then((r) => expect(r.status).toBe(204));
      await t.agent().get(`/api/shared/${token}`).expect(404);
      // let the reply's mail go out (it logs only when it fails)
      await new Promise((r) => setTimeout(r, 500));

      for (const line of logged()) {
        expect(line).not.toContain(token);
        expect(line).not.toContain(hashToken(token));
      }
    });
  });
});
