import { afterAll, describe, expect, it } from 'vitest';
import { DEMO_CAMPAIGN_NAME } from '../../seeds/demo-campaign';
import { DEMO_COMPARISON_TITLE, FIRMWARE_B_FILE } from '../../seeds/demo-comparison';
import { DEMO_VIEW_TITLE, RUN_UP_FILE, demoMarks, demoThread } from '../../seeds/demo-view';
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
      campaignResults: (await db('campaign_results').count({ n: '*' }))[0].n,
      hashes: (await db('users').orderBy('id').pluck('password_hash')).join(','),
    });
    const before = await count();
    expect(await seedDemo(db, { demoDir })).toEqual({ usersCreated: 0, projectCreated: false, recordingsRegistered: 0, viewCreated: false, comparisonCreated: false, campaignCreated: false });
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

  it.each(['lead@fanlight.test', 'engineer@fanlight.test', 'viewer@fanlight.test'])(
    '%s reads the saved comparison of the two firmware run-ups, one of its kind after two seeds',
    async (email) => {
      expect(await seedDemo(db, { demoDir })).toMatchObject({ viewCreated: false, comparisonCreated: false });
      const s = await sessionFor(t.app, email, DEMO_PASSWORD);
      const projects = (await s.request('GET', '/api/projects')).body.projects as { id: number; name: string }[];
      const project = projects.find((p) => p.name === demoProject.name)!;
      const views = (await s.request('GET', `/api/projects/${project.id}/views?q=firmware`)).body.views as { id: number; title: string; hasSnapshot: boolean }[];
      const found = views.filter((v) => v.title === DEMO_COMPARISON_TITLE);
      expect(found).toHaveLength(1);
      expect(found[0].hasSnapshot).toBe(true);
      const detail = (await s.request('GET', `/api/views/${found[0].id}`)).body.view;
      const c = detail.state.comparison;
      expect(c.runs.map((r: { name: string }) => r.name)).toEqual([RUN_UP_FILE, FIRMWARE_B_FILE]);
      expect(c.track.guide).toEqual({ kind: 'family', m: 1, n: -1 });
      expect(c.levels).toHaveLength(2);
      const of = (run: string) => c.exceedances.filter((e: { run: string }) => e.run === run);
      expect(of(RUN_UP_FILE).length).toBeGreaterThan(0);
      expect(of(FIRMWARE_B_FILE)).toEqual([]);
      const marks = (await s.request('GET', `/api/views/${found[0].id}/marks`)).body.marks as { id: number; text: string }[];
      expect(marks.length).toBeGreaterThanOrEqual(1);
      const replies = await Promise.all(marks.map(async (m) => (await s.request('GET', `/api/marks/${m.id}/comments`)).body.comments as { body: string }[]));
      expect(replies.flat().length).toBeGreaterThanOrEqual(2);
    },
  );

  it('has a demo campaign of twelve invented run-ups over three builds: one failed, build B1 loudest, B3 spread', async () => {
    const s = await sessionFor(t.app, 'viewer@fanlight.test', DEMO_PASSWORD);
    const project = ((await s.request('GET', '/api/projects')).body.projects as { id: number; name: string }[]).find((p) => p.name === demoProject.name)!;
    const campaigns = (await s.request('GET', `/api/projects/${project.id}/campaigns`)).body.campaigns as { id: number; name: string; total: number; done: number; failed: number }[];
    const campaign = campaigns.find((c) => c.name === DEMO_CAMPAIGN_NAME)!;
    expect(campaign).toMatchObject({ total: 12, done: 12, failed: 1 });
    const page = (await s.request('GET', `/api/projects/${project.id}/campaigns/${campaign.id}/results?sort=-peakDb`)).body;
    const rows = page.results as { file: string; ok: boolean; tags: { build: string }; summary: { spread: { spread: boolean }; carrierScheduleHz: number[] } | null }[];
    expect(page.total).toBe(12);
    // the builds were invented with first sidebands of 0.125, 0.062 and 0.041 g (±7.5 %): they sort by build
    expect(rows.slice(0, 11).map((r) => r.tags.build)).toEqual(['B1', 'B1', 'B1', 'B1', 'B2', 'B2', 'B2', 'B2', 'B3', 'B3', 'B3']);
    expect(rows[11]).toMatchObject({ ok: false, summary: null, tags: { build: 'B3' } });
    expect(rows[0].summary!.carrierScheduleHz).toEqual([8000, 12000]);
    expect(rows[10].summary!.spread.spread).toBe(true);
  });
});
