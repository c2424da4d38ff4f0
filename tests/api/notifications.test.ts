import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { makeProject, makeUser, sessionFor, type Session } from '../support/actors';
import { waitForMail } from '../support/outbox';
import { testConfig } from '../support/test-db';
import { startTestApp } from '../support/test-app';
import { insertLink, insertView } from './view-fixtures';

const t = startTestApp();
afterAll(() => t.close());
const origin = testConfig().publicOrigin;

interface Person {
  id: number;
  email: string;
  s: Session;
}

describe('notifications', () => {
  let projectId: number;
  let lead: Person;
  let engineer: Person;
  let colleague: Person;
  let viewer: Person;
  let outsider: Person;

  const person = async (label: string, siteRole: 'staff' | 'guest', name: string): Promise<Person> => {
    const u = await makeUser(t.db, label, siteRole);
    await t.db('users').where({ id: u.id }).update({ name });
    return { ...u, s: await sessionFor(t.app, u.email) };
  };
  const freshView = (title: string) => insertView(t.db, projectId, engineer.id, title);
  const markOn = async (viewId: number, text = '') =>
    (await engineer.s.request('POST', `/api/views/${viewId}/marks`, { kind: 'point', geometry: { x: 1, y: 2 }, text })).body.mark.id as number;
  const noMail = (to: string, subject: RegExp) => expect(waitForMail(to, subject, 1500)).rejects.toThrow(/no mail/);

  beforeAll(async () => {
    // invented people; every first name differs so each is a handle of its own
    lead = await person('n-lead', 'staff', 'Ilse Marrow');
    engineer = await person('n-engineer', 'staff', 'Tobin Ferrule');
    colleague = await person('n-colleague', 'staff', 'Oskar Lindqvist-Haar');
    viewer = await person('n-viewer', 'guest', 'Priya Quell');
    outsider = await person('n-outsider', 'staff', 'Wendel Outside');
    projectId = await makeProject(t.db, [
      { id: lead.id, role: 'lead' },
      { id: engineer.id, role: 'engineer' },
      { id: colleague.id, role: 'engineer' },
      { id: viewer.id, role: 'viewer' },
    ]);
  });

  it('settings: every kind is on until turned off; bad bodies are named', async () => {
    const s = colleague.s;
    expect((await s.request('GET', '/api/me/notifications')).body).toEqual({ replies: true, mentions: true, shares: true });
    const off = await s.request('PATCH', '/api/me/notifications', { mentions: false });
    expect(off.status).toBe(200);
    expect(off.body).toEqual({ replies: true, mentions: false, shares: true });
    expect((await s.request('GET', '/api/me/notifications')).body).toEqual({ replies: true, mentions: false, shares: true });
    expect((await s.request('PATCH', '/api/me/notifications', { mentions: true })).body.mentions).toBe(true);
    const bad = await s.request('PATCH', '/api/me/notifications', { replies: 'no' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields.replies).toBeDefined();
    expect((await s.request('PATCH', '/api/me/notifications', {})).status).toBe(400);
    expect((await t.agent().get('/api/me/notifications')).status).toBe(401);
  });

  it('a reply on an engineer’s mark mails the engineer, with a link to the exact mark', async () => {
    const viewId = await freshView('Reply view A');
    const markId = await markOn(viewId, 'carrier step');
    const res = await viewer.s.request('POST', `/api/marks/${markId}/comments`, { body: 'I hear it from 6000 rpm on' });
    expect(res.status).toBe(201);
    const mail = await waitForMail(engineer.email, /Priya Quell replied on your mark in "Reply view A"/);
    expect(mail.text).toContain('I hear it from 6000 rpm on');
    expect(mail.links).toEqual([`${origin}/views/${viewId}?mark=${markId}#comment-${res.body.comment.id}`]);
    expect(mail.links[0].startsWith(`${origin}/views/${viewId}?mark=${markId}`)).toBe(true);

    // a comment in the view's own thread goes to the view's author; your own comments mail nobody
    const onView = await lead.s.request('POST', `/api/views/${viewId}/comments`, { body: 'good catch' });
    const viewMail = await waitForMail(engineer.email, /Ilse Marrow replied on your view "Reply view A"/);
    expect(viewMail.links).toEqual([`${origin}/views/${viewId}#comment-${onView.body.comment.id}`]);
    await engineer.s.request('POST', `/api/marks/${markId}/comments`, { body: 'talking to myself' });
    await noMail(engineer.email, /Tobin Ferrule replied/);
  });

  it('a mention mails the mentioned member, by e-mail handle or first name, in any case', async () => {
    const viewId = await freshView('Mention view');
    const markId = await markOn(viewId);
    const handle = colleague.email.split('@')[0].toUpperCase();
    const res = await viewer.s.request('POST', `/api/marks/${markId}/comments`, { body: `@${handle}, is this the 2fc family?` });
    const mail = await waitForMail(colleague.email, /Priya Quell mentioned you in "Mention view"/);
    expect(mail.links).toEqual([`${origin}/views/${viewId}?mark=${markId}#comment-${res.body.comment.id}`]);

    // by first name, in a mark's text: the link is the mark's
    const placed = await engineer.s.request('POST', `/api/views/${viewId}/marks`, {
      kind: 'box',
      geometry: { x0: 1, x1: 2, y0: 1, y1: 2 },
      text: 'Sidebands widen here, @iLSe. Check with @nobody-here.',
    });
    const leadMail = await waitForMail(lead.email, /Tobin Ferrule mentioned you in "Mention view"/);
    expect(leadMail.links).toEqual([`${origin}/views/${viewId}?mark=${placed.body.mark.id}`]);

    // outsiders are not members: no handle of theirs is heard
    await viewer.s.request('POST', `/api/views/${viewId}/comments`, { body: '@wendel have a look' });
    await noMail(outsider.email, /mentioned you/);
  });

  it('turning replies off stops the reply mail (mentions still come)', async () => {
    const viewId = await freshView('Quiet view');
    const markId = await markOn(viewId, 'order 24 crossing');
    expect((await engineer.s.request('PATCH', '/api/me/notifications', { replies: false })).body.replies).toBe(false);
    await viewer.s.request('POST', `/api/marks/${markId}/comments`, { body: 'a reply nobody is mailed about, cc @oskar' });
    // the same comment's mention reached its member, so its mail round has run
    await waitForMail(colleague.email, /mentioned you in "Quiet view"/);
    await noMail(engineer.email, /replied on your mark in "Quiet view"/);

    await viewer.s.request('POST', `/api/marks/${markId}/comments`, { body: 'but this one says @tobin' });
    await waitForMail(engineer.email, /Priya Quell mentioned you in "Quiet view"/);
    await engineer.s.request('PATCH', '/api/me/notifications', { replies: true });
  });

  it('a reply through a share link mails the author but mentions nobody', async () => {
    const viewId = await freshView('Linked view');
    const { token } = await insertLink(t.db, viewId, engineer.id, { mayReply: true });
    const res = await t.agent().post(`/api/shared/${token}/comments`).send({ name: 'Gearbox supplier', body: 'we measured this too, @ilse' });
    expect(res.status).toBe(201);
    const mail = await waitForMail(engineer.email, /Gearbox supplier \(through a share link\) replied on your view "Linked view"/);
    expect(mail.links).toEqual([`${origin}/views/${viewId}#comment-${res.body.comment.id}`]);
    await noMail(lead.email, /mentioned you in "Linked view"/);
  });

  it('sharing a view by e-mail mails a member the link to the view, unless they turned shares off', async () => {
    const viewId = await freshView('Shared by mail');
    const res = await engineer.s.request('POST', `/api/views/${viewId}/share`, { email: viewer.email.toUpperCase() });
    expect(res.status).toBe(202);
    expect(res.body.sharedWith).toEqual({ name: 'Priya Quell', email: viewer.email });
    const mail = await waitForMail(viewer.email, /Tobin Ferrule shared the view "Shared by mail" with you/);
    expect(mail.links).toEqual([`${origin}/views/${viewId}`]);

    const notMember = await engineer.s.request('POST', `/api/views/${viewId}/share`, { email: outsider.email });
    expect(notMember.status).toBe(400);
    expect(notMember.body.error.fields.email).toMatch(/Not a member/);
    expect((await viewer.s.request('POST', `/api/views/${viewId}/share`, { email: lead.email })).status).toBe(403);
    expect((await engineer.s.request('POST', `/api/views/${viewId}/share`, { email: 'not-an-address' })).status).toBe(400);

    await lead.s.request('PATCH', '/api/me/notifications', { shares: false });
    const quiet = await freshView('Shared quietly');
    expect((await engineer.s.request('POST', `/api/views/${quiet}/share`, { email: lead.email })).status).toBe(202);
    await noMail(lead.email, /shared the view "Shared quietly"/);
  });
});
