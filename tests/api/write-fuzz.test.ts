/**
 * Bad input on every write route: random JSON (fast-check) and valid bodies with one field spoiled
 * (huge numbers, 10 000-character text, emoji, wrong types, ids of another project). Each answer is either
 * a success or an error in the one shape, never a 500; and whatever is refused stores nothing.
 */
import { randomUUID } from 'node:crypto';
import fc from 'fast-check';
import supertest from 'supertest';
import type { Knex } from 'knex';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { hashToken, newToken } from '../../server/services/tokens';
import { makeProject, makeUser, sessionFor, type Session } from '../support/actors';
import { startTestApp } from '../support/test-app';
import { insertMark, insertView, sampleState } from './view-fixtures';

const t = startTestApp();
afterAll(() => t.close());

interface Target {
  name: string;
  method: 'POST' | 'PATCH';
  path: () => string;
  valid: () => Record<string, unknown>;
  /** the table a success writes to, counted before and after a refusal */
  table: string;
  as: () => Session;
  /** Sent with this API token (Authorization: Bearer) instead of the session. */
  bearer?: () => string;
}

const REFUSALS = new Set([400, 403, 404, 409, 413, 415, 422]);

async function rows(db: Knex, table: string): Promise<number> {
  return Number((await db(table).count({ n: '*' }))[0].n);
}

/** Values that spoil a field: what clients send by mistake or on purpose. */
const spoilers = fc.oneof(
  fc.constantFrom<unknown>(1e308, -1e308, 1e13, null, '', 'x'.repeat(10_000), '😀'.repeat(500), -1, 0, 2 ** 53, true, [], {}, 'NaN', '1e308'),
  fc.string({ maxLength: 40, unit: 'grapheme' }),
  fc.jsonValue({ maxDepth: 2 }),
);

/** A valid body with one field (at any depth) replaced by a spoiler. */
function spoil(body: Record<string, unknown>, pick: number, value: unknown): Record<string, unknown> {
  const copy = structuredClone(body);
  const paths: (string | number)[][] = [];
  const walk = (v: unknown, at: (string | number)[]) => {
    if (at.length) paths.push(at);
    if (v && typeof v === 'object') for (const [k, child] of Object.entries(v)) walk(child, [...at, Array.isArray(v) ? Number(k) : k]);
  };
  walk(copy, []);
  if (!paths.length) return copy;
  const path = paths[pick % paths.length];
  let parent: Record<string | number, unknown> = copy;
  for (const k of path.slice(0, -1)) parent = parent[k] as Record<string | number, unknown>;
  parent[path[path.length - 1]] = value;
  return copy;
}

