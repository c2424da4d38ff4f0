/**
 * `analyze campaign --queue` over a private redis-server with two `analyze-worker` processes, one killed
 * with SIGKILL while it holds a file: BullMQ's stalled-job detection hands that file to the other worker,
 * and the campaign still writes every file exactly once with its own carrier (known by construction,
 * tests/support/campaign-run-ups.ts); a corrupt file is one final ok:false line, not retried.
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { Queue } from 'bullmq';
import { Redis } from 'ioredis';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QUEUE_NAME } from '../../../server/cli/campaign/redis-connection';
import { readResults, startAnalyze, startWorker } from '../../support/campaign-cli';
import { medianCarrier, RUN_UP_PRESET, writeRunUp } from '../../support/campaign-run-ups';
import { REDIS_SERVER, redisServerInstalled, startTestRedis, type TestRedis } from '../../support/private-redis';

const installed = redisServerInstalled();
if (!installed) console.warn(`campaign-queue tests skipped: ${REDIS_SERVER} is absent (apt-get install redis-server; npm test's bootstrap installs it).`);

const dir = mkdtempSync(path.join(tmpdir(), 'fanlight-campaign-queue-'));
const CARRIERS: Record<string, number> = { 'q1.wav': 3000, 'q2.wav': 4000, 'q3.wav': 5000, 'q4.wav': 6000, 'q5.wav': 7000, 'q6.wav': 3500 };
const CORRUPT = 'broken.wav';
let redis: TestRedis;
const started: ReturnType<typeof startWorker>[] = [];

beforeAll(async () => {
  if (!installed) return;
  for (const [name, fc] of Object.entries(CARRIERS)) writeRunUp(path.join(dir, 'runs', name), fc);
  writeFileSync(path.join(dir, 'runs', CORRUPT), 'RIFF\x20\x00\x00\x00WAVEjunk\x04\x00\x00\x00abcd');
  writeFileSync(path.join(dir, 'preset.json'), JSON.stringify(RUN_UP_PRESET));
  redis = await startTestRedis();
});

afterAll(async () => {
  for (const w of started) if (w.child.exitCode === null && w.child.signalCode === null) w.child.kill('SIGKILL');
  await redis?.stop();
});

describe.skipIf(!installed)('analyze campaign --queue', () => {
  it('gives a killed worker’s file to the other worker and reports every file exactly once', async () => {
    const lock = ['--lock-seconds', '2'];
    const victim = startWorker(['--queue', redis.url, '--concurrency', '1', ...lock]);
    const survivor = startWorker(['--queue', redis.url, '--concurrency', '1', ...lock]);
    started.push(victim, survivor);
    let killedWhileOn = '';
    let victimDone = 0;
    victim.stderrLines((line) => {
      if (/^analyze-worker: (ok|FAILED) /.test(line)) victimDone++;
      // after its first file, the victim is killed as it takes the next one (holding the job's lock)
      const start = /^analyze-worker: start (.*)$/.exec(line);
      if (start && victimDone > 0 && !killedWhileOn) {
        killedWhileOn = start[1];
        victim.child.kill('SIGKILL');
      }
    });
    const out = path.join(dir, 'results.jsonl');
    const campaign = startAnalyze(['campaign', path.join(dir, 'runs'), '--preset', path.join(dir, 'preset.json'), '--queue', redis.url, '--out', out]);
    const r = await campaign.done;
    const survived = survivor.done;
    survivor.child.kill('SIGTERM');
    const s = await survived;
    expect(r.code, r.stderr).toBe(0);
    expect(JSON.parse(r.stdout)).toMatchObject({ files: 7, ok: 6, failed: 1, skipped: 0 });
    expect(killedWhileOn, 'the victim was killed holding a file').not.toBe('');
    expect(s.stderr).toContain(`analyze-worker: ok ${killedWhileOn}`);

    const lines = readResults(out);
    expect(lines.map((l) => path.basename(l.file)).sort()).toEqual([...Object.keys(CARRIERS), CORRUPT].sort());
    for (const line of lines.filter((l) => l.ok)) {
      const fc = CARRIERS[path.basename(line.file)];
      expect(Math.abs(medianCarrier(line.inverter!.carrier.hz) - fc) / fc, line.file).toBeLessThan(0.01);
    }
    expect(lines.find((l) => l.file.endsWith(CORRUPT))).toMatchObject({ ok: false, error: expect.stringMatching(/^broken\.wav /) });
    // a final failure (UnrecoverableError): one attempt, not the 3 a passing error would get
    const connection = new Redis(redis.url, { maxRetriesPerRequest: null });
    const queue = new Queue(QUEUE_NAME, { connection });
    try {
      const failedJobs = await queue.getFailed();
      expect(failedJobs.map((j) => [path.basename(j.data.file), j.attemptsMade])).toEqual([[CORRUPT, 1]]);
      expect(failedJobs[0].failedReason).toMatch(/^broken\.wav /);
    } finally {
      await queue.close();
      connection.disconnect();
    }
  }, 90_000);
});
