/**
 * `analyze campaign --project ID --server URL --token TOKEN` against a small fake of the campaign API
 * (the contract of tracker issue #18): the requests it sends, checked one by one — the campaign created
 * once with its preset, total and the folder's tags.csv, then one result per file with a Bearer token, an
 * Idempotency-Key kept across a retry after a 503, and a rerun adding to the same campaign.
 */
import { createServer, type IncomingMessage } from 'node:http';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runAnalyze } from '../../support/campaign-cli';
import { medianCarrier, RUN_UP_PRESET, writeRunUp } from '../../support/campaign-run-ups';

interface Seen {
  method: string;
  url: string;
  headers: IncomingMessage['headers'];
  body: Record<string, unknown>;
  status: number;
}

const TOKEN = `flt_${'A'.repeat(20)}-_${'b'.repeat(21)}`; // flt_ + 43 base64url characters
const dir = mkdtempSync(path.join(tmpdir(), 'fanlight-campaign-project-'));
const data = path.join(dir, 'runs');
const seen: Seen[] = [];
let failNextResult = true;
const server = createServer((req, res) => {
  let text = '';
  req.on('data', (d: Buffer) => (text += d.toString()));
  req.on('end', () => {
    const body = text ? (JSON.parse(text) as Record<string, unknown>) : {};
    let status = 404;
    let answer: unknown = { error: { code: 'NOT_FOUND', message: 'Not found.' } };
    if (req.headers.authorization !== `Bearer ${TOKEN}`) {
      status = 401;
      answer = { error: { code: 'TOKEN_INVALID', message: 'This token is revoked, expired or unknown.' } };
    } else if (req.method === 'POST' && req.url === '/api/projects/7/campaigns') {
      status = 201;
      answer = { campaign: { id: 42, name: body.name, preset: body.preset, total: body.total, done: 0, failed: 0 } };
    } else if (req.method === 'POST' && req.url === '/api/projects/7/campaigns/42/results') {
      if (failNextResult) {
        failNextResult = false;
        status = 503;
        answer = { error: { code: 'UNAVAILABLE', message: 'The database is away.' } };
      } else {
        status = seen.some((s) => s.status === 201 && s.url === req.url && s.body.file === body.file) ? 200 : 201;
        answer = { result: { id: seen.length, ...body } };
      }
    }
    seen.push({ method: req.method!, url: req.url!, headers: req.headers, body, status });
    res.writeHead(status, { 'Content-Type': 'application/json' }).end(JSON.stringify(answer));
  });
});
let base = '';

beforeAll(async () => {
  writeRunUp(path.join(data, 'a.wav'), 3000);
  writeRunUp(path.join(data, 'later/b.wav'), 6000);
  writeFileSync(path.join(data, 'broken.wav'), 'RIFF\x20\x00\x00\x00WAVEjunk\x04\x00\x00\x00abcd');
  writeFileSync(path.join(data, 'tags.csv'), 'file,firmware,load\na.wav,A,full\nlater/b.wav,B,half\nnot-there.wav,C,none\n');
  writeFileSync(path.join(dir, 'preset.json'), JSON.stringify(RUN_UP_PRESET));
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  base = `http://127.0.0.1:${(server.address() as { port: number }).port}`;
});
afterAll(() => new Promise<void>((resolve) => server.close(() => resolve())));

const args = () => ['campaign', data, '--preset', path.join(dir, 'preset.json'), '--workers', '2', '--out', path.join(dir, 'results.jsonl'), '--name', 'firmware A against B', '--project', '7', '--server', base, '--token', TOKEN];

describe('analyze campaign registered with a project', () => {
  it('creates the campaign once and posts every result as the contract says', async () => {
    const r = await runAnalyze(args());
    expect(r.code, r.stderr).toBe(0);
    expect(JSON.parse(r.stdout)).toMatchObject({ files: 3, ok: 2, failed: 1, campaignId: '42' });
    for (const s of seen) {
      expect(s.method).toBe('POST');
      expect(s.headers.authorization).toBe(`Bearer ${TOKEN}`);
      expect(s.headers['content-type']).toBe('application/json');
      expect(s.headers['idempotency-key']).toMatch(/^[0-9a-f-]{36}$/);
    }
    const creates = seen.filter((s) => s.url === '/api/projects/7/campaigns');
    expect(creates).toHaveLength(1);
    expect(creates[0].body).toEqual({
      name: 'firmware A against B',
      preset: RUN_UP_PRESET,
      total: 3,
      tags: { 'a.wav': { firmware: 'A', load: 'full' }, 'later/b.wav': { firmware: 'B', load: 'half' } },
    });
    const posts = seen.filter((s) => s.url === '/api/projects/7/campaigns/42/results');
    // the 503 was tried again with the same key; different results carry different keys
    expect(posts[0].status).toBe(503);
    expect(posts[1].headers['idempotency-key']).toBe(posts[0].headers['idempotency-key']);
    const stored = posts.filter((s) => s.status === 201);
    expect(stored.map((s) => s.body.file).sort()).toEqual(['a.wav', 'broken.wav', 'later/b.wav']);
    expect(new Set(stored.map((s) => s.headers['idempotency-key'])).size).toBe(3);
    const a = stored.find((s) => s.body.file === 'a.wav')!.body as { ok: boolean; inverter: { carrier: { hz: number[] } }; tags: unknown };
    expect(a.ok).toBe(true);
    expect(a.tags).toEqual({ firmware: 'A', load: 'full' });
    expect(Math.abs(medianCarrier(a.inverter.carrier.hz) - 3000) / 3000).toBeLessThan(0.01);
    expect(stored.find((s) => s.body.file === 'broken.wav')!.body).toEqual({ file: 'broken.wav', ok: false, error: expect.stringMatching(/^broken\.wav /) });
  }, 60_000);

  it('adds a rerun to the same campaign, posting only the results that had not got through', async () => {
    const before = seen.length;
    const r = await runAnalyze(args());
    expect(JSON.parse(r.stdout)).toMatchObject({ files: 3, skipped: 3, campaignId: '42' });
    expect(seen.slice(before)).toEqual([]);

    // as if the post of later/b.wav had failed for good: the rerun posts it (the server keeps one result)
    const posted = path.join(dir, 'results.jsonl.posted');
    writeFileSync(posted, readFileSync(posted, 'utf8').replace('later/b.wav\n', ''));
    const again = await runAnalyze(args());
    expect(JSON.parse(again.stdout)).toMatchObject({ skipped: 3, campaignId: '42' });
    expect(seen.slice(before).map((s) => [s.url, s.body.file, s.status])).toEqual([['/api/projects/7/campaigns/42/results', 'later/b.wav', 200]]);
  }, 30_000);

  it('refuses a token that is not a personal API token (exit 2)', async () => {
    const r = await runAnalyze([...args().slice(0, -1), 'secret']);
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('--token must be a personal API token');
  });

  it('stops with the server’s sentence when it refuses the token (401, exit 2), without trying again', async () => {
    const before = seen.length;
    const revoked = `flt_${'R'.repeat(43)}`;
    const out = path.join(dir, 'revoked.jsonl');
    const r = await runAnalyze([...args().slice(0, -1), revoked].map((a) => (a.endsWith('results.jsonl') ? out : a)));
    expect(r.code).toBe(2);
    expect(r.stderr.trim()).toBe('The server refused the campaign: 401 This token is revoked, expired or unknown.');
    expect(seen.slice(before).map((s) => [s.url, s.status])).toEqual([['/api/projects/7/campaigns', 401]]);
  });
});
