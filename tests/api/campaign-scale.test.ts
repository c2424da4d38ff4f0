/**
 * A campaign of 10 000 files: the results table's page, sorted and searched, and the campaign list with
 * its counts answer quickly, and the database reads them through the campaign's indexes (EXPLAIN, as
 * MariaDB documents it: `key` names the index used, `type` ALL would be a full table scan).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { fileHash } from '../../server/repositories/campaign-result-repository';
import { makeProject, makeUser, sessionFor, type Session } from '../support/actors';
import { startTestApp } from '../support/test-app';

const t = startTestApp();
afterAll(() => t.close());

const FILES = 10_000;

describe('a campaign of 10 000 results', () => {
  let s: Session;
  let projectId: number;
  let campaignId: number;

  beforeAll(async () => {
    const e = await makeUser(t.db, 'scale-engineer', 'staff');
    projectId = await makeProject(t.db, [{ id: e.id, role: 'engineer' }]);
    s = await sessionFor(t.app, e.email);
    [campaignId] = await t.db('campaigns').insert({ project_id: projectId, name: 'scale', preset: '{}', tags: '{}', created_by: e.id });
    // a second campaign of the same size, so an index that ignored campaign_id would show
    const [otherId] = await t.db('campaigns').insert({ project_id: projectId, name: 'other', preset: '{}', tags: '{}', created_by: e.id });
    for (const id of [campaignId, otherId]) {
      for (let start = 0; start < FILES; start += 1000) {
        const rows = Array.from({ length: 1000 }, (_, k) => {
          const i = start + k;
          const file = `rig-${i % 7}/run-${String(i).padStart(5, '0')}.wav`;
          const ok = i % 50 !== 0;
          const peak = ok ? -30 + ((i * 37) % 200) / 10 : null;
          return {
            campaign_id: id,
            file,
            file_hash: fileHash(file),
            ok,
            error: ok ? null : `${file} has no tacho pulses.`,
            tags: '{}',
            summary: ok ? JSON.stringify({ carrierScheduleHz: [8000, 12000], shifts: [], spread: { spread: false, widthHz: null }, polePairs: 4, strongestFamilies: [{ m: 1, n: 1, peakDb: peak, peakRpm: 11900 }], overallDb: null }) : null,
            inverter: null,
            peak_db: peak,
          };
        });
        await t.db('campaign_results').insert(rows);
      }
    }
  }, 120_000);

  const timed = async (path: string) => {
    const t0 = performance.now();
    const res = await s.request('GET', path);
    const ms = performance.now() - t0;
    expect(res.status, JSON.stringify(res.body).slice(0, 300)).toBe(200);
    return { body: res.body, ms };
  };

  it('answers a page sorted by level, a search and the list with counts, each well under a second', async () => {
    const base = `/api/projects/${projectId}/campaigns`;
    const byLevel = await timed(`${base}/${campaignId}/results?sort=-peakDb&limit=100`);
    expect(byLevel.body.total).toBe(FILES);
    const levels = byLevel.body.results.map((r: { summary: { strongestFamilies: { peakDb: number }[] } }) => r.summary.strongestFamilies[0].peakDb);
    expect(levels).toEqual([...levels].sort((a, b) => b - a));
    const lastPage = await timed(`${base}/${campaignId}/results?sort=file&limit=500&offset=9500`);
    expect(lastPage.body.results).toHaveLength(500);
    const search = await timed(`${base}/${campaignId}/results?q=rig-3/&limit=100`);
    expect(search.body.total).toBe(Math.ceil((FILES - 3) / 7));
    const list = await timed(base);
    expect(list.body.campaigns.find((c: { id: number }) => c.id === campaignId)).toMatchObject({ done: FILES, failed: FILES / 50 });
    console.log(
      `campaign of ${FILES} results (beside another of ${FILES}): page by level ${byLevel.ms.toFixed(0)} ms, ` +
        `last page of 500 by file ${lastPage.ms.toFixed(0)} ms, search ${search.ms.toFixed(0)} ms, campaign list ${list.ms.toFixed(0)} ms`,
    );
    for (const ms of [byLevel.ms, lastPage.ms, search.ms, list.ms]) expect(ms).toBeLessThan(1000);
  }, 60_000);

  it('reads one campaign\'s results and counts through its indexes, not a scan of the table', async () => {
    type Plan = { table: string; type: string; key: string | null; rows: number | string };
    const explain = async (sql: string, bindings: number[]): Promise<Plan[]> => ((await t.db.raw(`EXPLAIN ${sql}`, bindings)) as [Plan[]])[0];
    const page = await explain('SELECT * FROM campaign_results WHERE campaign_id = ? ORDER BY peak_db IS NULL, peak_db DESC, id LIMIT 100', [campaignId]);
    const failed = await explain('SELECT COUNT(*) FROM campaign_results r WHERE r.campaign_id = ? AND r.ok = 0', [campaignId]);
    for (const plan of [...page, ...failed]) {
      expect(plan.type, JSON.stringify(plan)).not.toBe('ALL');
      expect(plan.key, JSON.stringify(plan)).not.toBeNull();
    }
    // MariaDB reports rows as a string
    expect(Number(failed[0].rows)).toBeLessThanOrEqual(FILES / 50 + 10);
  });
});
