/** A worker thread of the batch CLI: computes map chunks (workers/dsp/map-chunk.ts) on request. */
import { parentPort } from 'node:worker_threads';
import { computeMapChunk, type MapChunkRequest } from '../../workers/dsp/map-chunk';

parentPort!.on('message', async (req: MapChunkRequest & { id: number }) => {
  const result = await computeMapChunk(req);
  parentPort!.postMessage({ id: req.id, ...result }, [result.power.buffer as ArrayBuffer]);
});
