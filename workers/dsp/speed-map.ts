/**
 * A map against speed (a run-up or coast-down map): each frame's power spectrum is assigned to the rpm
 * bin of the speed at its centre, and the frames in one bin are averaged (linear power) or their maximum
 * is kept per frequency bin. The rpm grid ascends whatever the direction of the run (common practice).
 */
import type { StftLayout } from './stft';

export interface SpeedMap {
  /** Centres of the rpm bins, ascending */
  rpm: Float64Array;
  /** rpm bins × frequency bins; NaN where no frame fell in the rpm bin */
  power: Float32Array;
  /** Frames in each rpm bin */
  counts: Uint32Array;
  bins: number;
}

export interface SpeedMapOptions {
  rpmStep: number;
  mode?: 'mean' | 'max';
  rpmMin?: number;
  rpmMax?: number;
}

export function mapAgainstSpeed(power: Float32Array, layout: StftLayout, frameRpm: Float64Array, opts: SpeedMapOptions): SpeedMap {
  if (!(opts.rpmStep > 0)) throw new RangeError(`The rpm step must be above 0, not ${opts.rpmStep}.`);
  const bins = layout.bins;
  let lo = Infinity;
  let hi = -Infinity;
  for (const r of frameRpm) {
    if (Number.isFinite(r)) {
      lo = Math.min(lo, r);
      hi = Math.max(hi, r);
    }
  }
  if (!Number.isFinite(lo)) return { rpm: new Float64Array(0), power: new Float32Array(0), counts: new Uint32Array(0), bins };
  const first = Math.floor((opts.rpmMin ?? lo) / opts.rpmStep);
  const last = Math.floor((opts.rpmMax ?? hi) / opts.rpmStep);
  const n = Math.max(0, last - first + 1);
  const rpm = Float64Array.from({ length: n }, (_, i) => (first + i + 0.5) * opts.rpmStep);
  const out = new Float32Array(n * bins);
  const counts = new Uint32Array(n);
  const max = opts.mode === 'max';
  for (let f = 0; f < layout.frames; f++) {
    const r = frameRpm[f];
    if (!Number.isFinite(r)) continue;
    const i = Math.floor(r / opts.rpmStep) - first;
    if (i < 0 || i >= n) continue;
    counts[i]++;
    const src = f * bins;
    const dst = i * bins;
    if (max) for (let k = 0; k < bins; k++) out[dst + k] = Math.max(out[dst + k], power[src + k]);
    else for (let k = 0; k < bins; k++) out[dst + k] += power[src + k];
  }
  for (let i = 0; i < n; i++) {
    const dst = i * bins;
    if (counts[i] === 0) out.fill(NaN, dst, dst + bins);
    else if (!max) for (let k = 0; k < bins; k++) out[dst + k] /= counts[i];
  }
  return { rpm, power: out, counts, bins };
}

/** The frames whose speed lies in [rpmFrom, rpmTo]: for a spectrum averaged over a speed range. */
export function framesInSpeedRange(frameRpm: Float64Array, rpmFrom: number, rpmTo: number): number[] {
  const out: number[] = [];
  for (let f = 0; f < frameRpm.length; f++) if (frameRpm[f] >= rpmFrom && frameRpm[f] <= rpmTo) out.push(f);
  return out;
}
