/**
 * Campaign throughput (tracker issue #18): 12 generated 6 s, 25.6 kHz PWM run-ups through `analyze campaign`,
 * embedded on 1 and 2 worker threads, and over a private Redis queue with 1 and 2 `analyze-worker`
 * processes (one thread each). Prints files per minute from the campaign's own clock.
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { runAnalyze, startWorker } from '../support/campaign-cli';
import { RUN_UP_PRESET, writeRunUp } from '../support/campaign-run-ups';
import { redisServerInstalled, startTestRedis } from '../support/private-redis';

const FILES = 12;

export interface CampaignBenchResult {
  mode: 'embedded' | 'queue';
  workers: number;
  filesPerMinute: number;
  seconds: number;
}

export async function runCampaignBench(log: (line: string) => void): Promise<CampaignBenchResult[]> {
  const dir = mkdtempSync(path.join(tmpdir(), 'fanlight-campaign-bench-'));
  const results: CampaignBenchResult[] = [];
  try {
    for (let i = 0; i < FILES; i++) writeRunUp(path.join(dir, 'runs', `run-${String(i).padStart(2, '0')}.wav`), 3000 + 250 * i, 6);
    const preset = path.join(dir, 'preset.json');
    writeFileSync(preset, JSON.stringify(RUN_UP_PRESET));
    const campaign = async (mode: CampaignBenchResult['mode'], workers: number, extra: string[]) => {
      const out = path.join(dir, `${mode}-${workers}.jsonl`);
      // started as npm run analyze starts it (the JavaScript bundle), so the figure is what a user sees
      const r = await runAnalyze(['campaign', path.join(dir, 'runs'), '--preset', preset, '--out', out, ...extra], {}, true);
      if (r.code !== 0) throw new Error(`campaign bench (${mode}, ${workers}) failed: ${r.stderr}`);
      const summary = JSON.parse(r.stdout) as { ok: number; seconds: number };
      if (summary.ok !== FILES) throw new Error(`campaign bench (${mode}, ${workers}): ${summary.ok} of ${FILES} files ok`);
      const result = { mode, workers, seconds: summary.seconds, filesPerMinute: (FILES / summary.seconds) * 60 };
      log(`campaign of ${FILES} run-ups (6 s, 25.6 kHz), ${mode}, ${workers} worker${workers > 1 ? 's' : ''}: ${result.seconds.toFixed(1)} s, ${result.filesPerMinute.toFixed(0)} files/min`);
      results.push(result);
    };
    await campaign('embedded', 1, ['--workers', '1']);
    await campaign('embedded', 2, ['--workers', '2']);
    if (!redisServerInstalled()) {
      log('queue: skipped, /usr/bin/redis-server is absent');
      return results;
    }
    const redis = await startTestRedis();
    try {
      for (const n of [1, 2]) {
        const workers = Array.from({ length: n }, () => startWorker(['--queue', redis.url, '--concurrency', '1']));
        // wait until each worker listens, so the figure is the queue's, not the workers' start-up
        await Promise.all(workers.map((w) => new Promise<void>((resolve) => w.stderrLines((l) => l.startsWith('analyze-worker: taking') && resolve()))));
        try {
          await campaign('queue', n, ['--queue', redis.url]);
        } finally {
          for (const w of workers) w.child.kill('SIGTERM');
          await Promise.all(workers.map((w) => w.done));
        }
      }
    } finally {
      await redis.stop();
    }
    return results;
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