describe('bad input on the write routes', () => {
  let lead: Session;
  let engineer: Session;
  let projectId: number;
  let otherProjectId: number;
  let viewId: number;
  let markId: number;
  let targetId: number;
  let tracksMade = 0;
  const freshTrack = () => `order:${++tracksMade}`;
  let campaignId: number;
  let engineerToken: string;
  let filesPosted = 0;
  const freshFile = () => `fuzz/run-${++filesPosted}.wav`;

  beforeAll(async () => {
    const l = await makeUser(t.db, 'fuzz-lead', 'staff');
    const e = await makeUser(t.db, 'fuzz-engineer', 'staff');
    projectId = await makeProject(t.db, [
      { id: l.id, role: 'lead' },
      { id: e.id, role: 'engineer' },
    ]);
    otherProjectId = await makeProject(t.db, []);
    viewId = await insertView(t.db, projectId, e.id, 'Fuzz target');
    markId = await insertMark(t.db, viewId, e.id);
    [targetId] = await t.db('targets').insert({ project_id: projectId, track: 'overall', weighting: 'A', points: '[[0,60],[1000,70]]', created_by: e.id });
    [campaignId] = await t.db('campaigns').insert({ project_id: projectId, name: 'Fuzz campaign', preset: '{}', tags: '{}', created_by: e.id });
    engineerToken = `flt_${newToken()}`;
    await t.db('api_tokens').insert({ user_id: e.id, project_id: projectId, role: 'engineer', name: 'fuzz', token_hash: hashToken(engineerToken), expires_at: new Date(Date.now() + 24 * 3600_000) });
    lead = await sessionFor(t.app, l.email);
    engineer = await sessionFor(t.app, e.email);
  });

  const targets: Target[] = [
    { name: 'create a project', method: 'POST', path: () => '/api/projects', valid: () => ({ name: `Fuzz ${randomUUID()}`, description: 'd' }), table: 'projects', as: () => lead },
    {
      name: 'save a view',
      method: 'POST',
      path: () => `/api/projects/${projectId}/views`,
      valid: () => ({ title: `Fuzz view ${randomUUID()}`, recordingId: null, state: sampleState() }),
      table: 'views',
      as: () => engineer,
    },
    {
      name: 'place a mark',
      method: 'POST',
      path: () => `/api/views/${viewId}/marks`,
      valid: () => ({ kind: 'box', geometry: { x0: 100, x1: 200, y0: 10, y1: 20 }, text: 'fuzz' }),
      table: 'marks',
      as: () => engineer,
    },
    { name: 'comment on a mark', method: 'POST', path: () => `/api/marks/${markId}/comments`, valid: () => ({ body: 'a reply' }), table: 'comments', as: () => engineer },
    { name: 'comment on a view', method: 'POST', path: () => `/api/views/${viewId}/comments`, valid: () => ({ body: 'a note' }), table: 'comments', as: () => engineer },
    { name: 'make a share link', method: 'POST', path: () => `/api/views/${viewId}/links`, valid: () => ({ mayReply: true, expiresAt: null }), table: 'share_links', as: () => engineer },
    {
      name: 'register a recording',
      method: 'POST',
      path: () => `/api/projects/${projectId}/recordings`,
      valid: () => ({
        name: 'fuzz.wav',
        fingerprint: randomUUID().replace(/-/g, '').repeat(2),
        format: 'wav',
        sampleRateHz: 51200,
        durationS: 12.5,
        channels: [{ index: 0, name: 'acc', quantity: 'acceleration', unit: 'm/s²', calibration: { kind: 'scale', factor: 1 } }],
      }),
      table: 'recordings',
      as: () => engineer,
    },
    { name: 'invite a member', method: 'POST', path: () => `/api/projects/${projectId}/invitations`, valid: () => ({ email: `fuzz-${randomUUID()}@fanlight.test`, role: 'viewer' }), table: 'invitations', as: () => lead },
    {
      name: 'set a target',
      method: 'POST',
      path: () => `/api/projects/${projectId}/targets`,
      valid: () => ({ track: freshTrack(), weighting: 'A', points: [[1000, 60], [3000, 66]], label: 'fuzz' }),
      table: 'targets',
      as: () => engineer,
    },
    {
      name: 'import targets',
      method: 'POST',
      path: () => `/api/projects/${projectId}/targets/import`,
      valid: () => {
        const track = freshTrack();
        return { csv: `track,rpm,db\n${track},1000,60\n${track},3000,66`, weighting: 'Z', replace: false };
      },
      table: 'targets',
      as: () => engineer,
    },
    { name: 'edit a target', method: 'PATCH', path: () => `/api/targets/${targetId}`, valid: () => ({ version: 1, label: 'edited', points: [[0, 61], [1000, 71]] }), table: 'targets', as: () => engineer },
    { name: 'edit a mark', method: 'PATCH', path: () => `/api/marks/${markId}`, valid: () => ({ version: 1, text: 'edited' }), table: 'marks', as: () => engineer },
    { name: 'rename a view', method: 'PATCH', path: () => `/api/views/${viewId}`, valid: () => ({ version: 1, title: 'renamed' }), table: 'views', as: () => engineer },
    {
      name: 'make an API token',
      method: 'POST',
      path: () => '/api/me/tokens',
      valid: () => ({ name: 'fuzz script', projectId, role: 'viewer', expiresInDays: 30 }),
      table: 'api_tokens',
      as: () => engineer,
    },
    {
      name: 'start a campaign',
      method: 'POST',
      path: () => `/api/projects/${projectId}/campaigns`,
      valid: () => ({ name: 'fuzz campaign', preset: { block: 8192, orders: [8, 48] }, total: 2, tags: { 'a.wav': { build: 'B1' } } }),
      table: 'campaigns',
      as: () => engineer,
    },
    {
      name: 'change a campaign',
      method: 'PATCH',
      path: () => `/api/projects/${projectId}/campaigns/${campaignId}`,
      valid: () => ({ name: 'renamed', total: 4, tags: { 'b.wav': { build: 'B2' } } }),
      table: 'campaigns',
      as: () => engineer,
    },
    ...(['session', 'token'] as const).map(
      (by): Target => ({
        name: `post a campaign result (${by})`,
        method: 'POST',
        path: () => `/api/projects/${projectId}/campaigns/${campaignId}/results`,
        valid: () => ({
          file: freshFile(),
          ok: true,
          inverter: { carrierShifts: [{ t: 14.3, rpm: 5997, fromHz: 8000, toHz: 12000 }], polePairs: { value: 4 }, strongestFamilies: [{ m: 1, n: 1, peakRms: 0.12, peakRpm: 11900 }] },
          tags: { build: 'B1' },
        }),
        table: 'campaign_results',
        as: () => engineer,
        bearer: by === 'token' ? () => engineerToken : undefined,
      }),
    ),
  ];

  for (const target of targets) {
    it(`${target.name}: spoiled and random bodies get the error shape and store nothing`, async () => {
      await fc.assert(
        fc.asyncProperty(fc.oneof(fc.tuple(fc.nat(), spoilers).map(([pick, value]) => spoil(target.valid(), pick, value)), fc.jsonValue({ maxDepth: 3 })), async (body) => {
          const before = await rows(t.db, target.table);
          const s = target.as();
          const req = target.bearer
            ? supertest(t.app)[target.method === 'POST' ? 'post' : 'patch'](target.path()).set('Authorization', `Bearer ${target.bearer()}`)
            : (target.method === 'POST' ? s.agent.post(target.path()) : s.agent.patch(target.path())).set('X-CSRF-Token', s.csrf);
          // sent as JSON text: a bare number or string is a JSON body too
          const res = await req.set('Content-Type', 'application/json').send(JSON.stringify(body));
          expect(res.status, JSON.stringify(res.body)).toBeLessThan(500);
          if (res.status >= 400) {
            expect(REFUSALS.has(res.status), `${res.status}`).toBe(true);
            expect(res.body.error).toMatchObject({ code: expect.any(String), message: expect.any(String) });
            expect(await rows(t.db, target.table)).toBe(before);
          }
        }),
        { numRuns: 30 },
      );
    }, 120_000);
  }

  it('refuses a 20 MB JSON body with 413 and the error shape', async () => {
    const before = await rows(t.db, 'marks');
    const huge = { kind: 'point', geometry: { x: 1, y: 1 }, text: 'x'.repeat(20 * 1024 * 1024) };
    const res = await engineer.request('POST', `/api/views/${viewId}/marks`, huge);
    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe('PAYLOAD_TOO_LARGE');
    expect(await rows(t.db, 'marks')).toBe(before);
  });

  it('refuses 1e308 in a mark, a 10 000-character text, and a view of another project; keeps unicode and emoji intact', async () => {
    const before = await rows(t.db, 'marks');
    expect((await engineer.request('POST', `/api/views/${viewId}/marks`, { kind: 'point', geometry: { x: 1e308, y: 1 } })).status).toBe(400);
    expect((await engineer.request('POST', `/api/views/${viewId}/marks`, { kind: 'point', geometry: { x: 1, y: 1 }, text: 'x'.repeat(10_000) })).status).toBe(400);
    const foreignView = await insertView(t.db, otherProjectId, (await makeUser(t.db, 'fuzz-other', 'staff')).id, 'Not yours');
    expect((await engineer.request('POST', `/api/views/${foreignView}/marks`, { kind: 'point', geometry: { x: 1, y: 1 } })).status).toBe(404);
    expect(await rows(t.db, 'marks')).toBe(before);
    const text = 'Träger 12 kHz ✓ — 载波 😀👍🏽 "quotes" \\\\ <b>';
    const ok = await engineer.request('POST', `/api/views/${viewId}/marks`, { kind: 'point', geometry: { x: 1, y: 1 }, text });
    expect(ok.status).toBe(201);
    expect(ok.body.mark.text).toBe(text);
    expect((await t.db('marks').where({ id: ok.body.mark.id }).first()).body).toBe(text);
  });
});
