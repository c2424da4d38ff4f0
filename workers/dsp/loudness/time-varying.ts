/**
 * Time-varying loudness after Zwicker, ISO 532-1:2017 clause 6: one-third-octave filter bank →
 * squaring and smoothing → band levels every 2 ms → core loudness → nonlinear temporal decay of the
 * core loudness → upper slopes and total loudness → temporal weighting of the total → N5.
 *
 * The time constants below are RECALLED FROM MEMORY of ISO 532-1:2017 clause 6 and its Annex A
 * program (which follows DIN 45631/A1:2010); the filter bank is this project's Butterworth design
 * (third-octave-filter-bank.ts), not the standard's 48 kHz coefficients.
 *
 * References:
 *   [1] ISO 532-1:2017, Acoustics — Methods for calculating loudness — Part 1: Zwicker method, clause 6.
 *   [2] E. Zwicker, H. Fastl, Psychoacoustics — Facts and Models, 3rd ed., Springer 2007, ch. 8
 *       (temporal effects: nonlinear decay of the loudness of short and long sounds).
 */
import { REF_SOUND_PRESSURE_PA } from '../levels';
import { LOUDNESS_BAND_NOMINAL_HZ } from './iso532-1-tables';
import { coreLoudness, type SoundField, specificFromCore, stationaryLoudness } from './stationary';
import { filterSections } from '../biquad';
import { loudnessFilterBank } from './third-octave-filter-bank';

/** Time step of the loudness computation (s), ISO 532-1 clause 6 [1]. */
export const LOUDNESS_STEP_S = 0.002;
/** At most this many points of N(t) are returned (N5 and the maximum use all of them). */
export const MAX_RETURNED_POINTS = 2000;

// Smoothing of the squared band signals: three first-order low-passes in series, τ = 2/(3·fm) up to
// 1 kHz and 2/3 ms above [1, clause 6] (from memory).
const smoothingTauS = (nominalHz: number) => 2 / (3 * Math.min(nominalHz, 1000));
// Nonlinear decay of the core loudness [1, clause 6; 2, ch. 8] (from memory): after a short sound the
// loudness falls fast (τ 5 ms), after a long one slowly (τ 15 ms); the store that decides between the
// two fills with τ 75 ms.
const DECAY_SHORT_S = 0.005;
const DECAY_LONG_S = 0.015;
const DECAY_STORE_FILL_S = 0.075;
// Temporal weighting of the total loudness: 0.47·(3.5 ms low-pass) + 0.53·(70 ms low-pass) [1, clause 6]
// (from memory).
const WEIGHT_FAST = 0.47;
const TAU_FAST_S = 0.0035;
const TAU_SLOW_S = 0.07;
// The first samples of each band filter are its start-up transient (25 Hz band: about 55 ms).
const SETTLING_S = 0.1;

export interface TimeVaryingLoudness {
  /** Times of the returned loudness values (s from the first sample). */
  t: Float64Array;
  /** Total loudness N(t) (sone), at most MAX_RETURNED_POINTS values (each the maximum of its stretch). */
  sone: Float64Array;
  /** N5, the loudness exceeded 5 % of the time, over every 2 ms value (sone). */
  n5Sone: number;
  maxSone: number;
  /** Stationary loudness (clause 5) of the one-third-octave levels of the whole signal (sone). */
  stationarySone: number;
  /** Those levels, 25 Hz … 12.5 kHz (dB re 20 µPa). */
  thirdOctaveDb: Float64Array;
}

/** y ← cascade of `stages` first-order low-passes with time constant tauS, in place (impulse invariance). */
function lowPassInPlace(y: Float64Array, fsHz: number, tauS: number, stages: number): void {
  const a = Math.exp(-1 / (fsHz * tauS));
  for (let s = 0; s < stages; s++) {
    let state = 0;
    for (let i = 0; i < y.length; i++) {
      state = a * state + (1 - a) * y[i];
      y[i] = state;
    }
  }
}

/** Nonlinear decay of one band's core loudness sequence, in place (see the constants above). */
function nonlinearDecay(core: Float64Array, stepS: number): void {
  const fall = Math.exp(-stepS / DECAY_SHORT_S);
  const storeFall = Math.exp(-stepS / DECAY_LONG_S);
  const fill = 1 - Math.exp(-stepS / DECAY_STORE_FILL_S);
  let out = 0;
  let store = 0;
  for (let i = 0; i < core.length; i++) {
    const input = core[i];
    if (input >= out) {
      out = input;
      store += (out - store) * fill;
    } else {
      store *= storeFall;
      out = Math.max(input, store + (out - store) * fall);
      store = Math.min(store, out);
    }
    core[i] = out;
  }
}

