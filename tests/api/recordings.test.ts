import { afterAll, describe, expect, it } from 'vitest';
import { randomBytes } from 'node:crypto';
import { makeProject, makeUser, sessionFor } from '../support/actors';
import { startTestApp } from '../support/test-app';

describe('recording metadata', () => {
  const t = startTestApp();
  afterAll(() => t.close());

  const body = (fingerprint: string, name = 'coast-down.wav') => ({
    name,
    fingerprint,
    format: 'wav',
    sampleRateHz: 51200,
    durationS: 60,
    channels: [
      { index: 0, name: 'acc', quantity: 'acceleration', unit: 'g', calibration: { kind: 'sensitivity', sensitivityMvPerUnit: 100, inputRangeV: 10 } },
      { index: 1, name: 'mic', quantity: 'sound-pressure', unit: 'Pa', calibration: { kind: 'scale', factor: 31.6 } },
    ],
  });

  it('Can register metadata as engineer, and registering again updates it (200) instead of doubling it', async () => {
    const engineer = await makeUser(t.db, 'rec-engineer', 'staff');
    const viewer = await makeUser(t.db, 'rec-viewer', 'guest');
    const projectId = await makeProject(t.db, [
      { id: engineer.id, role: 'engineer' },
      { id: viewer.id, role: 'viewer' },
    ]);
    const s = await sessionFor(t.app, engineer.email);
    const fp = randomBytes(32).toString('hex');
    const first = await s.request('POST', `/api/projects/${projectId}/recordings`, body(fp));
    expect(first.status).toBe(201);
    expect(first.body.recording).toMatchObject({ fingerprint: fp, format: 'wav', sampleRateHz: 51200, durationS: 60 });
    expect(first.body.recording.channels[0].calibration).toEqual({ kind: 'sensitivity', sensitivityMvPerUnit: 100, inputRangeV: 10 });
    const again = await s.request('POST', `/api/projects/${projectId}/recordings`, body(fp, 'renamed.wav'));
    expect(again.status).toBe(200);
    const v = await sessionFor(t.app, viewer.email);
    const list = await v.request('GET', `/api/projects/${projectId}/recordings`);
    expect(list.body.recordings.map((r: { name: string }) => r.name)).toEqual(['renamed.wav']);
    expect((await v.request('POST', `/api/projects/${projectId}/recordings`, body(randomBytes(32).toString('hex')))).status).toBe(403);
    const projects = await s.request('GET', '/api/projects');
    expect(projects.body.projects.find((p: { id: number }) => p.id === projectId).recordingCount).toBe(1);
  });

  it('Errors naming the bad fields, and stores no samples (there is no field for them)', async () => {
    const engineer = await makeUser(t.db, 'rec-bad', 'staff');
    const projectId = await makeProject(t.db, [{ id: engineer.id, role: 'engineer' }]);
    const s = await sessionFor(t.app, engineer.email);
    const res = await s.request('POST', `/api/projects/${projectId}/recordings`, {
      ...body('not-hex'),
      sampleRateHz: 0,
      channels: [{ index: 0, name: 'x', quantity: 'smell', unit: '', calibration: { kind: 'scale', factor: 0 } }],
    });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields).sort()).toEqual([
      'channels.0.calibration.factor',
      'channels.0.quantity',
      'fingerprint',
      'sampleRateHz',
    ]);
    expect(await t.db('recordings').where({ project_id: projectId }).count({ n: '*' })).toEqual([{ n: 0 }]);
  });
});
