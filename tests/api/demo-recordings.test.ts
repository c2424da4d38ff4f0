import { afterAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD } from '../../seeds/demo-scenario';
import { demoRecordings } from '../../seeds/demo-recordings';
import { sessionFor } from '../support/actors';
import { startTestApp } from '../support/test-app';

describe('demo recordings', () => {
  const t = startTestApp();
  afterAll(() => t.close());

  it('lists the synthesised recordings with their channel setup for a signed-in user', async () => {
    const s = await sessionFor(t.app, 'viewer@fanlight.test', DEMO_PASSWORD);
    const res = await s.request('GET', '/api/demo-recordings');
    expect(res.status).toBe(200);
    expect(res.body.recordings.map((r: { file: string }) => r.file)).toEqual(demoRecordings.map((r) => r.file));
    expect(res.body.recordings[0]).toMatchObject({ title: expect.any(String), sizeBytes: 13824044 });
    expect(res.body.recordings[0].channels.map((c: { quantity: string }) => c.quantity)).toEqual(['acceleration', 'sound-pressure', 'tacho']);
  });

  it('serves the files to signed-in users only, with byte ranges', async () => {
    const file = `/demo-recordings/${demoRecordings[0].file}`;
    const anonymous = await t.agent().get(file);
    expect(anonymous.status).toBe(401);
    expect(anonymous.body.error.code).toBe('UNAUTHENTICATED');
    const s = await sessionFor(t.app, 'engineer@fanlight.test', DEMO_PASSWORD);
    const head = await s.agent.get(file).set('Range', 'bytes=0-11').buffer(true).parse((res, cb) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => cb(null, Buffer.concat(chunks)));
    });
    expect(head.status).toBe(206);
    const body = head.body as Buffer;
    expect(body.length).toBe(12);
    expect(body.subarray(0, 4).toString('latin1')).toBe('RIFF');
    expect(body.subarray(8, 12).toString('latin1')).toBe('WAVE');
    // nothing outside the demo folder
    const escape = await s.agent.get('/demo-recordings/..%2F..%2Fpackage.json');
    expect([403, 404]).toContain(escape.status);
  });
});
