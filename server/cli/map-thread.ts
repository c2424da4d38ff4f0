/** A worker thread of the batch CLI: computes map chunks (workers/dsp/map-chunk.ts) into a shared map. */
import { parentPort } from 'node:worker_threads';
import { computeMapChunkShared, type MapChunkRequest } from '../../workers/dsp/map-chunk';

parentPort!.on('message', async (req: Omit<MapChunkRequest, 'x0'> & { id: number; map: Float32Array }) => {
  const backend = await computeMapChunkShared(req);
  parentPort!.postMessage({ id: req.id, backend });
});
