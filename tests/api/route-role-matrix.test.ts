/**
 * Every API route, for every kind of caller, against the status it must answer. The table is the
 * specification: a route registered in the app without a row here fails the first test.
 */
import { randomBytes } from 'node:crypto';
import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { hashToken, newToken } from '../../server/services/tokens';
import { makeProject, makeUser, sessionFor, uniqueEmail, type Session } from '../support/actors';
import { registeredRoutes } from '../support/routes';
import { startTestApp } from '../support/test-app';
import { SNAPSHOT_TYPE, insertLink, insertMark, insertSnapshot, insertView, sampleState, snapshotBytes } from './view-fixtures';

const ACTORS = ['anonymous', 'guest', 'nonMember', 'viewer', 'engineer', 'lead', 'admin'] as const;
type Actor = (typeof ACTORS)[number];
type Expect = Record<Actor, number>;

/** Shorthands for the common shapes of expectation. */
const all = (s: number): Expect => ({ anonymous: s, guest: s, nonMember: s, viewer: s, engineer: s, lead: s, admin: s });
const signedIn = (s: number): Expect => ({ ...all(s), anonymous: 401 });
// Project routes: outsiders (guest, staff non-member, admin who is no member) may not know the project exists.
const member = (min: 'viewer' | 'engineer' | 'lead', ok: number): Expect => ({
  anonymous: 401,
  guest: 404,
  nonMember: 404,
  admin: 404,
  viewer: min === 'viewer' ? ok : 403,
  engineer: min === 'lead' ? 403 : ok,
  lead: ok,
});
const adminOnly = (ok: number): Expect => ({ ...signedIn(403), admin: ok });

/**
 * API tokens a script may come with (Authorization: Bearer), all the engineer's: one for the project at
 * engineer, one capped at viewer, one for another project, a revoked one and an expired one.
 */
const BEARERS = ['tokenEngineer', 'tokenViewer', 'tokenOtherProject', 'tokenRevoked', 'tokenExpired'] as const;
type Bearer = (typeof BEARERS)[number];
type BearerExpect = Record<Bearer, number>;
/** A campaign route: the token opens what its role does, its project only. */
const byToken = (min: 'viewer' | 'engineer', ok: number): BearerExpect => ({
  tokenEngineer: ok,
  tokenViewer: min === 'viewer' ? ok : 403,
  tokenOtherProject: 404,
  tokenRevoked: 401,
  tokenExpired: 401,
});
/** Every other route needs a session (401); a valid token gets no further, an invalid one neither. */
const TOKEN_SHUT: BearerExpect = { tokenEngineer: 401, tokenViewer: 401, tokenOtherProject: 401, tokenRevoked: 401, tokenExpired: 401 };
const TOKEN_IRRELEVANT: BearerExpect = { tokenEngineer: 200, tokenViewer: 200, tokenOtherProject: 200, tokenRevoked: 200, tokenExpired: 200 };

interface Fixture {
  projectId: number;
  targetMemberId: number;
  targetMemberEmail: string;
  adminTargetId: number;
  engineerId: number;
  /** A view by the engineer, with a snapshot, a mark by the engineer and a reply-enabled share link. */
  viewId: number;
  markId: number;
  linkToken: string;
  /** Each signed-in actor's user id (their own API tokens are made for them). */
  userIds: Record<Exclude<Actor, 'anonymous'>, number>;
  /** A campaign the engineer started. */
  campaignId: number;
  bearers: Record<Bearer, string>;
}

/** One call: a JSON body, or a file sent as multipart/form-data. */
interface Call {
  path: string;
  body?: unknown;
  file?: { field: string; bytes: Buffer; contentType: string };
}

interface Row {
  method: 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE';
  route: string;
  expect: Expect;
  /** Builds the concrete path and body for one call (fresh targets where a call would use them up). */
  call(f: Fixture, actor: Actor): Promise<Call> | Call;
  /** Needs a session of its own (it changes or ends the session). */
  ownSession?: boolean;
  /** With an API token instead of a session (the call made as the engineer's); default TOKEN_SHUT. */
  bearer?: BearerExpect;
}

