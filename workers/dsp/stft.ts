/**
 * Short-time spectra (the STFT behind every map): frames of N samples, hop H = round(N·(1 − overlap)),
 * frame i covering samples [i·H, i·H + N), 1 + ⌊(n − N)/H⌋ frames with no padding, time stamp at the
 * frame centre (i·H + N/2)/fs — the framing of scipy.signal.spectrogram [1] with detrend=False.
 * Each frame is windowed and transformed; the output is the mean-square power per bin
 * (spectrum-scaling.ts), one-sided, bins k = 0…N/2, Δf = fs/N.
 * References: [1] scipy.signal.spectrogram (SciPy 1.10); [2] J. B. Allen, "Short term spectral analysis,
 *   synthesis, and modification by discrete Fourier transform", IEEE Trans. ASSP 25(3) (1977) 235–238.
 */
import type { RealFft } from './fft';
import type { SpectralWindow, WindowName } from './window';

export interface StftSettings {
  blockSize: number;
  /** 0 … 0.95 */
  overlap: number;
  window: WindowName;
}

export interface StftLayout {
  fsHz: number;
  blockSize: number;
  hop: number;
  frames: number;
  bins: number;
  binHz: number;
  hopS: number;
  /** Time of frame 0's centre, s */
  t0S: number;
}

export const MIN_BLOCK = 256;
export const MAX_BLOCK = 65536;

export function stftLayout(samples: number, fsHz: number, s: StftSettings): StftLayout {
  if (!(s.blockSize >= MIN_BLOCK && s.blockSize <= MAX_BLOCK && (s.blockSize & (s.blockSize - 1)) === 0)) {
    throw new RangeError(`The block size must be a power of two from ${MIN_BLOCK} to ${MAX_BLOCK}, not ${s.blockSize}.`);
  }
  if (!(s.overlap >= 0 && s.overlap <= 0.95)) throw new RangeError(`The overlap must be from 0 to 0.95, not ${s.overlap}.`);
  const hop = Math.max(1, Math.round(s.blockSize * (1 - s.overlap)));
  const frames = samples >= s.blockSize ? 1 + Math.floor((samples - s.blockSize) / hop) : 0;
  return {
    fsHz,
    blockSize: s.blockSize,
    hop,
    frames,
    bins: s.blockSize / 2 + 1,
    binHz: fsHz / s.blockSize,
    hopS: hop / fsHz,
    t0S: s.blockSize / 2 / fsHz,
  };
}

export const frameTimeS = (layout: StftLayout, frame: number) => layout.t0S + frame * layout.hopS;

/**
 * Computes frames [from, to) into out (row-major, (to − from) × bins). `x` may be a slice of the channel
 * that starts at sample `x0` of it (a worker gets only the samples its frames need). With `decibels`, the
 * rows are levels 10·lg(power) (decibels.ts) instead of powers.
 */
export function computeFrames(
  x: Float32Array,
  x0: number,
  layout: StftLayout,
  win: SpectralWindow,
  fft: RealFft,
  from: number,
  to: number,
  out: Float32Array,
  decibels = false,
): void {
  // mean square per bin: 2|X|²/(Σw)² inside, |X|²/(Σw)² at DC and Nyquist
  const inner = 2 / (win.sum * win.sum);
  const edge = 1 / (win.sum * win.sum);
  if (to > from) fft.framesPower(x, from * layout.hop - x0, layout.hop, to - from, win, out, 0, inner, edge, decibels);
}

/** Linear power average of frames [from, to) of a map: Welch's method [Welch 1967] when overlapping. */
export function averageFrames(map: Float32Array, bins: number, from: number, to: number): Float64Array {
  const avg = new Float64Array(bins);
  for (let f = from; f < to; f++) {
    const row = f * bins;
    for (let k = 0; k < bins; k++) avg[k] += map[row + k];
  }
  const count = Math.max(1, to - from);
  for (let k = 0; k < bins; k++) avg[k] /= count;
  return avg;
}

/** Linear power average of the listed frames (e.g. those inside a speed range). */
export function averageFrameList(map: Float32Array, bins: number, frames: readonly number[]): Float64Array {
  const avg = new Float64Array(bins);
  for (const f of frames) {
    const row = f * bins;
    for (let k = 0; k < bins; k++) avg[k] += map[row + k];
  }
  const count = Math.max(1, frames.length);
  for (let k = 0; k < bins; k++) avg[k] /= count;
  return avg;
}
