import { afterAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD } from '../../seeds/demo-scenario';
import { makeProject, makeUser, sessionFor, uniqueEmail } from '../support/actors';
import { startTestApp } from '../support/test-app';
import { testConfig } from '../support/test-db';

describe('security of the API', () => {
  const t = startTestApp();
  afterAll(() => t.close());

  it('Brute force on one e-mail gets 429 with Retry-After, even with the right password then', async () => {
    const user = await makeUser(t.db, 'brute', 'guest');
    const statuses: number[] = [];
    for (let i = 0; i < 6; i++) {
      statuses.push((await t.agent().post('/api/auth/signin').send({ email: user.email, password: `guess-${i}` })).status);
    }
    expect(statuses).toEqual([401, 401, 401, 401, 401, 429]);
    const locked = await t.agent().post('/api/auth/signin').send({ email: user.email, password: 'matrix-password-1' });
    expect(locked.status).toBe(429);
    expect(Number(locked.headers['retry-after'])).toBeGreaterThan(0);
    expect(locked.body.error.code).toBe('RATE_LIMITED');
  });

  it('Brute force from one address across many e-mails gets 429', async () => {
    let last = 0;
    for (let i = 0; i < 31; i++) {
      last = (await t.agent().post('/api/auth/signin').send({ email: uniqueEmail('spray'), password: 'x' })).status;
    }
    expect(last).toBe(429);
  });

  it('Cannot POST from another origin (403), even signed in with the token', async () => {
    const s = await sessionFor(t.app, 'lead@fanlight.test', DEMO_PASSWORD).catch(() => null);
    // the address may already be braked by the test above; a fresh app has fresh counters
    const fresh = startTestApp();
    try {
      const session = s ?? (await sessionFor(fresh.app, 'lead@fanlight.test', DEMO_PASSWORD));
      const res = await session.agent
        .post('/api/projects')
        .set('Origin', 'http://evil.example')
        .set('X-CSRF-Token', session.csrf)
        .send({ name: 'from elsewhere' });
      expect(res.status).toBe(403);
      expect(res.body.error.code).toBe('CSRF_REJECTED');
      const anon = await fresh.agent().post('/api/auth/signin').set('Origin', 'http://evil.example').send({});
      expect(anon.status).toBe(403);
    } finally {
      await fresh.close();
    }
  });

  it('Cannot POST with a forged Host that matches a forged Origin (403): origins come from configuration only', async () => {
    const fresh = startTestApp();
    try {
      const session = await sessionFor(fresh.app, 'engineer@fanlight.test', DEMO_PASSWORD);
      const forged = await session.agent
        .post('/api/projects')
        .set('Host', 'evil.example')
        .set('Origin', 'http://evil.example')
        .set('X-CSRF-Token', session.csrf)
        .send({ name: 'forged host' });
      expect(forged.status).toBe(403);
      expect(forged.body.error.code).toBe('CSRF_REJECTED');
      const anon = await fresh.agent().post('/api/auth/signin').set('Host', 'evil.example').set('Origin', 'http://evil.example').send({});
      expect(anon.status).toBe(403);
      // the configured public origin passes, whatever Host says
      const own = await session.agent
        .post('/api/projects')
        .set('Host', 'evil.example')
        .set('Origin', testConfig().publicOrigin)
        .set('X-CSRF-Token', session.csrf)
        .send({ name: 'own origin' });
      expect(own.status).not.toBe(403);
    } finally {
      await fresh.close();
    }
  });

  it('Answers 404 for a malformed id in the address, as for an unknown one', async () => {
    const fresh = startTestApp();
    try {
      const s = await sessionFor(fresh.app, 'engineer@fanlight.test', DEMO_PASSWORD);
      for (const path of ['/api/views/abc', '/api/projects/1x', '/api/views/-3/marks', '/api/marks/0/comments']) {
        const res = await s.agent.get(path);
        expect(res.status, path).toBe(404);
        expect(res.body.error.code).toBe('NOT_FOUND');
      }
    } finally {
      await fresh.close();
    }
  });

  it('Answers 415 UNSUPPORTED_MEDIA_TYPE for a body that is not JSON', async () => {
    const fresh = startTestApp();
    try {
      const s = await sessionFor(fresh.app, 'engineer@fanlight.test', DEMO_PASSWORD);
      const text = await s.agent.post('/api/projects').set('X-CSRF-Token', s.csrf).set('Content-Type', 'text/plain').send('name=plain');
      expect(text.status).toBe(415);
      expect(text.body.error.code).toBe('UNSUPPORTED_MEDIA_TYPE');
      const form = await fresh.agent().post('/api/auth/signin').type('form').send({ email: 'a@b.c', password: 'x' });
      expect(form.status).toBe(415);
      // malformed JSON stays a 400
      const broken = await fresh.agent().post('/api/auth/signin').set('Content-Type', 'application/json').send('{"email":');
      expect(broken.status).toBe(400);
    } finally {
      await fresh.close();
    }
  });

  it('Cannot change anything signed in without the X-CSRF-Token header (403), and can with it', async () => {
    const fresh = startTestApp();
    try {
      const s = await sessionFor(fresh.app, 'engineer@fanlight.test', DEMO_PASSWORD);
      const without = await s.agent.post('/api/projects').send({ name: 'no token' });
      expect(without.status).toBe(403);
      expect(without.body.error.code).toBe('CSRF_REJECTED');
      const wrong = await s.agent.post('/api/projects').set('X-CSRF-Token', 'x'.repeat(43)).send({ name: 'bad token' });
      expect(wrong.status).toBe(403);
      const ok = await s.request('POST', '/api/projects', { name: 'with token' });
      expect(ok.status).toBe(201);
      const sameOrigin = await s.agent
        .post('/api/projects')
        .set('Origin', 'http://127.0.0.1:3000')
        .set('X-CSRF-Token', s.csrf)
        .send({ name: 'same origin' });
      expect(sameOrigin.status).toBe(201);
    } finally {
      await fresh.close();
    }
  });

  it('Refuses 1 MB of junk JSON with 413 in the error shape', async () => {
    const junk = JSON.stringify({ junk: 'x'.repeat(1024 * 1024) });
    const res = await t.agent().post('/api/auth/password-reset/request').set('Content-Type', 'application/json').send(junk);
    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe('PAYLOAD_TOO_LARGE');
  });

  it('Answers malformed JSON with 400 MALFORMED_JSON', async () => {
    const res = await t.agent().post('/api/auth/password-reset/request').set('Content-Type', 'application/json').send('{"email":');
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('MALFORMED_JSON');
  });

  it('Stores SQL-injection and <script> strings in names as plain text', async () => {
    const fresh = startTestApp();
    try {
      const s = await sessionFor(fresh.app, 'engineer@fanlight.test', DEMO_PASSWORD);
      const name = `x'); DROP TABLE projects; -- <script>window.__pwned=1</script>`;
      const created = await s.request('POST', '/api/projects', { name, description: `" OR 1=1 -- <img src=x onerror=alert(1)>` });
      expect(created.status).toBe(201);
      expect(created.body.project.name).toBe(name);
      const back = await s.request('GET', `/api/projects/${created.body.project.id}`);
      expect(back.body.project.name).toBe(name);
      expect(await fresh.db.schema.hasTable('projects')).toBe(true);
    } finally {
      await fresh.close();
    }
  });

  it('sends the security headers: CSP allowing our WASM, no inline script, no sniffing', async () => {
    const res = await t.agent().get('/api/health');
    const csp = res.headers['content-security-policy'];
    expect(csp).toContain("script-src 'self' 'wasm-unsafe-eval'");
    expect(csp).not.toContain("'unsafe-inline' 'self'");
    expect(csp).toMatch(/script-src-attr 'none'/);
    expect(res.headers['x-content-type-options']).toBe('nosniff');
  });

  it('ends the sessions of a user the admin disables, and refuses their sign-in', async () => {
    const fresh = startTestApp();
    try {
      const victim = await makeUser(fresh.db, 'to-disable', 'staff');
      const theirs = await sessionFor(fresh.app, victim.email);
      const admin = await sessionFor(fresh.app, 'admin@fanlight.test', DEMO_PASSWORD);
      expect((await admin.request('PATCH', `/api/admin/users/${victim.id}`, { disabled: true })).status).toBe(200);
      expect((await theirs.request('GET', '/api/auth/me')).status).toBe(401);
      const again = await fresh.agent().post('/api/auth/signin').send({ email: victim.email, password: 'matrix-password-1' });
      expect(again.status).toBe(401);
    } finally {
      await fresh.close();
    }
  });

  it('keeps at least one lead in a project (409) and at least one active admin', async () => {
    const fresh = startTestApp();
    try {
      const lead = await makeUser(fresh.db, 'only-lead', 'staff');
      const projectId = await makeProject(fresh.db, [{ id: lead.id, role: 'lead' }]);
      const s = await sessionFor(fresh.app, lead.email);
      const demote = await s.request('PATCH', `/api/projects/${projectId}/members/${lead.id}`, { role: 'engineer' });
      expect(demote.status).toBe(409);
      const remove = await s.request('DELETE', `/api/projects/${projectId}/members/${lead.id}`);
      expect(remove.status).toBe(409);
      const admins = await fresh.db('users').where({ site_role: 'admin' }).whereNull('disabled_at').pluck('id');
      const admin = await sessionFor(fresh.app, 'admin@fanlight.test', DEMO_PASSWORD);
      // disable every other admin first (matrix-made ones), then the demo admin cannot demote itself
      const demoAdmin = await fresh.db('users').where({ email: 'admin@fanlight.test' }).first('id');
      for (const id of admins.filter((id: number) => id !== demoAdmin.id)) {
        await fresh.db('users').where({ id }).update({ disabled_at: fresh.db.fn.now() });
      }
      const self = await admin.request('PATCH', `/api/admin/users/${demoAdmin.id}`, { siteRole: 'staff' });
      expect(self.status).toBe(409);
    } finally {
      await fresh.close();
    }
  });

  it('names each bad field in a 400', async () => {
    const fresh = startTestApp();
    try {
      const admin = await sessionFor(fresh.app, 'admin@fanlight.test', DEMO_PASSWORD);
      const res = await admin.request('POST', '/api/admin/users', { email: 'nope', name: '', password: 'short', siteRole: 'king' });
      expect(res.status).toBe(400);
      expect(Object.keys(res.body.error.fields).sort()).toEqual(['email', 'name', 'password', 'siteRole']);
    } finally {
      await fresh.close();
    }
  });
});
