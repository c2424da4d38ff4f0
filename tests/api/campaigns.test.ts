/**
 * Test campaigns over the API: started by engineers and leads, read by every member; each file's result
 * stored exactly once (a second post, also one sent at the same moment, answers the first); the summary
 * read from the inverter object; paging, sorting and searching the results; the 256 kB cap; archived
 * projects read-only. The inverter objects are `analyze inverter` output of the demo recordings
 * (tests/fixtures/campaigns), whose carrier schedule and pole pairs the demo synthesised.
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { makeProject, makeProjectTeam, type Session } from '../support/actors';
import { startTestApp } from '../support/test-app';

const t = startTestApp();
afterAll(() => t.close());

const RUN_UP = JSON.parse(readFileSync(path.join(__dirname, '../fixtures/campaigns/run-up-inverter.json'), 'utf8')) as Record<string, unknown>;
const PRESET = { channel: 0, cal: 10, tacho: 2, ppr: 60, quantity: 'acceleration', block: 8192 };

/** The run-up's strongest family scaled by `gain`: a result whose peak level differs by 20·log10(gain) dB. */
function runUpScaled(gain: number): Record<string, unknown> {
  const families = (RUN_UP.strongestFamilies as { peakRms: number }[]).map((f) => ({ ...f, peakRms: f.peakRms * gain }));
  return { ...RUN_UP, strongestFamilies: families };
}

const resultRows = (campaignId: number) => t.db('campaign_results').where({ campaign_id: campaignId }).count({ n: '*' }).then((r) => Number(r[0].n));

