/**
 * The whole campaign path as a lead uses it: a personal token made on a session, `analyze campaign
 * --project --server --token` run as a separate process against this API on a loopback port, and the
 * project's campaign then holding one result per file (the carrier the run-up was made with, the broken
 * file as ok:false, the tags from tags.csv); a rerun posts nothing twice, and a revoked token stops the CLI.
 * The carriers are the generated run-ups' own (tests/support/campaign-run-ups.ts), known by construction.
 */
import { createServer, type Server } from 'node:http';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { makeProject, makeUser, sessionFor, type Session } from '../support/actors';
import { runAnalyze } from '../support/campaign-cli';
import { RUN_UP_PRESET, writeRunUp } from '../support/campaign-run-ups';
import { startTestApp } from '../support/test-app';

const t = startTestApp();
const dir = mkdtempSync(path.join(tmpdir(), 'fanlight-campaign-round-trip-'));
const data = path.join(dir, 'runs');
let server: Server;
let base = '';
let projectId: number;
let engineer: Session;

beforeAll(async () => {
  writeRunUp(path.join(data, 'b1.wav'), 4000);
  writeRunUp(path.join(data, 'b2.wav'), 6000);
  writeFileSync(path.join(data, 'broken.wav'), 'RIFF\x20\x00\x00\x00WAVEjunk\x04\x00\x00\x00abcd');
  writeFileSync(path.join(data, 'tags.csv'), 'file,build\nb1.wav,B1\nb2.wav,B2\nbroken.wav,B3\n');
  writeFileSync(path.join(dir, 'preset.json'), JSON.stringify(RUN_UP_PRESET));
  const e = await makeUser(t.db, 'rt-engineer', 'staff');
  projectId = await makeProject(t.db, [{ id: e.id, role: 'engineer' }]);
  engineer = await sessionFor(t.app, e.email);
  server = createServer(t.app);
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  base = `http://127.0.0.1:${(server.address() as { port: number }).port}`;
}, 60_000);
afterAll(async () => {
  await new Promise<void>((resolve) => server.close(() => resolve()));
  await t.close();
  rmSync(dir, { recursive: true, force: true });
});

const args = (token: string) => ['campaign', data, '--preset', path.join(dir, 'preset.json'), '--workers', '2', '--out', path.join(dir, 'results.jsonl'), '--name', 'builds B1–B3', '--project', String(projectId), '--server', base, '--token', token];

describe('a campaign registered with its project through a personal token', () => {
  let secret = '';
  let tokenId = 0;

  it('lands every file once in the project, with its carrier, its tags, and the broken file as a failure', async () => {
    const made = await engineer.request('POST', '/api/me/tokens', { name: 'campaign rig', projectId, role: 'engineer', expiresInDays: 7 });
    expect(made.status).toBe(201);
    secret = made.body.secret;
    tokenId = made.body.token.id;

    const run = await runAnalyze(args(secret));
    expect(run.code, run.stderr).toBe(0);
    expect(JSON.parse(run.stdout)).toMatchObject({ files: 3, ok: 2, failed: 1 });

    const list = await engineer.request('GET', `/api/projects/${projectId}/campaigns`);
    expect(list.status).toBe(200);
    expect(list.body.campaigns).toHaveLength(1);
    const campaign = list.body.campaigns[0];
    expect(campaign).toMatchObject({ name: 'builds B1–B3', total: 3, done: 3, failed: 1, preset: RUN_UP_PRESET });

    const results = await engineer.request('GET', `/api/projects/${projectId}/campaigns/${campaign.id}/results?sort=file`);
    expect(results.body.total).toBe(3);
    const byFile = new Map<string, { ok: boolean; error: string | null; tags: Record<string, string>; summary: { carrierScheduleHz: number[] } }>(
      results.body.results.map((r: { file: string }) => [path.basename(r.file), r]),
    );
    expect(byFile.get('broken.wav')).toMatchObject({ ok: false });
    expect(byFile.get('broken.wav')!.error).toMatch(/\S/);
    for (const [file, hz, build] of [['b1.wav', 4000, 'B1'], ['b2.wav', 6000, 'B2']] as const) {
      const r = byFile.get(file)!;
      expect(r.ok).toBe(true);
      expect(r.tags).toMatchObject({ build });
      expect(r.summary.carrierScheduleHz.some((c) => Math.abs(c - hz) <= 50)).toBe(true);
    }
  }, 180_000);

  it('posts nothing twice on a rerun, and stops with one sentence once the token is revoked', async () => {
    const again = await runAnalyze(args(secret));
    expect(again.code, again.stderr).toBe(0);
    const list = await engineer.request('GET', `/api/projects/${projectId}/campaigns`);
    expect(list.body.campaigns).toHaveLength(1);
    expect(list.body.campaigns[0].done).toBe(3);

    expect((await engineer.request('DELETE', `/api/me/tokens/${tokenId}`)).status).toBe(204);
    rmSync(path.join(dir, 'results.jsonl'), { force: true });
    rmSync(path.join(dir, 'results.jsonl.campaign.json'), { force: true });
    rmSync(path.join(dir, 'results.jsonl.posted'), { force: true });
    const refused = await runAnalyze(args(secret));
    expect(refused.code).toBe(2);
    expect(refused.stderr.trim().split('\n').at(-1)).toMatch(/token|401|refused/i);
  }, 180_000);
});
