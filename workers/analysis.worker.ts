/// <reference lib="webworker" />
/**
 * An analysis worker: computes one chunk of a map's frames and hands the powers back as a transferred
 * Float32Array. Only wiring here; the spectra are workers/dsp (shared with Node and tests). The pool
 * in src/lib/workers/analysis-pool.ts runs several of these.
 */
import * as Comlink from 'comlink';
import { computeMapChunk, type MapChunkRequest, type MapChunkResult } from './dsp/map-chunk';

const api = {
  async computeChunk(req: MapChunkRequest): Promise<MapChunkResult> {
    const result = await computeMapChunk(req);
    return Comlink.transfer(result, [result.power.buffer as ArrayBuffer]);
  },
};

export type AnalysisWorkerApi = typeof api;
Comlink.expose(api);
