/// <reference lib="webworker" />
/**
 * An analysis worker: computes one chunk of a map's frames and hands the powers back as a transferred
 * Float32Array; and, for the Bench, the speed from a tacho or speed channel, the map against speed
 * the inverter findings, the tracks of the guides, and the loudness and tonality of a microphone. Only wiring here; the work is workers/dsp (shared with Node and tests).
 * The pool in src/lib/workers/analysis-pool.ts runs several of these for maps; the Bench's longer
 * single tasks run in their own (src/lib/workers/analysis-tasks.ts).
 */
import * as Comlink from 'comlink';
import { guideTracks, type GuideTrack, type GuideTracksRequest } from './dsp/guide-tracks';
import { loudnessCurve, tonalityCurve, type HearingRequest, type LoudnessCurve, type TonalityCurve } from './dsp/hearing-curves';
import { analyseInverter, type InverterAnalysisInput, type InverterReport } from './dsp/inverter-analysis';
import { computeMapChunk, type MapChunkRequest, type MapChunkResult } from './dsp/map-chunk';
import { speedFromChannel, speedFromTacho, type SpeedCurve } from './dsp/speed';
import { mapAgainstSpeed, type SpeedMap } from './dsp/speed-map';
import { stftLayout, type StftLayout, type StftSettings } from './dsp/stft';

export type SpeedTaskRequest =
  | { kind: 'tacho'; samples: Float32Array; fsHz: number; ppr: number; triggerLevel?: number }
  | { kind: 'channel'; samples: Float32Array; fsHz: number; rpmPerUnit: number };

export interface SpeedMapTaskRequest {
  power: Float32Array;
  layout: StftLayout;
  frameRpm: Float64Array;
  rpmStep: number;
}

/** The speed of a tacho or speed channel (shared with the page's fallback when no worker starts). */
export function speedTask(req: SpeedTaskRequest): SpeedCurve {
  return req.kind === 'tacho'
    ? speedFromTacho(req.samples, req.fsHz, req.ppr, req.triggerLevel === undefined ? {} : { triggerLevel: req.triggerLevel })
    : speedFromChannel(req.samples, req.fsHz, req.rpmPerUnit);
}

export const speedMapTask = (req: SpeedMapTaskRequest): SpeedMap =>
  mapAgainstSpeed(req.power, req.layout, req.frameRpm, { rpmStep: req.rpmStep, mode: 'mean' });

const api = {
  /** Loads the FFT and the window for these settings now, so the first chunk does not wait for them. */
  async warm(settings: StftSettings): Promise<void> {
    const n = settings.blockSize;
    await computeMapChunk({ samples: new Float32Array(n), x0: 0, layout: stftLayout(n, 1, settings), settings, from: 0, to: 1 });
  },
  async computeChunk(req: MapChunkRequest): Promise<MapChunkResult> {
    const result = await computeMapChunk(req);
    return Comlink.transfer(result, [result.power.buffer as ArrayBuffer]);
  },
  speed(req: SpeedTaskRequest): SpeedCurve {
    const curve = speedTask(req);
    return Comlink.transfer(curve, [curve.tS.buffer as ArrayBuffer, curve.rpm.buffer as ArrayBuffer]);
  },
  speedMap(req: SpeedMapTaskRequest): SpeedMap {
    const map = speedMapTask(req);
    return Comlink.transfer(map, [map.rpm.buffer as ArrayBuffer, map.power.buffer as ArrayBuffer, map.counts.buffer as ArrayBuffer]);
  },
  inverter(req: InverterAnalysisInput): InverterReport {
    return analyseInverter(req);
  },
  tracks(req: GuideTracksRequest): GuideTrack[] {
    const tracks = guideTracks(req);
    return Comlink.transfer(tracks, tracks.flatMap((t) => [t.x.buffer, t.hz.buffer, t.db.buffer, t.crossing.buffer] as ArrayBuffer[]));
  },
  loudness(req: HearingRequest): LoudnessCurve {
    const curve = loudnessCurve(req);
    return Comlink.transfer(curve, [curve.t.buffer as ArrayBuffer, curve.sone.buffer as ArrayBuffer]);
  },
  tonality(req: HearingRequest): TonalityCurve {
    const curve = tonalityCurve(req);
    return Comlink.transfer(curve, [curve.t.buffer as ArrayBuffer, curve.tu.buffer as ArrayBuffer, curve.tonalHz.buffer as ArrayBuffer]);
  },
};

export type AnalysisWorkerApi = typeof api;
// Only inside a worker: the page imports the task functions above for its fallback.
if (typeof WorkerGlobalScope !== 'undefined' && self instanceof WorkerGlobalScope) Comlink.expose(api);
