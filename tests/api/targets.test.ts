/**
 * A project's targets (limit curves against speed): make, read, change, remove and import from CSV; the
 * roles; the version check; a bad file stores nothing and names the line and field of each fault.
 */
import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { makeProject, makeProjectTeam, type Session } from '../support/actors';
import { startTestApp } from '../support/test-app';

const t = startTestApp();
afterAll(() => t.close());

const RUN_UP = [
  [1000, 60],
  [2000, 70],
  [4000, 66],
];

/** The project's targets as stored, to show that a refused request changed nothing. */
const stored = (projectId: number) => t.db('targets').where({ project_id: projectId }).orderBy('id').select('id', 'track', 'weighting', 'points', 'label', 'version');

describe('project targets', () => {
  let projectId: number;
  let archivedId: number;
  let engineerId: number;
  let lead: Session;
  let engineer: Session;
  let viewer: Session;
  let outsider: Session;

  beforeAll(async () => {
    ({ projectId, archivedId, engineerId, lead, engineer, viewer, outsider } = await makeProjectTeam(t.db, t.app, 't'));
  });

  const create = (s: Session, body: unknown, project = projectId) => s.request('POST', `/api/projects/${project}/targets`, body);
  const list = async (s: Session, project = projectId) => {
    const res = await s.request('GET', `/api/projects/${project}/targets`);
    expect(res.status).toBe(200);
    return res.body.targets as { id: number; track: string; weighting: string; points: number[][]; label: string | null; version: number }[];
  };
  const importCsv = (s: Session, body: unknown, project = projectId) => s.request('POST', `/api/projects/${project}/targets/import`, body);

  describe('one at a time', () => {
    let orderA: number;

    it('engineers and leads make targets, the track written in one form', async () => {
      const res = await create(engineer, { track: ' Order:48.0 ', weighting: 'A', points: RUN_UP, label: ' e-motor whine ' });
      expect(res.status).toBe(201);
      expect(res.body.target).toMatchObject({
        projectId,
        track: 'order:48',
        weighting: 'A',
        points: RUN_UP,
        label: 'e-motor whine',
        version: 1,
        createdBy: { id: engineerId, name: 'Test t-engineer' },
      });
      expect(Date.parse(res.body.target.createdAt)).not.toBeNaN();
      orderA = res.body.target.id;

      const z = await create(lead, { track: 'order:48', weighting: 'Z', points: RUN_UP });
      expect(z.status).toBe(201);
      expect(z.body.target.label).toBeNull();
      expect((await create(lead, { track: 'family:1:+2', weighting: 'A', points: RUN_UP, label: '' })).body.target).toMatchObject({ track: 'family:1:2', label: null });
      expect((await create(engineer, { track: 'overall', weighting: 'A', points: [[0, 80], [6000, 92]] })).status).toBe(201);
      expect((await create(engineer, { track: 'order:8', weighting: 'A', points: RUN_UP })).status).toBe(201);
    });

    it('refuses a second target of the same track and weighting with 409', async () => {
      const before = await stored(projectId);
      const res = await create(lead, { track: 'ORDER:48', weighting: 'A', points: [[0, 1], [1, 2]] });
      expect(res.status).toBe(409);
      expect(res.body.error).toMatchObject({ code: 'CONFLICT', fields: { track: expect.stringMatching(/order:48/) } });
      expect(res.body.error.message).toMatch(/order:48 \(A-weighted\)/);
      expect(await stored(projectId)).toEqual(before);
    });

    it('lets every member read them: overall, then orders by number, then families; A before Z', async () => {
      const targets = await list(viewer);
      expect(targets.map((x) => `${x.track} ${x.weighting}`)).toEqual(['overall A', 'order:8 A', 'order:48 A', 'order:48 Z', 'family:1:2 A']);
      expect(targets[2].points).toEqual(RUN_UP);
    });

    it('hides the project from outsiders (404) and keeps viewers from writing (403)', async () => {
      expect((await outsider.request('GET', `/api/projects/${projectId}/targets`)).status).toBe(404);
      expect((await create(outsider, { track: 'order:2', weighting: 'A', points: RUN_UP })).status).toBe(404);
      expect((await outsider.request('PATCH', `/api/targets/${orderA}`, { version: 1, label: 'x' })).status).toBe(404);
      expect((await outsider.request('DELETE', `/api/targets/${orderA}`)).status).toBe(404);

      const before = await stored(projectId);
      const made = await create(viewer, { track: 'order:2', weighting: 'A', points: RUN_UP });
      expect(made.status).toBe(403);
      expect(made.body.error).toMatchObject({ code: 'FORBIDDEN', message: expect.stringMatching(/engineers and leads/) });
      expect((await viewer.request('PATCH', `/api/targets/${orderA}`, { version: 1, label: 'x' })).status).toBe(403);
      expect((await viewer.request('DELETE', `/api/targets/${orderA}`)).status).toBe(403);
      expect((await importCsv(viewer, { csv: 'track,rpm,db\norder:2,0,1\norder:2,1,2', weighting: 'A' })).status).toBe(403);
      expect(await stored(projectId)).toEqual(before);
    });

    it('checks the body, naming each bad field', async () => {
      const falling = await create(engineer, { track: 'order:3', weighting: 'A', points: [[1000, 60], [3000, 62], [2000, 64]] });
      expect(falling.status).toBe(400);
      expect(falling.body.error.code).toBe('VALIDATION_FAILED');
      expect(falling.body.error.fields).toEqual({ 'points.2': 'The speeds must rise from point to point: point 3 (2000 rpm) does not lie above point 2 (3000 rpm).' });

      const same = await create(engineer, { track: 'order:3', weighting: 'A', points: [[1000, 60], [1000, 62]] });
      expect(same.body.error.fields['points.1']).toMatch(/rise/);

      const bad = await create(engineer, { track: 'order:0', weighting: 'C', points: [[1000, 60]], label: 'x'.repeat(121) });
      expect(bad.status).toBe(400);
      expect(Object.keys(bad.body.error.fields).sort()).toEqual(['label', 'points', 'track', 'weighting']);
      expect(bad.body.error.fields.points).toMatch(/at least two/);
      expect(bad.body.error.fields.track).toMatch(/order:K/);

      const tooMany = await create(engineer, { track: 'order:3', weighting: 'A', points: Array.from({ length: 501 }, (_, i) => [i, 60]) });
      expect(tooMany.body.error.fields.points).toMatch(/at most 500/);

      const notPairs = await create(engineer, { track: 'order:3', weighting: 'A', points: [[1000, 60], [-1, 62], [3000]] });
      expect(Object.keys(notPairs.body.error.fields).sort()).toEqual(['points.1.0', 'points.2']);
      expect(await t.db('targets').where({ project_id: projectId, track: 'order:3' }).count({ n: '*' })).toEqual([{ n: 0 }]);
    });

    it('changes a target only from the version last read (409 with the current target otherwise)', async () => {
      const first = await engineer.request('PATCH', `/api/targets/${orderA}`, { version: 1, points: [[1000, 58], [4000, 64]] });
      expect(first.status).toBe(200);
      expect(first.body.target).toMatchObject({ id: orderA, version: 2, points: [[1000, 58], [4000, 64]], label: 'e-motor whine' });

      const stale = await lead.request('PATCH', `/api/targets/${orderA}`, { version: 1, label: 'late edit' });
      expect(stale.status).toBe(409);
      expect(stale.body.error).toMatchObject({ code: 'CONFLICT', fields: { version: expect.any(String) } });
      expect(stale.body.current).toMatchObject({ id: orderA, version: 2, label: 'e-motor whine' });

      const relabel = await lead.request('PATCH', `/api/targets/${orderA}`, { version: 2, label: null });
      expect(relabel.body.target).toMatchObject({ version: 3, label: null });

      // onto a track and weighting the project has already
      const clash = await lead.request('PATCH', `/api/targets/${orderA}`, { version: 3, weighting: 'Z' });
      expect(clash.status).toBe(409);
      expect(clash.body.error.fields.track).toMatch(/order:48/);
      const moved = await lead.request('PATCH', `/api/targets/${orderA}`, { version: 3, track: 'order:96' });
      expect(moved.body.target).toMatchObject({ track: 'order:96', weighting: 'A', version: 4 });

      const nothing = await lead.request('PATCH', `/api/targets/${orderA}`, { version: 4 });
      expect(nothing.status).toBe(400);
      expect(nothing.body.error.fields.points).toMatch(/Change/);
      const noVersion = await lead.request('PATCH', `/api/targets/${orderA}`, { label: 'x' });
      expect(noVersion.body.error.fields.version).toMatch(/version/);
      expect((await lead.request('PATCH', '/api/targets/999999999', { version: 1, label: 'x' })).status).toBe(404);
      expect((await lead.request('PATCH', '/api/targets/not-an-id', { version: 1, label: 'x' })).status).toBe(404);
    });

    it('removes a target (engineer or lead)', async () => {
      expect((await engineer.request('DELETE', `/api/targets/${orderA}`)).status).toBe(204);
      expect((await list(viewer)).some((x) => x.id === orderA)).toBe(false);
      const again = await engineer.request('DELETE', `/api/targets/${orderA}`);
      expect(again.status).toBe(404);
      expect(again.body.error).toEqual({ code: 'NOT_FOUND', message: 'Target not found.' });
    });

    it('honours an Idempotency-Key: the same create twice stores one target', async () => {
      const key = randomUUID();
      const send = () =>
        engineer.agent
          .post(`/api/projects/${projectId}/targets`)
          .set('X-CSRF-Token', engineer.csrf)
          .set('Idempotency-Key', key)
          .send({ track: 'order:72', weighting: 'Z', points: RUN_UP });
      const first = await send();
      const second = await send();
      expect(first.status).toBe(201);
      expect(second.status).toBe(201);
      expect(second.headers['idempotent-replayed']).toBe('true');
      expect(second.body).toEqual(first.body);
      expect(await t.db('targets').where({ project_id: projectId, track: 'order:72' }).count({ n: '*' })).toEqual([{ n: 1 }]);
    });
  });

  describe('import from CSV', () => {
    it('stores the file’s targets and replaces the points of those it has already, in one answer', async () => {
      const before = (await list(viewer)).find((x) => x.track === 'order:8' && x.weighting === 'A')!;
      const csv = ['track,rpm,db', 'order:8,500,50', 'order:24,1000,55', 'order:8,5000,62', 'order:24,6000,61', 'family:2:-1,1000,40', 'family:2:-1,6000,48'].join('\n');
      const res = await importCsv(engineer, { csv, weighting: 'A' });
      expect(res.status).toBe(200);
      expect(res.body).toMatchObject({ created: 2, updated: 1, removed: 0 });
      const targets = res.body.targets as { id: number; track: string; weighting: string; points: number[][]; version: number }[];
      expect(targets.map((x) => `${x.track} ${x.weighting}`)).toEqual([
        'overall A',
        'order:8 A',
        'order:24 A',
        'order:48 Z',
        'order:72 Z',
        'family:1:2 A',
        'family:2:-1 A',
      ]);
      const order8 = targets.find((x) => x.track === 'order:8')!;
      expect(order8).toMatchObject({ id: before.id, version: before.version + 1, points: [[500, 50], [5000, 62]] });
      expect(targets.find((x) => x.track === 'order:24')).toMatchObject({ weighting: 'A', points: [[1000, 55], [6000, 61]], version: 1 });
      expect(await list(viewer)).toEqual(targets);
    });

    it('refuses a bad file with the line and field of each fault, and stores nothing', async () => {
      const before = await stored(projectId);
      const csv = ['track,rpm,db', 'order:8,500,40', 'order:8,fast,41', 'order:0,1000,42', 'order:8,6000,', 'overall,1000,70', 'overall,2000,71'].join('\n');
      const res = await importCsv(lead, { csv, weighting: 'A', replace: true });
      expect(res.status).toBe(400);
      expect(res.body.error).toEqual({
        code: 'VALIDATION_FAILED',
        message: 'The CSV has 4 problems; nothing was imported.',
        fields: {
          // its other rows are bad, so order:8 is left with one point
          'line 2: track': 'order:8 has one point; a target needs at least two.',
          'line 3: rpm': '"fast" is not a speed in rpm (0 or more).',
          'line 4: track': '"order:0" is not a track: write order:K, family:M:N or overall.',
          'line 5: db': '"" is not a level in dB.',
        },
      });

      const twice = await importCsv(lead, { csv: 'track,rpm,db\norder:8,500,40\norder:8,500,41', weighting: 'A' });
      expect(twice.body.error.fields).toEqual({ 'line 3: rpm': 'order:8 has two points at 500 rpm (lines 2 and 3).' });
      const header = await importCsv(lead, { csv: 'speed,level\n500,40', weighting: 'A' });
      expect(Object.keys(header.body.error.fields)).toEqual(['line 1: header']);
      const empty = await importCsv(lead, { csv: 'track,rpm,db\n', weighting: 'A' });
      expect(empty.body.error.fields).toEqual({ csv: 'The file has a header but no points.' });
      const noCsv = await importCsv(lead, { weighting: 'C' });
      expect(Object.keys(noCsv.body.error.fields).sort()).toEqual(['csv', 'weighting']);
      expect(await stored(projectId)).toEqual(before);
    });

    it('with replace, makes the targets of that weighting exactly those of the file and leaves the other weighting', async () => {
      const zBefore = (await list(viewer)).filter((x) => x.weighting === 'Z');
      const aBefore = (await list(viewer)).filter((x) => x.weighting === 'A');
      const res = await importCsv(lead, { csv: 'track;rpm;db\norder:24;800;52\norder:24;7000;63\norder:36;800;45\norder:36;7000;50\n', weighting: 'A', replace: true });
      expect(res.status).toBe(200);
      expect(res.body).toMatchObject({ created: 1, updated: 1, removed: aBefore.length - 1 });
      const after = await list(viewer);
      expect(after.filter((x) => x.weighting === 'A').map((x) => x.track)).toEqual(['order:24', 'order:36']);
      expect(after.filter((x) => x.weighting === 'Z')).toEqual(zBefore);
      // the target kept through the replace keeps its id
      expect(after.find((x) => x.track === 'order:24')!.id).toBe(aBefore.find((x) => x.track === 'order:24')!.id);
    });

    it('takes a file of nearly 200 kB (thousands of lines) and stores every target of it in one go', async () => {
      const bigProject = await makeProject(t.db, [{ id: engineerId, role: 'engineer' }]);
      const lines = ['track,rpm,db'];
      let tracks = 0;
      for (let k = 1; k <= 1000; k++) {
        const rows = Array.from({ length: 10 }, (_, i) => `order:${k},${1000 + i * 500},${(50 + i * 0.25).toFixed(2)}`);
        if ([...lines, ...rows].join('\n').length > 200_000) break;
        lines.push(...rows);
        tracks++;
      }
      const csv = lines.join('\n');
      expect(csv.length).toBeGreaterThan(190_000);
      const res = await importCsv(engineer, { csv, weighting: 'Z' }, bigProject);
      expect(res.status, JSON.stringify(res.body.error)).toBe(200);
      expect(res.body).toMatchObject({ created: tracks, updated: 0, removed: 0 });
      expect(res.body.targets).toHaveLength(tracks);
      expect(res.body.targets[0]).toMatchObject({ track: 'order:1', weighting: 'Z', points: [[1000, 50], [1500, 50.25], [2000, 50.5], [2500, 50.75], [3000, 51], [3500, 51.25], [4000, 51.5], [4500, 51.75], [5000, 52], [5500, 52.25]] });
    });

    it('refuses a CSV text beyond 200 kB', async () => {
      const res = await importCsv(lead, { csv: `track,rpm,db\n${'x'.repeat(200_001)}`, weighting: 'A' });
      expect(res.status).toBe(400);
      expect(res.body.error.fields.csv).toMatch(/200 kB/);
    });
  });

  describe('in an archived project', () => {
    let targetId: number;

    beforeAll(async () => {
      targetId = (await create(engineer, { track: 'order:48', weighting: 'A', points: RUN_UP }, archivedId)).body.target.id;
      await t.db('projects').where({ id: archivedId }).update({ archived_at: new Date() });
    });

    it('reads the targets but refuses every change with 409', async () => {
      expect((await list(viewer, archivedId)).map((x) => x.id)).toEqual([targetId]);
      const before = await stored(archivedId);
      const made = await create(engineer, { track: 'order:2', weighting: 'A', points: RUN_UP }, archivedId);
      expect(made.status).toBe(409);
      expect(made.body.error.message).toMatch(/archived/);
      expect((await engineer.request('PATCH', `/api/targets/${targetId}`, { version: 1, label: 'x' })).status).toBe(409);
      expect((await engineer.request('DELETE', `/api/targets/${targetId}`)).status).toBe(409);
      expect((await importCsv(lead, { csv: 'track,rpm,db\norder:2,0,1\norder:2,1,2', weighting: 'A' }, archivedId)).status).toBe(409);
      expect(await stored(archivedId)).toEqual(before);
    });
  });
});
