/**
 * Personal API tokens: made, listed and revoked by their user on a session; used as
 * `Authorization: Bearer` (RFC 6750 §2.1) on the campaign routes of one project, at no more than the
 * token's role and the user's current one; revoked, expired and unknown tokens answer 401 TOKEN_INVALID.
 */
import { createHash } from 'node:crypto';
import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { userChanged } from '../../server/services/cache-notices';
import { makeProject, makeUser, sessionFor, type Session } from '../support/actors';
import { startTestApp } from '../support/test-app';

const t = startTestApp();
afterAll(() => t.close());

const DAY_MS = 24 * 3600_000;
/** SHA-256 (FIPS 180-4) of the secret, hex: what the database may hold instead of the secret. */
const sha256Hex = (s: string) => createHash('sha256').update(s).digest('hex');

const bearer = (secret: string) => ({
  get: (path: string) => supertest(t.app).get(path).set('Authorization', `Bearer ${secret}`),
  post: (path: string, body: object) => supertest(t.app).post(path).set('Authorization', `Bearer ${secret}`).send(body),
});

describe('personal API tokens', () => {
  let projectId: number;
  let otherProjectId: number;
  let engineerId: number;
  let engineer: Session;
  let viewer: Session;
  let outsider: Session;

  beforeAll(async () => {
    const e = await makeUser(t.db, 'tok-engineer', 'staff');
    const v = await makeUser(t.db, 'tok-viewer', 'guest');
    const o = await makeUser(t.db, 'tok-outsider', 'staff');
    engineerId = e.id;
    projectId = await makeProject(t.db, [
      { id: e.id, role: 'engineer' },
      { id: v.id, role: 'viewer' },
    ]);
    otherProjectId = await makeProject(t.db, [{ id: e.id, role: 'engineer' }]);
    [engineer, viewer, outsider] = await Promise.all([e, v, o].map((u) => sessionFor(t.app, u.email)));
  });

  const make = async (s: Session, body: Record<string, unknown>) => {
    const res = await s.request('POST', '/api/me/tokens', { name: 'bench rig 2', projectId, role: 'engineer', expiresInDays: 30, ...body });
    return res;
  };

  it('shows the secret once, stores only its SHA-256, and lists the token without it', async () => {
    const before = Date.now();
    const res = await make(engineer, {});
    expect(res.status).toBe(201);
    const { token, secret } = res.body;
    expect(secret).toMatch(/^flt_[A-Za-z0-9_-]{43}$/);
    // 43 base64url characters carry 32 bytes (RFC 4648 §5: 6 bits each, 256 bits → 43 characters unpadded)
    expect(Buffer.from(secret.slice(4), 'base64url')).toHaveLength(32);
    expect(token).toMatchObject({ name: 'bench rig 2', projectId, role: 'engineer', lastUsedAt: null, revokedAt: null });
    expect(token.projectName).toMatch(/^Matrix /);
    const expires = Date.parse(token.expiresAt);
    expect(expires).toBeGreaterThanOrEqual(before + 30 * DAY_MS - 2000);
    expect(expires).toBeLessThanOrEqual(Date.now() + 30 * DAY_MS + 2000);

    const row = await t.db('api_tokens').where({ id: token.id }).first();
    expect(row.token_hash).toBe(sha256Hex(secret));
    expect(JSON.stringify(row)).not.toContain(secret.slice(4));

    const list = await engineer.request('GET', '/api/me/tokens');
    expect(list.status).toBe(200);
    expect(list.body.tokens.find((k: { id: number }) => k.id === token.id)).toEqual(token);
    expect(JSON.stringify(list.body)).not.toContain(secret);
    // one's own tokens only
    expect((await viewer.request('GET', '/api/me/tokens')).body.tokens).toEqual([]);
  });

  it('refuses a role above the user\'s, a project the user is not in, and a life outside 1 to 365 days', async () => {
    const count = async () => Number((await t.db('api_tokens').count({ n: '*' }))[0].n);
    const before = await count();
    const higher = await make(viewer, { role: 'engineer' });
    expect(higher.status).toBe(400);
    expect(higher.body.error.fields.role).toMatch(/viewer/);
    expect((await make(engineer, { role: 'lead' })).status).toBe(400);
    expect((await make(outsider, { role: 'viewer' })).status).toBe(404);
    for (const days of [0, 366, 1.5, '30']) {
      const res = await make(engineer, { expiresInDays: days });
      expect(res.status, String(days)).toBe(400);
      expect(res.body.error.fields).toHaveProperty('expiresInDays');
    }
    expect((await make(engineer, { name: '   ' })).body.error.fields).toHaveProperty('name');
    expect(await count()).toBe(before);
    expect((await make(viewer, { role: 'viewer', expiresInDays: 365 })).status).toBe(201);
  });

  it('opens its project\'s campaign routes without session or CSRF token, and nothing else', async () => {
    const { secret } = (await make(engineer, {})).body;
    const list = await bearer(secret).get(`/api/projects/${projectId}/campaigns`);
    expect(list.status).toBe(200);
    const made = await bearer(secret).post(`/api/projects/${projectId}/campaigns`, { name: 'scripted', preset: { block: 8192 } });
    expect(made.status).toBe(201);
    expect(made.body.campaign.createdBy).toEqual({ id: engineerId, name: 'Test tok-engineer' });
    expect(made.headers['set-cookie']).toBeUndefined();

    // another project of the same user is unknown to the token
    const other = await bearer(secret).get(`/api/projects/${otherProjectId}/campaigns`);
    expect(other.status).toBe(404);
    expect(other.body.error.code).toBe('NOT_FOUND');
    // other routes need a session, the token routes above all
    for (const path of [`/api/projects/${projectId}`, '/api/me/tokens', '/api/auth/me', `/api/projects/${projectId}/targets`]) {
      const res = await bearer(secret).get(path);
      expect(res.status, path).toBe(401);
      expect(res.body.error.code).toBe('UNAUTHENTICATED');
    }
    expect((await bearer(secret).post('/api/me/tokens', { name: 'x', projectId, role: 'viewer', expiresInDays: 1 })).status).toBe(401);
  });

  it('lets a script retry a create with the same Idempotency-Key without making a second campaign', async () => {
    const { secret } = (await make(engineer, {})).body;
    const send = () =>
      supertest(t.app)
        .post(`/api/projects/${projectId}/campaigns`)
        .set('Authorization', `Bearer ${secret}`)
        .set('Idempotency-Key', 'c0ffee00-retry-of-one-campaign')
        .send({ name: 'retried once', preset: {}, total: 12 });
    const first = await send();
    const retry = await send();
    expect(first.status).toBe(201);
    expect(retry.status).toBe(201);
    expect(retry.headers['idempotent-replayed']).toBe('true');
    expect(retry.body.campaign.id).toBe(first.body.campaign.id);
    expect(await t.db('campaigns').where({ project_id: projectId, name: 'retried once' }).count({ n: '*' })).toEqual([{ n: 1 }]);
  });

  it('gives another site\'s pages no way to send the header: a CORS preflight is not granted', async () => {
    // A browser sends Authorization cross-site only after a preflight the server allows (Fetch standard,
    // CORS protocol); without Access-Control-Allow-* in the answer it never sends the request, which is
    // why a bearer request may skip the CSRF check.
    const res = await supertest(t.app)
      .options(`/api/projects/${projectId}/campaigns`)
      .set('Origin', 'https://elsewhere.example')
      .set('Access-Control-Request-Method', 'POST')
      .set('Access-Control-Request-Headers', 'authorization, content-type');
    expect(res.headers['access-control-allow-origin']).toBeUndefined();
    expect(res.headers['access-control-allow-headers']).toBeUndefined();
  });

  it('acts as the token\'s user even beside another user\'s session cookie', async () => {
    const { secret } = (await make(engineer, { role: 'viewer' })).body;
    // the viewer's browser session plus the engineer's viewer token: the token decides, and it may not write
    const res = await viewer.agent.post(`/api/projects/${projectId}/campaigns`).set('Authorization', `Bearer ${secret}`).send({ name: 'x', preset: {} });
    expect(res.status).toBe(403);
  });

  it('caps the request at the token\'s role, and at the user\'s current role', async () => {
    const { secret: viewerToken } = (await make(engineer, { role: 'viewer' })).body;
    const { secret: engineerToken } = (await make(engineer, { role: 'engineer' })).body;
    const campaign = await bearer(engineerToken).post(`/api/projects/${projectId}/campaigns`, { name: 'cap', preset: {} });
    const results = `/api/projects/${projectId}/campaigns/${campaign.body.campaign.id}/results`;
    expect((await bearer(viewerToken).get(results)).status).toBe(200);
    const refused = await bearer(viewerToken).post(results, { file: 'a.wav', ok: false, error: 'no speed channel' });
    expect(refused.status).toBe(403);
    expect(refused.body.error.code).toBe('FORBIDDEN');

    await t.db('project_members').where({ project_id: projectId, user_id: engineerId }).update({ role: 'viewer' });
    try {
      expect((await bearer(engineerToken).post(results, { file: 'b.wav', ok: false, error: 'too short' })).status).toBe(403);
    } finally {
      await t.db('project_members').where({ project_id: projectId, user_id: engineerId }).update({ role: 'engineer' });
    }
    expect((await bearer(engineerToken).post(results, { file: 'b.wav', ok: false, error: 'too short' })).status).toBe(201);
    await t.db('project_members').where({ project_id: projectId, user_id: engineerId }).delete();
    try {
      expect((await bearer(engineerToken).get(results)).status).toBe(404);
    } finally {
      await t.db('project_members').insert({ project_id: projectId, user_id: engineerId, role: 'engineer' });
    }
    expect(await t.db('campaign_results').where({ campaign_id: campaign.body.campaign.id, file: 'a.wav' }).count({ n: '*' })).toEqual([{ n: 0 }]);
  });

  it('answers 401 TOKEN_INVALID for a revoked, an expired, an unknown and a malformed token', async () => {
    const path = `/api/projects/${projectId}/campaigns`;
    const expectInvalid = async (res: supertest.Response, message: RegExp) => {
      expect(res.status).toBe(401);
      expect(res.body.error.code).toBe('TOKEN_INVALID');
      expect(res.body.error.message).toMatch(message);
    };
    const revoked = (await make(engineer, {})).body;
    expect((await engineer.request('DELETE', `/api/me/tokens/${revoked.token.id}`)).status).toBe(204);
    await expectInvalid(await bearer(revoked.secret).get(path), /revoked/);
    const row = await t.db('api_tokens').where({ id: revoked.token.id }).first();
    expect(row.revoked_at).not.toBeNull();
    expect((await engineer.request('GET', '/api/me/tokens')).body.tokens.find((k: { id: number }) => k.id === revoked.token.id).revokedAt).not.toBeNull();

    const expired = (await make(engineer, {})).body;
    await t.db('api_tokens').where({ id: expired.token.id }).update({ expires_at: new Date(Date.now() - 1000) });
    await expectInvalid(await bearer(expired.secret).get(path), /expired/);

    await expectInvalid(await bearer(`flt_${'A'.repeat(43)}`).get(path), /not known/);
    await expectInvalid(await supertest(t.app).get(path).set('Authorization', 'Bearer'), /Bearer flt_/);
    await expectInvalid(await supertest(t.app).get(path).set('Authorization', 'Basic dXNlcjpwYXNz'), /Bearer flt_/);
  });

  it('revokes only one\'s own token, and a second revoke changes nothing', async () => {
    const { token } = (await make(engineer, {})).body;
    expect((await viewer.request('DELETE', `/api/me/tokens/${token.id}`)).status).toBe(404);
    expect((await t.db('api_tokens').where({ id: token.id }).first()).revoked_at).toBeNull();
    expect((await engineer.request('DELETE', `/api/me/tokens/${token.id}`)).status).toBe(204);
    const first = (await t.db('api_tokens').where({ id: token.id }).first()).revoked_at;
    expect((await engineer.request('DELETE', `/api/me/tokens/${token.id}`)).status).toBe(204);
    expect((await t.db('api_tokens').where({ id: token.id }).first()).revoked_at).toEqual(first);
    expect((await engineer.request('DELETE', '/api/me/tokens/abc')).status).toBe(404);
  });

  it('notes the last use at most once a minute', async () => {
    const { token, secret } = (await make(engineer, {})).body;
    const lastUsed = async () => (await t.db('api_tokens').where({ id: token.id }).first()).last_used_at as Date | null;
    const path = `/api/projects/${projectId}/campaigns`;
    await bearer(secret).get(path).expect(200);
    const first = await lastUsed();
    expect(first).not.toBeNull();
    expect(Math.abs(first!.getTime() - Date.now())).toBeLessThan(5000);
    // a use 30 s later (as the row says) writes nothing
    const halfMinuteAgo = new Date(Math.floor(Date.now() / 1000) * 1000 - 30_000);
    await t.db('api_tokens').where({ id: token.id }).update({ last_used_at: halfMinuteAgo });
    await bearer(secret).get(path).expect(200);
    expect((await lastUsed())!.getTime()).toBe(halfMinuteAgo.getTime());
    // two minutes later it is noted again
    await t.db('api_tokens').where({ id: token.id }).update({ last_used_at: new Date(Date.now() - 120_000) });
    await bearer(secret).get(path).expect(200);
    expect(Date.now() - (await lastUsed())!.getTime()).toBeLessThan(5000);
    expect((await engineer.request('GET', '/api/me/tokens')).body.tokens.find((k: { id: number }) => k.id === token.id).lastUsedAt).not.toBeNull();
  });

  it('stops working when its user is disabled', async () => {
    const u = await makeUser(t.db, 'tok-disabled', 'staff');
    await t.db('project_members').insert({ project_id: projectId, user_id: u.id, role: 'engineer' });
    const s = await sessionFor(t.app, u.email);
    const { secret } = (await s.request('POST', '/api/me/tokens', { name: 'soon off', projectId, role: 'viewer', expiresInDays: 1 })).body;
    await t.db('users').where({ id: u.id }).update({ disabled_at: new Date() });
    userChanged(u.id); // as UserRepository announces a change it makes
    const res = await bearer(secret).get(`/api/projects/${projectId}/campaigns`);
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('TOKEN_INVALID');
  });
});