const t = startTestApp();

async function openInvitation(projectId: number, email = uniqueEmail('invitee')) {
  const token = newToken();
  const [id] = await t.db('invitations').insert({
    project_id: projectId,
    email,
    role: 'viewer',
    token_hash: hashToken(token),
    expires_at: new Date(Date.now() + 3600_000),
  });
  return { id, token };
}

/** Metadata of a (different each time) recording, as the Bench sends it. */
const recordingBody = () => ({
  name: 'run-up 3.wav',
  fingerprint: randomBytes(32).toString('hex'),
  format: 'wav',
  sampleRateHz: 51200,
  durationS: 30,
  channels: [{ index: 0, name: 'acc housing', quantity: 'acceleration', unit: 'm/s²', calibration: { kind: 'scale', factor: 1 } }],
});

/** Targets: each call its own track (order:1, order:2, …), so no create meets one it made before. */
let tracksMade = 0;
const freshTrack = () => `order:${++tracksMade}`;
const TARGET_POINTS = [
  [1000, 60],
  [3000, 66],
];
/** A token row for the user (the matrix's own tokens; the route makes its own with a secret). */
async function insertApiToken(userId: number, projectId: number, role: 'viewer' | 'engineer', extra: Record<string, unknown> = {}) {
  const secret = `flt_${newToken()}`;
  const [id] = await t.db('api_tokens').insert({
    user_id: userId,
    project_id: projectId,
    role,
    name: 'matrix token',
    token_hash: hashToken(secret),
    expires_at: new Date(Date.now() + 24 * 3600_000),
    ...extra,
  });
  return { id, secret };
}

/** Campaign results: each call its own file, so none meets the stored result of an earlier call. */
let filesPosted = 0;

async function insertTarget(projectId: number, createdBy: number): Promise<number> {
  const [id] = await t.db('targets').insert({ project_id: projectId, track: freshTrack(), weighting: 'A', points: JSON.stringify(TARGET_POINTS), created_by: createdBy });
  return id;
}

