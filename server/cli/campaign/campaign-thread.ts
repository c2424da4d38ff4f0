/**
 * A campaign worker thread: analyses one file at a time. Its map runs on one map thread of its own, so
 * N campaign threads keep N cores busy instead of N × cores map threads fighting for them.
 */
import { parentPort, workerData } from 'node:worker_threads';
import { MapThreadPool } from '../thread-pool';
import { analyseOne } from './analyse-one';

// started from the CLI's bundle: the map thread comes from it too (thread-pool.ts reads this)
const bundleDir = (workerData as { bundleDir?: string } | null)?.bundleDir;
if (bundleDir) (globalThis as { fanlightCliBundleDir?: string }).fanlightCliBundleDir = bundleDir;
const pool = new MapThreadPool(1);

parentPort!.on('message', async (req: { id: number; file: string; options: Record<string, string | true> }) => {
  const outcome = await analyseOne(req.file, req.options, pool);
  parentPort!.postMessage({ id: req.id, outcome });
});
