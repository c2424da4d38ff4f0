import { afterAll, describe, expect, it } from 'vitest';
import { DEMO_VIEW_TITLE, demoMarks, demoThread } from '../../seeds/demo-view';
import { DEMO_PASSWORD, demoProject } from '../../seeds/demo-scenario';
import { seedDemo } from '../../seeds/index';
import { sessionFor } from '../support/actors';
import { startTestApp } from '../support/test-app';
import { testConfig } from '../support/test-db';

describe('demo seed', () => {
  const t = startTestApp();
  const db = t.db;
  afterAll(() => t.close());
  const demoDir = testConfig().demoRecordingsDir;

  it('changes nothing when it runs a second time, content included', async () => {
    const count = async () => ({
      users: (await db('users').count({ n: '*' }))[0].n,
      projects: (await db('projects').count({ n: '*' }))[0].n,
      members: (await db('project_members').count({ n: '*' }))[0].n,
      recordings: (await db('recordings').count({ n: '*' }))[0].n,
      views: (await db('views').count({ n: '*' }))[0].n,
      marks: (await db('marks').count({ n: '*' }))[0].n,
      comments: (await db('comments').count({ n: '*' }))[0].n,
      hashes: (await db('users').orderBy('id').pluck('password_hash')).join(','),
    });
    const before = await count();
    expect(await seedDemo(db, { demoDir })).toEqual({ usersCreated: 0, projectCreated: false, recordingsRegistered: 0, viewCreated: false });
    expect(await count()).toEqual(before);
  });

  it.each(['lead@fanlight.test', 'engineer@fanlight.test', 'viewer@fanlight.test'])(
    '%s sees the demo recordings, the demo view with its snapshot, marks and thread',
    async (email) => {
      const s = await sessionFor(t.app, email, DEMO_PASSWORD);
      const projects = (await s.request('GET', '/api/projects')).body.projects as { id: number; name: string }[];
      const project = projects.find((p) => p.name === demoProject.name)!;
      const recordings = (await s.request('GET', `/api/projects/${project.id}/recordings`)).body.recordings as { name: string }[];
      expect(recordings.map((r) => r.name).sort()).toEqual(['ca7-coast-down-spread-carrier.wav', 'ca7-run-up-30s-firmware-b.wav', 'ca7-run-up-30s.wav']);
      const views = (await s.request('GET', `/api/projects/${project.id}/views?q=carrier%20steps`)).body.views as { id: number; title: string }[];
      const view = views.find((v) => v.title === DEMO_VIEW_TITLE)!;
      expect(view).toBeDefined();
      const detail = (await s.request('GET', `/api/views/${view.id}`)).body.view;
      expect(detail.snapshot).toMatchObject({ height: 640 });
      expect(detail.state.carrierSchedule.map((c: { carrierHz: number }) => c.carrierHz)).toEqual([8000, 12000]);
      const snapshot = await s.agent.get(`/api/views/${view.id}/snapshot`).buffer(true);
      expect(snapshot.status).toBe(200);
      const marks = (await s.request('GET', `/api/views/${view.id}/marks`)).body.marks as { id: number; text: string }[];
      expect(marks.map((m) => m.text)).toEqual(demoMarks.map((m) => m.text));
      const thread = (await s.request('GET', `/api/marks/${marks[0].id}/comments`)).body.comments as { body: string }[];
      expect(thread.map((c) => c.body)).toEqual(demoThread.filter((c) => c.mark === 0).map((c) => c.body));
    },
  );
});
