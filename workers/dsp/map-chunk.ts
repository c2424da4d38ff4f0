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
  /** The FFT that computed it, and '+kernel' when the WASM readout kernel read the powers out */
  backend: string;
}

export const engineOf = (fft: RealFft) => (fft.readout === 'wasm-kernel' ? `${fft.backend}+kernel` : fft.backend);

/** The sample range frames [from, to) read: a worker is sent only these. */
export function chunkSampleRange(layout: StftLayout, from: number, to: number): [number, number] {
  return [from * layout.hop, (to - 1) * layout.hop + layout.blockSize];
}

// Promises, so chunks that arrive together while the first FFT is still loading share that one FFT.
const cache = new Map<string, Promise<{ fft: RealFft; win: SpectralWindow }>>();

/** The FFT and window for a request's settings, made once per thread and reused. */
export function mapTools(req: Pick<MapChunkRequest, 'settings' | 'backend'>) {
  const key = `${req.settings.window}:${req.settings.blockSize}:${req.backend ?? 'auto'}`;
  let t = cache.get(key);
  if (!t) {
    t = createRealFft(req.settings.blockSize, req.backend ?? 'auto').then((fft) => ({ fft, win: makeWindow(req.settings.window, req.settings.blockSize) }));
    cache.set(key, t);
  }
  return t;
}

export async function computeMapChunk(req: MapChunkRequest): Promise<MapChunkResult> {
  const { fft, win } = await mapTools(req);
  const power = new Float32Array((req.to - req.from) * req.layout.bins);
  computeFrames(req.samples, req.x0, req.layout, win, fft, req.from, req.to, power);
  return { from: req.from, to: req.to, power, backend: engineOf(fft) };
}

/**
 * The same, written straight into a map that all threads share (SharedArrayBuffer): no copies of the
 * samples in, none of the powers out.
 */
export async function computeMapChunkShared(req: Omit<MapChunkRequest, 'x0'> & { map: Float32Array }): Promise<string> {
  const { fft, win } = await mapTools(req);
  computeFrames(req.samples, 0, req.layout, win, fft, req.from, req.to, req.map.subarray(req.from * req.layout.bins, req.to * req.layout.bins));
  return engineOf(fft);
}

/** Splits frames into chunks of about `framesPerChunk`, in order, so a map can paint as they arrive. */
export function frameChunks(frames: number, framesPerChunk: number): [number, number][] {
  const out: [number, number][] = [];
  for (let f = 0; f < frames; f += framesPerChunk) out.push([f, Math.min(frames, f + framesPerChunk)]);
  return out;
}
