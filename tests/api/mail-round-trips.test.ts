import { afterAll, describe, expect, it } from 'vitest';
import { makeProject, makeUser, sessionFor, uniqueEmail } from '../support/actors';
import { tokenFrom, waitForMail } from '../support/outbox';
import { startTestApp } from '../support/test-app';

describe('mail round trips through the local SMTP fake', () => {
  const t = startTestApp();
  afterAll(() => t.close());

  it('invite → accept with a new account → signed in, a member → can sign in again', async () => {
    const lead = await makeUser(t.db, 'inviting-lead', 'staff');
    const projectId = await makeProject(t.db, [{ id: lead.id, role: 'lead' }]);
    const s = await sessionFor(t.app, lead.email);
    const email = uniqueEmail('newcomer');
    const invited = await s.request('POST', `/api/projects/${projectId}/invitations`, { email, role: 'engineer' });
    expect(invited.status).toBe(201);
    expect(invited.body.mailSent).toBe(true);

    const mail = await waitForMail(email, /invited you/);
    expect(mail.links).toHaveLength(1);
    const token = tokenFrom(mail.links[0]);
    // only the hash is stored
    expect(await t.db('invitations').where({ token_hash: token }).first()).toBeUndefined();

    const preview = await t.agent().get(`/api/invitations/${token}`);
    expect(preview.body.invitation).toMatchObject({ email, role: 'engineer', accountExists: false });

    const newcomer = await sessionFor(t.app, null);
    const accepted = await newcomer.request('POST', `/api/invitations/${token}/accept`, {
      name: 'New Colleague',
      password: 'a-good-long-password',
    });
    expect(accepted.status).toBe(200);
    expect(accepted.body).toMatchObject({ user: { email, siteRole: 'guest' }, projectId });
    const mine = await newcomer.agent.get('/api/projects');
    expect(mine.body.projects.map((p: { id: number; role: string }) => [p.id, p.role])).toEqual([[projectId, 'engineer']]);

    // one time only
    expect((await t.agent().post(`/api/invitations/${token}/accept`).send({})).status).toBe(404);
    // and the new account signs in like any other
    await t.agent().post('/api/auth/signin').send({ email, password: 'a-good-long-password' }).expect(200);
  });

  it('an expired invitation is refused', async () => {
    const lead = await makeUser(t.db, 'expiring-lead', 'staff');
    const projectId = await makeProject(t.db, [{ id: lead.id, role: 'lead' }]);
    const s = await sessionFor(t.app, lead.email);
    const email = uniqueEmail('late');
    expect((await s.request('POST', `/api/projects/${projectId}/invitations`, { email, role: 'viewer' })).status).toBe(201);
    const token = tokenFrom((await waitForMail(email, /invited you/)).links[0]);
    await t.db('invitations').where({ email }).update({ expires_at: new Date(Date.now() - 1000) });
    expect((await t.agent().get(`/api/invitations/${token}`)).status).toBe(404);
  });

  it('reset → the new password works, the old one does not, other sessions are ended', async () => {
    const user = await makeUser(t.db, 'forgetful', 'staff');
    const elsewhere = await sessionFor(t.app, user.email); // e.g. signed in on another computer
    const asked = await t.agent().post('/api/auth/password-reset/request').send({ email: user.email });
    expect(asked.status).toBe(202);
    const mail = await waitForMail(user.email, /Reset your Fanlight password/);
    const token = tokenFrom(mail.links[0]);
    expect(await t.db('password_resets').where({ token_hash: token }).first()).toBeUndefined();

    const confirmed = await t.agent().post('/api/auth/password-reset/confirm').send({ token, password: 'brand-new-password' });
    expect(confirmed.status).toBe(204);

    expect((await elsewhere.request('GET', '/api/auth/me')).status).toBe(401);
    expect((await t.agent().post('/api/auth/signin').send({ email: user.email, password: 'matrix-password-1' })).status).toBe(401);
    await t.agent().post('/api/auth/signin').send({ email: user.email, password: 'brand-new-password' }).expect(200);
    // the link works once
    const again = await t.agent().post('/api/auth/password-reset/confirm').send({ token, password: 'another-new-password' });
    expect(again.status).toBe(400);
  });

  it('a reset request for an unknown e-mail answers 202 and sends nothing', async () => {
    const email = uniqueEmail('ghost');
    expect((await t.agent().post('/api/auth/password-reset/request').send({ email })).status).toBe(202);
    await expect(waitForMail(email, /Reset/, 1500)).rejects.toThrow(/no mail/);
  });

  it('the Outbox lists what was sent, with its links', async () => {
    const res = await t.agent().get('/api/outbox');
    expect(res.status).toBe(200);
    expect(res.body.messages.length).toBeGreaterThan(0);
    expect(res.body.messages[0]).toMatchObject({ subject: expect.any(String), links: expect.any(Array) });
  });
});