describe('test campaigns', () => {
  let projectId: number;
  let archivedId: number;
  let lead: Session;
  let engineer: Session;
  let viewer: Session;
  let outsider: Session;
  let engineerId: number;
  let campaignId: number;

  beforeAll(async () => {
    ({ projectId, archivedId, engineerId, lead, engineer, viewer, outsider } = await makeProjectTeam(t.db, t.app, 'c'));
  });

  const base = () => `/api/projects/${projectId}/campaigns`;
  const results = (id = campaignId) => `${base()}/${id}/results`;
  const post = (body: Record<string, unknown>, s = engineer, id = campaignId) => s.request('POST', results(id), body);

  it('engineers start a campaign with its preset, total and per-file tags; the activity says so', async () => {
    const tags = { 'b1/run-01.wav': { build: 'B1', load: 'full' }, 'b2/run-01.wav': { build: 'B2', load: 'full' } };
    const res = await engineer.request('POST', base(), { name: ' Firmware B sweep ', preset: PRESET, total: 3, tags });
    expect(res.status).toBe(201);
    expect(res.body.campaign).toMatchObject({ projectId, name: 'Firmware B sweep', preset: PRESET, total: 3, done: 0, failed: 0, tags, createdBy: { id: engineerId, name: 'Test c-engineer' } });
    campaignId = res.body.campaign.id;
    const activity = await engineer.request('GET', `/api/projects/${projectId}/activity`);
    expect(activity.body.activity).toEqual(
      expect.arrayContaining([expect.objectContaining({ verb: 'started', objectType: 'campaign', summary: 'started the campaign "Firmware B sweep" over 3 files' })]),
    );
    expect((await lead.request('POST', base(), { name: 'lead run', preset: {} })).body.campaign.total).toBeNull();
  });

  it('viewers read but do not start or change; outsiders do not see the project', async () => {
    expect((await viewer.request('GET', base())).status).toBe(200);
    expect((await viewer.request('GET', `${base()}/${campaignId}`)).status).toBe(200);
    expect((await viewer.request('POST', base(), { name: 'x', preset: {} })).status).toBe(403);
    expect((await viewer.request('PATCH', `${base()}/${campaignId}`, { name: 'x' })).status).toBe(403);
    expect((await post({ file: 'x.wav', ok: false, error: 'e' }, viewer)).status).toBe(403);
    expect((await outsider.request('GET', base())).status).toBe(404);
    expect((await outsider.request('GET', results())).status).toBe(404);
  });

  it('stores a file\'s result once: the second post answers 200 with the first, and stores nothing', async () => {
    const first = await post({ file: 'b1/run-01.wav', ok: true, inverter: RUN_UP, tags: { operator: 'night shift' } });
    expect(first.status).toBe(201);
    const r = first.body.result;
    // tags: the campaign's for the file, the result's own on top
    expect(r).toMatchObject({ file: 'b1/run-01.wav', ok: true, error: null, tags: { build: 'B1', load: 'full', operator: 'night shift' } });
    // the demo run-up was synthesised with an 8 kHz carrier switching to 12 kHz at 6000 rpm, 4 pole pairs
    expect(r.summary.carrierScheduleHz).toEqual([8000, 12000]);
    expect(r.summary.polePairs).toBe(4);
    expect(r.inverter).toEqual(RUN_UP);

    const again = await post({ file: 'b1/run-01.wav', ok: false, error: 'a retry that went wrong' });
    expect(again.status).toBe(200);
    expect(again.body.result).toEqual(r);
    expect(await resultRows(campaignId)).toBe(1);
  });

  it('settles five posts of one file sent at once to one stored result', async () => {
    const answers = await Promise.all(Array.from({ length: 5 }, (_, i) => post({ file: 'b2/run-01.wav', ok: true, inverter: runUpScaled(1 + i / 10) })));
    expect(answers.map((a) => a.status).sort()).toEqual([200, 200, 200, 200, 201]);
    expect(new Set(answers.map((a) => a.body.result.id)).size).toBe(1);
    expect(await t.db('campaign_results').where({ campaign_id: campaignId, file: 'b2/run-01.wav' }).count({ n: '*' })).toEqual([{ n: 1 }]);
  });

  it('counts failures, keeps their one-sentence error and gives them no summary', async () => {
    const res = await post({ file: 'b3/short.wav', ok: false, error: 'b3/short.wav is too short for blocks of 8192: it gives 3 frames; use a smaller --block.' });
    expect(res.status).toBe(201);
    expect(res.body.result).toMatchObject({ ok: false, summary: null, inverter: null, tags: {} });
    const list = await viewer.request('GET', base());
    expect(list.body.campaigns.find((c: { id: number }) => c.id === campaignId)).toMatchObject({ total: 3, done: 3, failed: 1 });
    expect(list.body.campaigns[0]).not.toHaveProperty('tags');
  });

  it('refuses an inverter object over 256 kB with 413 and stores nothing', async () => {
    const before = await resultRows(campaignId);
    const families = Array.from({ length: 6 }, () => ({ rms: Array.from({ length: 5000 }, (_, i) => 0.001 * (i + 1) + 1e-9) }));
    const res = await post({ file: 'huge.wav', ok: true, inverter: { ...RUN_UP, families } });
    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe('PAYLOAD_TOO_LARGE');
    expect(res.body.error.message).toMatch(/huge\.wav.*256 kB/);
    expect(await resultRows(campaignId)).toBe(before);
  });

  describe('the results table', () => {
    let tableId: number;
    const gains = [1, 0.5, 2, 0.25, 4, 1.5, 3];

    beforeAll(async () => {
      const made = await engineer.request('POST', base(), { name: 'table', preset: PRESET, total: gains.length + 1 });
      tableId = made.body.campaign.id;
      for (const [i, g] of gains.entries()) expect((await post({ file: `runs/run-${i + 1}.wav`, ok: true, inverter: runUpScaled(g) }, engineer, tableId)).status).toBe(201);
      await post({ file: 'runs/broken_100%.wav', ok: false, error: 'no tacho pulses on channel 2' }, engineer, tableId);
    });

    const page = async (query: string) => {
      const res = await viewer.request('GET', `${results(tableId)}?${query}`);
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      return res.body as { results: { file: string; summary: { strongestFamilies: { peakDb: number }[] } | null }[]; total: number };
    };

    it('sorts by the strongest family\'s level, loudest first, failures last', async () => {
      const { results: rows, total } = await page('sort=-peakDb');
      expect(total).toBe(8);
      const order = [...gains.keys()].sort((a, b) => gains[b] - gains[a]).map((i) => `runs/run-${i + 1}.wav`);
      expect(rows.map((r) => r.file)).toEqual([...order, 'runs/broken_100%.wav']);
      // a gain of 4 against 0.25 is 20·log10(16) = 24.08 dB apart
      const levels = rows.slice(0, gains.length).map((r) => r.summary!.strongestFamilies[0].peakDb);
      expect(levels[0] - levels[levels.length - 1]).toBeCloseTo(24.08, 1);
    });

    it('pages with limit and offset, the total counting every page', async () => {
      const a = await page('sort=file&limit=3&offset=0');
      const b = await page('sort=file&limit=3&offset=3');
      expect(a.total).toBe(8);
      expect(a.results.map((r) => r.file)).toEqual(['runs/broken_100%.wav', 'runs/run-1.wav', 'runs/run-2.wav']);
      expect(b.results.map((r) => r.file)).toEqual(['runs/run-3.wav', 'runs/run-4.wav', 'runs/run-5.wav']);
      expect((await page('limit=5000')).results).toHaveLength(8); // capped at 500, so all 8 here
    });

    it('searches file names and errors, with LIKE\'s own characters taken literally', async () => {
      expect((await page('q=run-1')).results.map((r) => r.file)).toEqual(['runs/run-1.wav']);
      expect((await page('q=tacho')).total).toBe(1);
      expect((await page('q=100%25')).results.map((r) => r.file)).toEqual(['runs/broken_100%.wav']);
      expect((await page('q=_')).total).toBe(1);
      expect((await page('sort=ok')).results[0].file).toBe('runs/broken_100%.wav');
    });

    it('searches tag values too, the campaign\'s (from tags.csv) and the result\'s own, not tag names', async () => {
      const made = await engineer.request('POST', base(), { name: 'tagged', preset: PRESET, total: 3, tags: { 'tagged/a.wav': { build: 'B7' }, 'tagged/b.wav': { build: 'B8' } } });
      const id = made.body.campaign.id;
      await post({ file: 'tagged/a.wav', ok: false, error: 'cut short' }, engineer, id);
      await post({ file: 'tagged/b.wav', ok: false, error: 'cut short' }, engineer, id);
      await post({ file: 'tagged/c.wav', ok: false, error: 'cut short', tags: { firmware: 'fw-B7x' } }, engineer, id);
      const search = async (q: string) => ((await viewer.request('GET', `${results(id)}?sort=file&q=${encodeURIComponent(q)}`)).body as { results: { file: string }[] }).results.map((r) => r.file);
      expect(await search('b7')).toEqual(['tagged/a.wav', 'tagged/c.wav']);
      expect(await search('B8')).toEqual(['tagged/b.wav']);
      expect(await search('firmware')).toEqual([]);
    });

    it('refuses a bad query with 400 naming the parameter', async () => {
      for (const [query, field] of [['sort=loudest', 'sort'], ['limit=0', 'limit'], ['offset=-1', 'offset'], ['limit=ten', 'limit']]) {
        const res = await viewer.request('GET', `${results(tableId)}?${query}`);
        expect(res.status, query).toBe(400);
        expect(res.body.error.fields).toHaveProperty(field);
      }
    });
  });

  it('changes name, total and tags; the tags then show on the results', async () => {
    const res = await lead.request('PATCH', `${base()}/${campaignId}`, { name: 'Firmware B sweep (all)', total: 4, tags: { 'b3/short.wav': { build: 'B3' } } });
    expect(res.status).toBe(200);
    expect(res.body.campaign).toMatchObject({ name: 'Firmware B sweep (all)', total: 4, tags: { 'b3/short.wav': { build: 'B3' } } });
    const page = await viewer.request('GET', `${results()}?q=short`);
    expect(page.body.results[0].tags).toEqual({ build: 'B3' });
    expect((await lead.request('PATCH', `${base()}/${campaignId}`, {})).status).toBe(400);
  });

  it('answers 404 for a campaign of another project, or one that does not exist', async () => {
    const otherProject = await makeProject(t.db, [{ id: engineerId, role: 'engineer' }]);
    const other = await engineer.request('POST', `/api/projects/${otherProject}/campaigns`, { name: 'elsewhere', preset: {} });
    const foreign = other.body.campaign.id;
    expect((await engineer.request('GET', `${base()}/${foreign}`)).status).toBe(404);
    expect((await post({ file: 'a.wav', ok: false, error: 'x' }, engineer, foreign)).status).toBe(404);
    expect(await resultRows(foreign)).toBe(0);
    expect((await engineer.request('GET', `${base()}/999999999`)).status).toBe(404);
    expect((await engineer.request('GET', `${base()}/abc`)).status).toBe(404);
  });

  it('keeps an archived project\'s campaigns read-only (409)', async () => {
    const made = await engineer.request('POST', `/api/projects/${archivedId}/campaigns`, { name: 'before archiving', preset: {} });
    expect(made.status).toBe(201);
    await t.db('projects').where({ id: archivedId }).update({ archived_at: new Date() });
    const path = `/api/projects/${archivedId}/campaigns/${made.body.campaign.id}`;
    expect((await engineer.request('POST', `${path}/results`, { file: 'a.wav', ok: false, error: 'x' })).status).toBe(409);
    expect((await engineer.request('POST', `/api/projects/${archivedId}/campaigns`, { name: 'after', preset: {} })).status).toBe(409);
    expect((await viewer.request('GET', `${path}/results`)).status).toBe(200);
  });

  it('refuses bad bodies naming the field', async () => {
    const cases: [Record<string, unknown>, string][] = [
      [{ name: '', preset: {} }, 'name'],
      [{ name: 'x', preset: [] }, 'preset'],
      [{ name: 'x', preset: {}, total: -1 }, 'total'],
      [{ name: 'x', preset: {}, tags: { 'a.wav': { build: 2 } } }, 'tags.a.wav.build'],
      [{ name: 'x', preset: { blob: 'x'.repeat(70_000) } }, 'preset'],
    ];
    for (const [body, field] of cases) {
      const res = await engineer.request('POST', base(), body);
      expect(res.status, field).toBe(400);
      expect(res.body.error.fields, field).toHaveProperty([field]);
    }
    const bad = await post({ file: '', ok: 'yes' });
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields).sort()).toEqual(['file', 'ok']);
  });
});
