/**
 * One worker's share of a map: frames [from, to) of a channel, from the slice of samples they need.
 * The browser's analysis workers and the CLI's worker threads both run this.
 */
import { createRealFft, type RealFft } from './fft';
import { computeFrames, type StftLayout, type StftSettings } from './stft';
import { makeWindow, type SpectralWindow } from './window';

export interface MapChunkRequest {
  /** Samples [x0, x0 + samples.length) of the channel */
  samples: Float32Array;
  x0: number;
  layout: StftLayout;
  settings: StftSettings;
  from: number;
  to: number;
  backend?: 'auto' | 'fft.js';
}

export interface MapChunkResult {
  from: number;
  to: number;
  /** (to − from) × bins mean-square powers */
  power: Float32Array;
  backend: string;
}

/** The sample range frames [from, to) read: a worker is sent only these. */
export function chunkSampleRange(layout: StftLayout, from: number, to: number): [number, number] {
  return [from * layout.hop, (to - 1) * layout.hop + layout.blockSize];
}

const cache = new Map<string, { fft: RealFft; win: SpectralWindow }>();

export async function computeMapChunk(req: MapChunkRequest): Promise<MapChunkResult> {
  const key = `${req.settings.window}:${req.settings.blockSize}:${req.backend ?? 'auto'}`;
  let tools = cache.get(key);
  if (!tools) {
    tools = { fft: await createRealFft(req.settings.blockSize, req.backend ?? 'auto'), win: makeWindow(req.settings.window, req.settings.blockSize) };
    cache.set(key, tools);
  }
  const power = new Float32Array((req.to - req.from) * req.layout.bins);
  computeFrames(req.samples, req.x0, req.layout, tools.win, tools.fft, req.from, req.to, power);
  return { from: req.from, to: req.to, power, backend: tools.fft.backend };
}

/** Splits frames into chunks of about `framesPerChunk`, in order, so a map can paint as they arrive. */
export function frameChunks(frames: number, framesPerChunk: number): [number, number][] {
  const out: [number, number][] = [];
  for (let f = 0; f < frames; f += framesPerChunk) out.push([f, Math.min(frames, f + framesPerChunk)]);
  return out;
}
