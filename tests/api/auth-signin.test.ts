import { afterAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD } from '../../seeds/demo-scenario';
import { sessionFor } from '../support/actors';
import { startTestApp } from '../support/test-app';

describe('sign-in', () => {
  const t = startTestApp();
  afterAll(() => t.close());

  it('Can sign in as the demo engineer and read who I am', async () => {
    const agent = t.agent();
    const res = await agent.post('/api/auth/signin').send({ email: 'engineer@fanlight.test', password: DEMO_PASSWORD });
    expect(res.status).toBe(200);
    expect(res.body.user).toMatchObject({ email: 'engineer@fanlight.test', siteRole: 'staff' });
    expect(res.body.user.passwordHash).toBeUndefined();
    const cookie = String(res.headers['set-cookie']);
    expect(cookie).toMatch(/fanlight\.sid=/);
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
    const me = await agent.get('/api/auth/me');
    expect(me.status).toBe(200);
    expect(me.body.user.email).toBe('engineer@fanlight.test');
  });

  it('stores the session in MariaDB', async () => {
    const agent = t.agent();
    await agent.post('/api/auth/signin').send({ email: 'viewer@fanlight.test', password: DEMO_PASSWORD }).expect(200);
    const rows = await t.db('sessions').select('sess');
    const owners = rows.map((r) => (typeof r.sess === 'string' ? JSON.parse(r.sess) : r.sess).userId);
    const viewer = await t.db('users').where({ email: 'viewer@fanlight.test' }).first('id');
    expect(owners).toContain(viewer.id);
  });

  it('Cannot sign in with a wrong password; the message is the same as for an unknown e-mail', async () => {
    const wrong = await t.agent().post('/api/auth/signin').send({ email: 'engineer@fanlight.test', password: 'nope' });
    const unknown = await t.agent().post('/api/auth/signin').send({ email: 'nobody@fanlight.test', password: 'nope' });
    expect(wrong.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(wrong.body).toEqual(unknown.body);
  });

  it('Errors naming each bad field when the body is not valid', async () => {
    const res = await t.agent().post('/api/auth/signin').send({ email: 'not-an-email' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('VALIDATION_FAILED');
    expect(Object.keys(res.body.error.fields).sort()).toEqual(['email', 'password']);
  });

  it('answers 200 with user null on /api/auth/session without a session, and the user with one', async () => {
    const anon = await t.agent().get('/api/auth/session');
    expect(anon.status).toBe(200);
    expect(anon.body).toEqual({ user: null });
    const s = await sessionFor(t.app, 'engineer@fanlight.test', DEMO_PASSWORD);
    const me = await s.request('GET', '/api/auth/session');
    expect(me.body.user.email).toBe('engineer@fanlight.test');
  });

  it('answers 401 on /api/auth/me without a session, and after sign-out', async () => {
    expect((await t.agent().get('/api/auth/me')).status).toBe(401);
    const s = await sessionFor(t.app, 'lead@fanlight.test', DEMO_PASSWORD);
    expect((await s.request('GET', '/api/auth/me')).status).toBe(200);
    expect((await s.request('POST', '/api/auth/signout')).status).toBe(204);
    expect((await s.request('GET', '/api/auth/me')).status).toBe(401);
  });

  it('gives the session a new id at sign-in (no session fixation)', async () => {
    const agent = t.agent();
    const before = (await agent.get('/api/auth/csrf')).headers['set-cookie'];
    const after = (await agent.post('/api/auth/signin').send({ email: 'lead@fanlight.test', password: DEMO_PASSWORD }).expect(200))
      .headers['set-cookie'];
    const sid = (c: unknown) => /fanlight\.sid=([^;]+)/.exec(String(c))?.[1];
    expect(sid(before)).toBeTruthy();
    expect(sid(after)).toBeTruthy();
    expect(sid(after)).not.toBe(sid(before));
  });
});