const ROWS: Row[] = [
  // before any authentication: a token neither helps nor hurts
  { method: 'GET', route: '/api/health', expect: all(200), bearer: TOKEN_IRRELEVANT, call: () => ({ path: '/api/health' }) },
  { method: 'GET', route: '/api/outbox', expect: all(200), bearer: TOKEN_IRRELEVANT, call: () => ({ path: '/api/outbox' }) },
  { method: 'GET', route: '/api/auth/csrf', expect: all(200), call: () => ({ path: '/api/auth/csrf' }) },
  {
    method: 'POST',
    route: '/api/auth/signin',
    expect: all(401),
    ownSession: true,
    // a fresh unknown e-mail each time, so the per-e-mail brake does not join in
    call: () => ({ path: '/api/auth/signin', body: { email: uniqueEmail('unknown'), password: 'wrong-password' } }),
  },
  { method: 'POST', route: '/api/auth/signout', expect: all(204), ownSession: true, call: () => ({ path: '/api/auth/signout' }) },
  { method: 'GET', route: '/api/auth/me', expect: signedIn(200), call: () => ({ path: '/api/auth/me' }) },
  { method: 'GET', route: '/api/auth/session', expect: all(200), call: () => ({ path: '/api/auth/session' }) },
  {
    method: 'POST',
    route: '/api/auth/password-reset/request',
    expect: all(202),
    call: () => ({ path: '/api/auth/password-reset/request', body: { email: uniqueEmail('nobody') } }),
  },
  {
    method: 'POST',
    route: '/api/auth/password-reset/confirm',
    expect: all(400),
    call: () => ({ path: '/api/auth/password-reset/confirm', body: { token: newToken(), password: 'long-enough-password' } }),
  },
  { method: 'GET', route: '/api/projects', expect: signedIn(200), call: () => ({ path: '/api/projects' }) },
  {
    method: 'POST',
    route: '/api/projects',
    // staff and admins create; the viewer and the guest are site guests
    expect: { anonymous: 401, guest: 403, nonMember: 201, viewer: 403, engineer: 201, lead: 201, admin: 201 },
    call: () => ({ path: '/api/projects', body: { name: 'Matrix-made project', description: '' } }),
  },
  { method: 'GET', route: '/api/projects/:id', expect: member('viewer', 200), call: (f) => ({ path: `/api/projects/${f.projectId}` }) },
  {
    method: 'PATCH',
    route: '/api/projects/:id',
    expect: member('lead', 200),
    call: (f) => ({ path: `/api/projects/${f.projectId}`, body: { description: 'Changed by the matrix' } }),
  },
  {
    method: 'POST',
    route: '/api/projects/:id/archive',
    expect: member('lead', 200),
    call: (f) => ({ path: `/api/projects/${f.projectId}/archive` }),
  },
  {
    method: 'POST',
    route: '/api/projects/:id/restore',
    expect: member('lead', 200),
    call: (f) => ({ path: `/api/projects/${f.projectId}/restore` }),
  },
  {
    method: 'GET',
    route: '/api/projects/:id/members',
    expect: member('viewer', 200),
    call: (f) => ({ path: `/api/projects/${f.projectId}/members` }),
  },
  {
    method: 'PATCH',
    route: '/api/projects/:id/members/:userId',
    expect: member('lead', 200),
    call: (f) => ({ path: `/api/projects/${f.projectId}/members/${f.targetMemberId}`, body: { role: 'engineer' } }),
  },
  {
    method: 'DELETE',
    route: '/api/projects/:id/members/:userId',
    expect: member('lead', 204),
    call: async (f) => {
      const temp = await makeUser(t.db, 'temp-member', 'guest');
      await t.db('project_members').insert({ project_id: f.projectId, user_id: temp.id, role: 'viewer' });
      return { path: `/api/projects/${f.projectId}/members/${temp.id}` };
    },
  },
  {
    method: 'POST',
    route: '/api/projects/:id/invitations',
    expect: member('lead', 201),
    call: (f) => ({ path: `/api/projects/${f.projectId}/invitations`, body: { email: uniqueEmail('invited'), role: 'viewer' } }),
  },
  {
    method: 'DELETE',
    route: '/api/projects/:id/invitations/:invitationId',
    expect: member('lead', 204),
    call: async (f) => ({ path: `/api/projects/${f.projectId}/invitations/${(await openInvitation(f.projectId)).id}` }),
  },
  {
    method: 'GET',
    route: '/api/projects/:id/activity',
    expect: member('viewer', 200),
    call: (f) => ({ path: `/api/projects/${f.projectId}/activity` }),
  },
  {
    method: 'GET',
    route: '/api/projects/:id/recordings',
    expect: member('viewer', 200),
    call: (f) => ({ path: `/api/projects/${f.projectId}/recordings` }),
  },
  {
    method: 'POST',
    route: '/api/projects/:id/recordings',
    expect: member('engineer', 201),
    call: (f) => ({ path: `/api/projects/${f.projectId}/recordings`, body: recordingBody() }),
  },
  {
    method: 'GET',
    route: '/api/projects/:id/targets',
    expect: member('viewer', 200),
    call: (f) => ({ path: `/api/projects/${f.projectId}/targets` }),
  },
  {
    method: 'POST',
    route: '/api/projects/:id/targets',
    expect: member('engineer', 201),
    // a fresh track each call: a second target of one track and weighting is a 409
    call: (f) => ({ path: `/api/projects/${f.projectId}/targets`, body: { track: freshTrack(), weighting: 'A', points: TARGET_POINTS } }),
  },
  {
    method: 'POST',
    route: '/api/projects/:id/targets/import',
    expect: member('engineer', 200),
    call: (f) => {
      const track = freshTrack();
      return { path: `/api/projects/${f.projectId}/targets/import`, body: { csv: `track,rpm,db\n${track},1000,60\n${track},3000,66`, weighting: 'Z' } };
    },
  },
  {
    method: 'PATCH',
    route: '/api/targets/:id',
    expect: member('engineer', 200),
    call: async (f) => ({ path: `/api/targets/${await insertTarget(f.projectId, f.engineerId)}`, body: { version: 1, label: 'edited by the matrix' } }),
  },
  {
    method: 'DELETE',
    route: '/api/targets/:id',
    expect: member('engineer', 204),
    call: async (f) => ({ path: `/api/targets/${await insertTarget(f.projectId, f.engineerId)}` }),
  },
  {
    method: 'GET',
    route: '/api/invitations/:token',
    // the token is the credential: whoever holds the link may read what it invites to
    expect: all(200),
    call: async (f) => ({ path: `/api/invitations/${(await openInvitation(f.projectId)).token}` }),
  },
  {
    method: 'POST',
    route: '/api/invitations/:token/accept',
    // an invitation for someone else: signed-in callers are the wrong person (403); an anonymous
    // caller without name and password cannot create the account (400)
    expect: { ...signedIn(403), anonymous: 400 },
    call: async (f) => ({ path: `/api/invitations/${(await openInvitation(f.projectId)).token}/accept`, body: {} }),
  },
  { method: 'GET', route: '/api/demo-recordings', expect: signedIn(200), call: () => ({ path: '/api/demo-recordings' }) },
  { method: 'GET', route: '/api/admin/users', expect: adminOnly(200), call: () => ({ path: '/api/admin/users' }) },
  {
    method: 'POST',
    route: '/api/admin/users',
    expect: adminOnly(201),
    call: () => ({
      path: '/api/admin/users',
      body: { email: uniqueEmail('created'), name: 'Made by admin', password: 'long-enough-password', siteRole: 'guest' },
    }),
  },
  {
    method: 'PATCH',
    route: '/api/admin/users',
    expect: adminOnly(200),
    call: (f) => ({ path: '/api/admin/users', body: { id: f.adminTargetId, name: 'Renamed by admin' } }),
  },
  {
    method: 'PATCH',
    route: '/api/admin/users/:id',
    expect: adminOnly(200),
    call: (f) => ({ path: `/api/admin/users/${f.adminTargetId}`, body: { siteRole: 'staff' } }),
  },
  // ---- views, snapshots, marks, threads, share links, notification settings
  {
    method: 'GET',
    route: '/api/projects/:id/views',
    expect: member('viewer', 200),
    call: (f) => ({ path: `/api/projects/${f.projectId}/views?sort=title&pageSize=5` }),
  },
  {
    method: 'POST',
    route: '/api/projects/:id/views',
    expect: member('engineer', 201),
    call: (f) => ({ path: `/api/projects/${f.projectId}/views`, body: { title: 'Matrix-made view', state: sampleState() } }),
  },
  { method: 'GET', route: '/api/views/:id', expect: member('viewer', 200), call: (f) => ({ path: `/api/views/${f.viewId}` }) },
  {
    method: 'PATCH',
    route: '/api/views/:id',
    // the author (the engineer) or a lead
    expect: member('engineer', 200),
    call: async (f) => ({ path: `/api/views/${await insertView(t.db, f.projectId, f.engineerId)}`, body: { version: 1, title: 'Renamed by the matrix' } }),
  },
  {
    method: 'DELETE',
    route: '/api/views/:id',
    expect: member('engineer', 204),
    call: async (f) => ({ path: `/api/views/${await insertView(t.db, f.projectId, f.engineerId)}` }),
  },
  {
    method: 'POST',
    route: '/api/views/:id/archive',
    expect: member('lead', 200),
    call: async (f) => ({ path: `/api/views/${await insertView(t.db, f.projectId, f.engineerId)}/archive` }),
  },
  {
    method: 'PUT',
    route: '/api/views/:id/snapshot',
    expect: member('engineer', 200),
    call: (f) => ({ path: `/api/views/${f.viewId}/snapshot`, file: { field: 'snapshot', bytes: snapshotBytes(8, 4), contentType: SNAPSHOT_TYPE } }),
  },
  { method: 'GET', route: '/api/views/:id/snapshot', expect: member('viewer', 200), call: (f) => ({ path: `/api/views/${f.viewId}/snapshot` }) },
  { method: 'GET', route: '/api/views/:id/marks', expect: member('viewer', 200), call: (f) => ({ path: `/api/views/${f.viewId}/marks` }) },
  {
    method: 'POST',
    route: '/api/views/:id/marks',
    expect: member('engineer', 201),
    call: (f) => ({ path: `/api/views/${f.viewId}/marks`, body: { kind: 'point', geometry: { x: 4200, y: 9600 }, text: 'placed by the matrix' } }),
  },
  {
    method: 'PATCH',
    route: '/api/marks/:id',
    // the author (the engineer) or a lead
    expect: member('engineer', 200),
    call: async (f) => ({ path: `/api/marks/${await insertMark(t.db, f.viewId, f.engineerId)}`, body: { version: 1, text: 'edited by the matrix' } }),
  },
  {
    method: 'DELETE',
    route: '/api/marks/:id',
    expect: member('engineer', 204),
    call: async (f) => ({ path: `/api/marks/${await insertMark(t.db, f.viewId, f.engineerId)}` }),
  },
  { method: 'GET', route: '/api/marks/:id/comments', expect: member('viewer', 200), call: (f) => ({ path: `/api/marks/${f.markId}/comments` }) },
  {
    method: 'POST',
    route: '/api/marks/:id/comments',
    expect: member('viewer', 201),
    call: (f) => ({ path: `/api/marks/${f.markId}/comments`, body: { body: 'a reply from the matrix' } }),
  },
  { method: 'GET', route: '/api/views/:id/comments', expect: member('viewer', 200), call: (f) => ({ path: `/api/views/${f.viewId}/comments` }) },
  {
    method: 'POST',
    route: '/api/views/:id/comments',
    expect: member('viewer', 201),
    call: (f) => ({ path: `/api/views/${f.viewId}/comments`, body: { body: 'a view comment from the matrix' } }),
  },
  { method: 'GET', route: '/api/views/:id/links', expect: member('engineer', 200), call: (f) => ({ path: `/api/views/${f.viewId}/links` }) },
  {
    method: 'POST',
    route: '/api/views/:id/links',
    expect: member('engineer', 201),
    call: (f) => ({ path: `/api/views/${f.viewId}/links`, body: { mayReply: false } }),
  },
  {
    method: 'DELETE',
    route: '/api/links/:id',
    expect: member('engineer', 204),
    call: async (f) => ({ path: `/api/links/${(await insertLink(t.db, f.viewId, f.engineerId)).id}` }),
  },
  {
    method: 'POST',
    route: '/api/views/:id/share',
    expect: member('engineer', 202),
    call: (f) => ({ path: `/api/views/${f.viewId}/share`, body: { email: f.targetMemberEmail } }),
  },
  // the token is the credential: whoever holds the link may read the view, with or without an account
  { method: 'GET', route: '/api/shared/:token', expect: all(200), call: (f) => ({ path: `/api/shared/${f.linkToken}` }) },
  { method: 'GET', route: '/api/shared/:token/snapshot', expect: all(200), call: (f) => ({ path: `/api/shared/${f.linkToken}/snapshot` }) },
  {
    method: 'POST',
    route: '/api/shared/:token/comments',
    expect: all(201),
    call: (f) => ({ path: `/api/shared/${f.linkToken}/comments`, body: { name: 'A supplier', body: 'seen, thanks' } }),
  },
  { method: 'GET', route: '/api/me/notifications', expect: signedIn(200), call: () => ({ path: '/api/me/notifications' }) },
  {
    method: 'PATCH',
    route: '/api/me/notifications',
    expect: signedIn(200),
    call: () => ({ path: '/api/me/notifications', body: { shares: true } }),
  },
  // ---- personal API tokens (a session only) and campaigns (a session or the project's token)
  { method: 'GET', route: '/api/me/tokens', expect: signedIn(200), call: () => ({ path: '/api/me/tokens' }) },
  {
    method: 'POST',
    route: '/api/me/tokens',
    // a token for a project one is a member of, at a role one has
    expect: member('viewer', 201),
    call: (f) => ({ path: '/api/me/tokens', body: { name: 'matrix script', projectId: f.projectId, role: 'viewer', expiresInDays: 7 } }),
  },
  {
    method: 'DELETE',
    route: '/api/me/tokens/:tokenId',
    // each caller revokes a token of their own
    expect: signedIn(204),
    call: async (f, actor) => ({ path: `/api/me/tokens/${actor === 'anonymous' ? 1 : (await insertApiToken(f.userIds[actor], f.projectId, 'viewer')).id}` }),
  },
  {
    method: 'GET',
    route: '/api/projects/:projectId/campaigns',
    expect: member('viewer', 200),
    bearer: byToken('viewer', 200),
    call: (f) => ({ path: `/api/projects/${f.projectId}/campaigns` }),
  },
  {
    method: 'POST',
    route: '/api/projects/:projectId/campaigns',
    expect: member('engineer', 201),
    bearer: byToken('engineer', 201),
    call: (f) => ({ path: `/api/projects/${f.projectId}/campaigns`, body: { name: 'Matrix campaign', preset: { block: 8192 }, total: 2 } }),
  },
  {
    method: 'GET',
    route: '/api/projects/:projectId/campaigns/:campaignId',
    expect: member('viewer', 200),
    bearer: byToken('viewer', 200),
    call: (f) => ({ path: `/api/projects/${f.projectId}/campaigns/${f.campaignId}` }),
  },
  {
    method: 'PATCH',
    route: '/api/projects/:projectId/campaigns/:campaignId',
    expect: member('engineer', 200),
    bearer: byToken('engineer', 200),
    call: (f) => ({ path: `/api/projects/${f.projectId}/campaigns/${f.campaignId}`, body: { total: 3 } }),
  },
  {
    method: 'POST',
    route: '/api/projects/:projectId/campaigns/:campaignId/results',
    expect: member('engineer', 201),
    bearer: byToken('engineer', 201),
    call: (f) => ({ path: `/api/projects/${f.projectId}/campaigns/${f.campaignId}/results`, body: { file: `run-${++filesPosted}.wav`, ok: false, error: 'no speed channel' } }),
  },
  {
    method: 'GET',
    route: '/api/projects/:projectId/campaigns/:campaignId/results',
    expect: member('viewer', 200),
    bearer: byToken('viewer', 200),
    call: (f) => ({ path: `/api/projects/${f.projectId}/campaigns/${f.campaignId}/results?sort=-createdAt&limit=10` }),
  },
];

