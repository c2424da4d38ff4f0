/** A campaign on this machine: the files go to a pool of worker threads, each finished file reported at once. */
import { CampaignPool } from './campaign-pool';
import type { Outcome } from './analyse-one';

export async function runEmbedded(
  files: string[],
  options: Record<string, string | true>,
  workers: number,
  onResult: (file: string, outcome: Outcome) => void,
  signal: AbortSignal,
): Promise<void> {
  const pool = new CampaignPool(Math.min(workers, Math.max(1, files.length)));
  const aborted = new Promise<void>((resolve) => (signal.aborted ? resolve() : signal.addEventListener('abort', () => resolve(), { once: true })));
  let next = 0;
  const lane = async () => {
    while (!signal.aborted && next < files.length) {
      const file = files[next++];
      const outcome = await Promise.race([
        pool.run(file, options).catch((e: unknown): Outcome => ({ ok: false, error: `the worker thread failed: ${(e as Error).message}`, final: false })),
        aborted.then(() => null),
      ]);
      // Ctrl-C: a file still running is abandoned, not written (a rerun does it again)
      if (outcome === null || signal.aborted) return;
      onResult(file, outcome);
    }
  };
  try {
    await Promise.race([Promise.all(Array.from({ length: pool.size }, lane)), aborted]);
  } finally {
    await pool.close();
  }
}
