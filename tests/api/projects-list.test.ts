import { afterAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD, demoProject } from '../../seeds/demo-scenario';
import { startTestApp } from '../support/test-app';

describe('GET /api/projects', () => {
  const t = startTestApp();
  afterAll(() => t.close());

  it.each([
    ['lead@fanlight.test', 'lead'],
    ['engineer@fanlight.test', 'engineer'],
    ['viewer@fanlight.test', 'viewer'],
  ])('lists the demo project for %s with the role %s', async (email, role) => {
    const agent = t.agent();
    await agent.post('/api/auth/signin').send({ email, password: DEMO_PASSWORD }).expect(200);
    const res = await agent.get('/api/projects');
    expect(res.status).toBe(200);
    const demo = res.body.projects.find((p: { name: string }) => p.name === demoProject.name);
    // the seeded content: two demo recordings and the finished view (seeds/demo-content.ts)
    expect(demo).toMatchObject({ role, memberCount: 3, archived: false });
    expect(demo.recordingCount).toBeGreaterThanOrEqual(2);
    expect(demo.viewCount).toBeGreaterThanOrEqual(1);
  });

  it('answers 401 without a session', async () => {
    const res = await t.agent().get('/api/projects');
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('UNAUTHENTICATED');
  });
});