describe('route × role matrix', () => {
  const emails = {} as Record<Exclude<Actor, 'anonymous'>, string>;
  const sessions = {} as Record<Actor, Session>;
  const fixture = {} as Fixture;

  beforeAll(async () => {
    const guest = await makeUser(t.db, 'guest', 'guest');
    const nonMember = await makeUser(t.db, 'non-member', 'staff');
    const viewer = await makeUser(t.db, 'viewer', 'guest');
    const engineer = await makeUser(t.db, 'engineer', 'staff');
    const lead = await makeUser(t.db, 'lead', 'staff');
    const admin = await makeUser(t.db, 'admin', 'admin');
    const target = await makeUser(t.db, 'target', 'guest');
    const adminTarget = await makeUser(t.db, 'admin-target', 'guest');
    Object.assign(emails, {
      guest: guest.email,
      nonMember: nonMember.email,
      viewer: viewer.email,
      engineer: engineer.email,
      lead: lead.email,
      admin: admin.email,
    });
    fixture.projectId = await makeProject(t.db, [
      { id: lead.id, role: 'lead' },
      { id: engineer.id, role: 'engineer' },
      { id: viewer.id, role: 'viewer' },
      { id: target.id, role: 'engineer' },
    ]);
    fixture.targetMemberId = target.id;
    fixture.targetMemberEmail = target.email;
    fixture.adminTargetId = adminTarget.id;
    fixture.engineerId = engineer.id;
    fixture.viewId = await insertView(t.db, fixture.projectId, engineer.id, 'Matrix view');
    await insertSnapshot(t.db, fixture.viewId);
    fixture.markId = await insertMark(t.db, fixture.viewId, engineer.id);
    fixture.linkToken = (await insertLink(t.db, fixture.viewId, engineer.id, { mayReply: true })).token;
    fixture.userIds = { guest: guest.id, nonMember: nonMember.id, viewer: viewer.id, engineer: engineer.id, lead: lead.id, admin: admin.id };
    [fixture.campaignId] = await t.db('campaigns').insert({ project_id: fixture.projectId, name: 'Matrix campaign', preset: '{}', tags: '{}', created_by: engineer.id });
    const otherProjectId = await makeProject(t.db, [{ id: engineer.id, role: 'engineer' }]);
    fixture.bearers = {
      tokenEngineer: (await insertApiToken(engineer.id, fixture.projectId, 'engineer')).secret,
      tokenViewer: (await insertApiToken(engineer.id, fixture.projectId, 'viewer')).secret,
      tokenOtherProject: (await insertApiToken(engineer.id, otherProjectId, 'engineer')).secret,
      tokenRevoked: (await insertApiToken(engineer.id, fixture.projectId, 'engineer', { revoked_at: new Date() })).secret,
      tokenExpired: (await insertApiToken(engineer.id, fixture.projectId, 'engineer', { expires_at: new Date(Date.now() - 60_000) })).secret,
    };
    for (const actor of ACTORS) sessions[actor] = await sessionFor(t.app, actor === 'anonymous' ? null : emails[actor]);
  });
  afterAll(() => t.close());

  it('has a row for every registered API route', () => {
    const inTable = ROWS.map((r) => `${r.method} ${r.route}`).sort();
    expect(inTable).toEqual(registeredRoutes(t.app));
  });

  describe.each(ROWS)('$method $route', (row) => {
    it.each(ACTORS)('as %s', async (actor) => {
      const session =
        row.ownSession ? await sessionFor(t.app, actor === 'anonymous' ? null : emails[actor]) : sessions[actor];
      const { path, body, file } = await row.call(fixture, actor);
      const res = file
        ? await session.agent
            .put(path)
            .set('X-CSRF-Token', session.csrf)
            .attach(file.field, file.bytes, { filename: 'matrix.fls', contentType: file.contentType })
        : await session.request(row.method, path, body);
      expect(res.status, `${row.method} ${path} as ${actor}: ${JSON.stringify(res.body)}`).toBe(row.expect[actor]);
      if (res.status >= 400) {
        // the one error shape, always
        expect(res.body.error).toMatchObject({ code: expect.any(String), message: expect.any(String) });
      }
    });
  });

  // A script's token, without session or CSRF token: campaign routes by the token's role and project, the
  // rest shut. Routes a token cannot open are called with the valid engineer token only.
  describe.each(ROWS)('$method $route with an API token', (row) => {
    const kinds = row.bearer ? BEARERS : (['tokenEngineer'] as const);
    it.each(kinds)('as %s', async (kind) => {
      const expected = (row.bearer ?? TOKEN_SHUT)[kind];
      const { path, body, file } = await row.call(fixture, 'engineer');
      const m = row.method.toLowerCase() as 'get' | 'post' | 'patch' | 'put' | 'delete';
      const req = supertest(t.app)[m](path).set('Authorization', `Bearer ${fixture.bearers[kind]}`);
      const res = await (file
        ? req.attach(file.field, file.bytes, { filename: 'matrix.fls', contentType: file.contentType })
        : body === undefined
          ? req
          : req.send(body as object));
      expect(res.status, `${row.method} ${path} with ${kind}: ${JSON.stringify(res.body)}`).toBe(expected);
      if (res.status >= 400) expect(res.body.error).toMatchObject({ code: expect.any(String), message: expect.any(String) });
      if (res.status === 401 && (kind === 'tokenRevoked' || kind === 'tokenExpired')) expect(res.body.error.code).toBe('TOKEN_INVALID');
    });
  });
});
