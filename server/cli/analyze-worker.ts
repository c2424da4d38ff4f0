/**
 * `npm run -s analyze-worker -- --queue redis://HOST:PORT [--concurrency N] [--lock-seconds S]`: takes
 * campaign jobs from the queue and analyses each file on a pool of N worker threads (default: one per core).
 * A file at fault (a RecordingError and the like) is a final failure; a worker that dies leaves its jobs
 * locked for S seconds (default 30), after which another worker takes them again.
 */
import { availableParallelism } from 'node:os';
import { UnrecoverableError, Worker } from 'bullmq';
import { CampaignPool } from './campaign/campaign-pool';
import type { CampaignJob } from './campaign/queue-runner';
import { checkRedisUrl, QUEUE_NAME, redisClient } from './campaign/redis-connection';
import { Options, UsageError } from './options';

function parseWorkerArgs(argv: string[]): Options {
  const o: Record<string, string | true> = {};
  for (let i = 0; i < argv.length; i++) {
    if (!argv[i].startsWith('--')) throw new UsageError(`Unexpected "${argv[i]}". usage: npm run -s analyze-worker -- --queue redis://HOST:PORT [--concurrency N] [--lock-seconds S]`);
    const next = argv[i + 1];
    if (next !== undefined && !next.startsWith('--')) o[argv[i].slice(2)] = argv[++i];
    else o[argv[i].slice(2)] = true;
  }
  return new Options(o);
}

export async function workerMain(argv: string[]): Promise<number> {
  let o: Options;
  let url: string;
  let concurrency: number;
  let lockMs: number;
  try {
    o = parseWorkerArgs(argv);
    url = o.string('queue');
    concurrency = o.integer('concurrency', availableParallelism(), 1);
    lockMs = o.number('lock-seconds', 30, (s) => (s >= 0.5 ? null : 'must be at least 0.5.')) * 1000;
    checkRedisUrl(url);
  } catch (e) {
    process.stderr.write(`${(e as Error).message}\n`);
    return 2;
  }
  const pool = new CampaignPool(concurrency);
  // BullMQ leaves a client it was given open: closed below
  const connection = redisClient(url);
  const worker = new Worker<CampaignJob>(
    QUEUE_NAME,
    async (job) => {
      process.stderr.write(`analyze-worker: start ${job.data.file}\n`);
      const outcome = await pool.run(job.data.file, job.data.options);
      process.stderr.write(`analyze-worker: ${outcome.ok ? 'ok' : 'FAILED'} ${job.data.file}\n`);
      if (outcome.ok) return outcome.inverter;
      throw outcome.final ? new UnrecoverableError(outcome.error) : new Error(outcome.error);
    },
    {
      connection,
      concurrency,
      lockDuration: lockMs,
      stalledInterval: Math.max(500, lockMs / 2),
      maxStalledCount: 2,
    },
  );
  // ioredis retries a lost connection: each new error said once
  let said = '';
  worker.on('error', (e) => e.message !== said && process.stderr.write(`analyze-worker: ${(said = e.message)}\n`));
  process.stderr.write(`analyze-worker: taking campaign jobs from ${url} with ${concurrency} threads\n`);
  await new Promise<void>((resolve) => {
    process.once('SIGINT', resolve);
    process.once('SIGTERM', resolve);
  });
  // lets the running files finish (their results reach the queue), then stops
  await worker.close();
  await pool.close();
  connection.disconnect();
  return 0;
}

if (import.meta.url === `file://${process.argv[1]}`) {
  process.exitCode = await workerMain(process.argv.slice(2));
}