/** The value exceeded during `fraction` of the time: the (1 − fraction) quantile, linear between ranks. */
export function exceededLevel(values: Float64Array, fraction: number): number {
  if (values.length === 0) return 0;
  const sorted = Float64Array.from(values).sort();
  const pos = (1 - fraction) * (sorted.length - 1);
  const lo = Math.floor(pos);
  const hi = Math.min(sorted.length - 1, lo + 1);
  return sorted[lo] + (sorted[hi] - sorted[lo]) * (pos - lo);
}

/**
 * Loudness against time of a sound-pressure signal, ISO 532-1:2017 clause 6 [1], with N5 and the
 * stationary loudness (clause 5) of the whole signal's one-third-octave levels.
 *
 * @param samplesPa     sound pressure (Pa)
 * @param sampleRateHz  ≥ 32 kHz so that the 12.5 kHz band is below half the rate; at lower rates the
 *                      bands above 0.95·fs/2 count as empty
 * @throws RangeError if the rate is not finite and positive or the signal is shorter than 10 ms
 */
export function timeVaryingLoudness(
  samplesPa: Float32Array | Float64Array,
  sampleRateHz: number,
  field: SoundField,
): TimeVaryingLoudness {
  if (!(sampleRateHz > 0) || !Number.isFinite(sampleRateHz)) throw new RangeError(`Sample rate must be above 0 Hz (got ${sampleRateHz}).`);
  const n = samplesPa.length;
  const steps = Math.floor(n / (sampleRateHz * LOUDNESS_STEP_S));
  if (steps < 5) throw new RangeError(`The signal holds ${n} samples, less than 10 ms at ${sampleRateHz} Hz; loudness needs more.`);
  const bank = loudnessFilterBank(sampleRateHz);
  const bands = bank.length;
  const ref2 = REF_SOUND_PRESSURE_PA ** 2;
  const settle = n > 4 * SETTLING_S * sampleRateHz ? Math.round(SETTLING_S * sampleRateHz) : 0;
  // levels[step * bands + band] in dB
  const levels = new Float64Array(steps * bands).fill(-Infinity);
  const thirdOctaveDb = new Float64Array(bands).fill(-Infinity);
  for (let b = 0; b < bands; b++) {
    const sections = bank[b];
    if (!sections) continue;
    const y = filterSections(samplesPa, sections);
    let sum = 0;
    for (let i = 0; i < n; i++) {
      y[i] *= y[i];
      if (i >= settle) sum += y[i];
    }
    thirdOctaveDb[b] = sum > 0 ? 10 * Math.log10(sum / (n - settle) / ref2) : -Infinity;
    lowPassInPlace(y, sampleRateHz, smoothingTauS(LOUDNESS_BAND_NOMINAL_HZ[b]), 3);
    for (let s = 0; s < steps; s++) {
      const v = y[Math.min(n - 1, Math.round((s + 1) * LOUDNESS_STEP_S * sampleRateHz) - 1)];
      levels[s * bands + b] = v > 0 ? 10 * Math.log10(v / ref2) : -Infinity;
    }
  }
  // Core loudness per step, then the nonlinear decay along time for each critical band.
  const cores = Array.from({ length: steps }, (_, s) => coreLoudness(levels.subarray(s * bands, (s + 1) * bands), field));
  const criticalBands = cores[0].length;
  const track = new Float64Array(steps);
  for (let c = 0; c < criticalBands; c++) {
    for (let s = 0; s < steps; s++) track[s] = cores[s][c];
    nonlinearDecay(track, LOUDNESS_STEP_S);
    for (let s = 0; s < steps; s++) cores[s][c] = track[s];
  }
  const total = new Float64Array(steps);
  for (let s = 0; s < steps; s++) total[s] = specificFromCore(cores[s]).totalSone;
  // Temporal weighting of the total loudness
  const fast = Float64Array.from(total);
  const slow = Float64Array.from(total);
  lowPassInPlace(fast, 1 / LOUDNESS_STEP_S, TAU_FAST_S, 1);
  lowPassInPlace(slow, 1 / LOUDNESS_STEP_S, TAU_SLOW_S, 1);
  for (let s = 0; s < steps; s++) total[s] = WEIGHT_FAST * fast[s] + (1 - WEIGHT_FAST) * slow[s];

  const stride = Math.max(1, Math.ceil(steps / MAX_RETURNED_POINTS));
  const outCount = Math.ceil(steps / stride);
  const t = new Float64Array(outCount);
  const sone = new Float64Array(outCount);
  let maxSone = 0;
  for (let k = 0; k < outCount; k++) {
    let m = 0;
    for (let s = k * stride; s < Math.min(steps, (k + 1) * stride); s++) m = Math.max(m, total[s]);
    t[k] = (k * stride + 1) * LOUDNESS_STEP_S;
    sone[k] = m;
    maxSone = Math.max(maxSone, m);
  }
  return {
    t,
    sone,
    n5Sone: exceededLevel(total, 0.05),
    maxSone,
    stationarySone: stationaryLoudness(thirdOctaveDb, field).totalSone,
    thirdOctaveDb,
  };
}
