/**
 * A campaign over a Redis queue (BullMQ): one job per file, added once (its id comes from the campaign's
 * id and the file's path), taken by `analyze-worker` processes on any machine that sees the same paths.
 * This process only adds the jobs and waits for each one's end (QueueEvents).
 */
import { createHash } from 'node:crypto';
import { Queue, QueueEvents } from 'bullmq';
import type { Outcome } from './analyse-one';
import { UsageError } from '../options';
import { QUEUE_NAME, redisClient } from './redis-connection';

export interface CampaignJob {
  campaignId: string;
  /** Absolute path */
  file: string;
  options: Record<string, string | true>;
}

/** A job's id: the same campaign and file give the same id, so a rerun adds nothing twice. */
export function jobIdOf(campaignId: string, file: string): string {
  return createHash('sha256').update(`${campaignId}\n${file}`).digest('hex').slice(0, 32);
}

/** A worker that dies is noticed by stalled-job detection and its job given to another; a bad file fails at once. */
export const JOB_ATTEMPTS = 3;

/** ioredis waits for an absent Redis for ever: one sentence (exit 2) after 5 s instead. */
async function checkRedisAnswers(url: string): Promise<void> {
  const probe = redisClient(url);
  let last = '';
  probe.on('error', (e: Error) => (last = e.message));
  const answered = await Promise.race([probe.ping().then(() => true, () => false), new Promise<false>((resolve) => setTimeout(() => resolve(false), 5000).unref())]);
  probe.disconnect();
  if (!answered) throw new UsageError(`No Redis answers at ${url}${last ? ` (${last})` : ''}; start one, or leave out --queue to run on this machine.`);
}

export async function runQueued(
  url: string,
  campaignId: string,
  files: string[],
  options: Record<string, string | true>,
  onResult: (file: string, outcome: Outcome) => void,
  signal: AbortSignal,
): Promise<void> {
  await checkRedisAnswers(url);
  // BullMQ leaves clients it was given open: they are closed here
  const clients = [redisClient(url), redisClient(url)];
  const queue = new Queue<CampaignJob>(QUEUE_NAME, { connection: clients[0] });
  const events = new QueueEvents(QUEUE_NAME, { connection: clients[1] });
  // a lost connection is retried by ioredis; said once on stderr rather than at every retry
  let said = '';
  const warn = (e: Error) => {
    if (e.message !== said) process.stderr.write(`campaign: Redis at ${url}: ${(said = e.message)}\n`);
  };
  queue.on('error', warn);
  events.on('error', warn);
  try {
    await events.waitUntilReady();
    const jobs = await queue.addBulk(
      files.map((file) => ({
        name: 'inverter',
        data: { campaignId, file, options },
        opts: {
          jobId: jobIdOf(campaignId, file),
          attempts: JOB_ATTEMPTS,
          backoff: { type: 'exponential', delay: 1000 },
          // kept a week, so a rerun finds the results of files its log lost
          removeOnComplete: { age: 7 * 24 * 3600 },
          removeOnFail: { age: 7 * 24 * 3600 },
        },
      })),
    );
    // the campaign only waits from here: say what it waits for, or a queue without workers looks hung
    process.stderr.write(`campaign: ${files.length} files queued on ${url}; waiting for analyze-worker processes (npm run -s analyze-worker -- --queue ${url})\n`);
    const aborted = new Promise<void>((resolve) => (signal.aborted ? resolve() : signal.addEventListener('abort', () => resolve(), { once: true })));
    const finished = jobs.map((job, i) =>
      job.waitUntilFinished(events).then(
        (inverter: unknown) => !signal.aborted && onResult(files[i], { ok: true, inverter }),
        (e: unknown) => !signal.aborted && onResult(files[i], { ok: false, error: (e as Error).message, final: true }),
      ),
    );
    await Promise.race([Promise.all(finished), aborted]);
  } finally {
    await events.close();
    await queue.close();
    for (const c of clients) c.disconnect();
  }
}
