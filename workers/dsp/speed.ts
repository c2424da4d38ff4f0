/**
 * Shaft speed against time, from a tacho pulse channel, an analogue speed channel or a typed ramp.
 * Pure and synchronous: the workers, the batch CLI and the tests share it.
 */

import { SpeedError } from './speed-error';
import type { SpeedCurve } from './speed-curve';

export { SpeedError, type SpeedErrorCode } from './speed-error';
export { electricalHz, rpmAt, rpmAtTimes, shaftHz, speedFromRamp, type SpeedCurve } from './speed-curve';

export interface TriggerOptions {
  /** Trigger level, in the channel's unit. Default: midway between the 1st and 99th percentile. */
  triggerLevel?: number;
  /** Hysteresis below the level (above it for 'falling'), same unit. Default: 10 % of that range. */
  hysteresis?: number;
  /** Which edge is the pulse. Default 'rising'. */
  slope?: 'rising' | 'falling';
}

export interface PulseSpeedOptions {
  /** Drop intervals from missed or spurious pulses. Default true. */
  rejectOutliers?: boolean;
  /** Revolutions to average each speed over (angle-based); 0 gives raw per-pulse rates. Default 1. */
  smoothRevs?: number;
}

const PERCENTILE_SAMPLES = 100_000;
const SHORT_INTERVAL = 0.5;
const LONG_INTERVAL = 1.8;
const MIN_NEIGHBOURS = 5;
/** A long gap is taken as this many missed pulses at most; a longer one is a break in the record. */
const MAX_MISSED_PULSES = 4;

function checkSampleRate(fsHz: number): void {
  if (!(Number.isFinite(fsHz) && fsHz > 0)) {
    throw new SpeedError('BAD_SAMPLE_RATE', `The sample rate must be a positive number of Hz, not ${fsHz}.`);
  }
}

function checkPpr(ppr: number): void {
  if (!(Number.isInteger(ppr) && ppr >= 1)) {
    throw new SpeedError('BAD_PPR', `Pulses per revolution must be a whole number of at least 1, not ${ppr}.`);
  }
}

function formatLevel(level: number): string {
  return Number.isFinite(level) ? String(Number(level.toPrecision(4))) : String(level);
}

function tooFewPulses(count: number, level?: number): SpeedError {
  const at = level === undefined ? '' : ` at trigger level ${formatLevel(level)}`;
  return new SpeedError(
    'TOO_FEW_PULSES',
    `Found ${count} tacho pulse${count === 1 ? '' : 's'}${at}: the tacho channel needs at least 2; ` +
      'check the channel, the trigger level and the hysteresis.',
  );
}

/**
 * 1st and 99th percentile of a signal, estimated from an evenly strided subset of at most 100 000
 * samples so that a long recording is not sorted in full. NaN samples are skipped.
 */
function percentileRange(x: Float32Array): { p1: number; p99: number } {
  const stride = Math.max(1, Math.ceil(x.length / PERCENTILE_SAMPLES));
  const picked = new Float64Array(Math.ceil(x.length / stride));
  let m = 0;
  for (let i = 0; i < x.length; i += stride) {
    const v = x[i];
    if (v === v) picked[m++] = v;
  }
  if (m === 0) return { p1: NaN, p99: NaN };
  const s = picked.subarray(0, m).sort();
  const at = (p: number) => {
    const r = p * (m - 1);
    const k = Math.floor(r);
    return k + 1 < m ? s[k] + (r - k) * (s[k + 1] - s[k]) : s[k];
  };
  return { p1: at(0.01), p99: at(0.99) };
}

function resolveTrigger(x: Float32Array, opts: TriggerOptions): { level: number; hysteresis: number } {
  let { triggerLevel: level, hysteresis } = opts;
  if (level === undefined || hysteresis === undefined) {
    const { p1, p99 } = percentileRange(x);
    if (Number.isNaN(p1)) throw new SpeedError('EMPTY_CHANNEL', 'The tacho channel has no samples that are numbers.');
    level ??= (p1 + p99) / 2;
    hysteresis ??= 0.1 * (p99 - p1);
  }
  if (!(hysteresis >= 0)) {
    throw new SpeedError('BAD_OPTION', `The hysteresis must be 0 or more, not ${hysteresis}.`);
  }
  return { level, hysteresis };
}

/**
 * Tacho pulse times by a Schmitt trigger with linear sub-sample interpolation of the crossing [1, 2].
 *
 * For 'rising' the trigger arms when the signal falls below `level − hysteresis` and fires when it
 * next crosses `level` upwards; 'falling' is the mirror image. The crossing between samples k and
 * k+1 is placed at t = (k + (level − x[k]) / (x[k+1] − x[k])) / fs, which removes most of the
 * ±½-sample jitter of nearest-sample crossings.
 *
 * @param x      tacho channel, any unit (V, or file units)
 * @param fsHz   sampling rate (Hz), > 0
 * @param opts   `triggerLevel` (unit of x; default midway between the 1st and 99th percentile,
 *               estimated from at most 100 000 strided samples), `hysteresis` (unit of x; default
 *               10 % of that percentile range), `slope` (default 'rising')
 * @returns pulse times (s from the first sample), ascending
 *
 * References: [1] A. Brandt, *Noise and Vibration Analysis*, Wiley 2011, chapter on order tracking
 *   (tacho processing) [from memory]. [2] Schmitt trigger with linear interpolation: common practice.
 */
export function tachoPulseTimes(x: Float32Array, fsHz: number, opts: TriggerOptions = {}): Float64Array {
  checkSampleRate(fsHz);
  const { level, hysteresis } = resolveTrigger(x, opts);
  return pulseTimesAt(x, fsHz, level, hysteresis, opts.slope ?? 'rising');
}

function pulseTimesAt(
  x: Float32Array,
  fsHz: number,
  level: number,
  hysteresis: number,
  slope: 'rising' | 'falling',
): Float64Array {
  // Falling edges are rising edges of −x; the interpolation formula is the same for both.
  const sign = slope === 'falling' ? -1 : 1;
  const lvl = sign * level;
  const arm = lvl - hysteresis;
  const n = x.length;
  let out = new Float64Array(Math.max(16, Math.min(n, 4096)));
  let count = 0;
  let armed = false;
  for (let k = 0; k + 1 < n; k++) {
    const a = sign * x[k];
    if (a < arm) armed = true;
    if (!armed || !(a < lvl)) continue;
    const b = sign * x[k + 1];
    if (!(b >= lvl)) continue;
    if (count === out.length) {
      const grown = new Float64Array(out.length * 2);
      grown.set(out);
      out = grown;
    }
    out[count++] = (k + (lvl - a) / (b - a)) / fsHz;
    armed = false;
  }
  return out.slice(0, count);
}

/** Index of the first element of sorted `s[0..len)` that is ≥ v. */
function lowerBound(s: Float64Array, len: number, v: number): number {
  let lo = 0;
  let hi = len;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (s[mid] < v) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/**
 * For each interval, the median of the intervals within ±halfWidth of it, itself excluded (the
 * window is cut short at the ends). A sorted copy of the window slides along, so each step costs
 * one deletion and one insertion rather than a sort.
 */
function neighbourMedians(d: Float64Array, halfWidth: number): Float64Array {
  const n = d.length;
  const med = new Float64Array(n);
  if (n === 1) {
    med[0] = d[0];
    return med;
  }
  const win = new Float64Array(Math.min(n, 2 * halfWidth + 1));
  let len = 0;
  let lo = 0;
  let hi = -1;
  for (let i = 0; i < n; i++) {
    const newLo = Math.max(0, i - halfWidth);
    const newHi = Math.min(n - 1, i + halfWidth);
    for (; lo < newLo; lo++) {
      len--;
      for (let q = lowerBound(win, len + 1, d[lo]); q < len; q++) win[q] = win[q + 1];
    }
    while (hi < newHi) {
      hi++;
      const v = d[hi];
      let q = len++;
      for (; q > 0 && win[q - 1] > v; q--) win[q] = win[q - 1];
      win[q] = v;
    }
    // The median of the window without d[i]: skip over the rank that d[i] occupies.
    const self = lowerBound(win, len, d[i]);
    const m = len - 1;
    const q0 = (m - 1) >> 1;
    const q1 = m >> 1;
    med[i] = 0.5 * (win[q0 < self ? q0 : q0 + 1] + win[q1 < self ? q1 : q1 + 1]);
  }
  return med;
}

/**
 * Cleans a pulse train and gives each kept pulse its shaft angle in pulse pitches. A too-short
 * interval means a spurious pulse: whichever of its two end pulses leaves the more regular interval
 * is removed, so both halves of the split interval disappear. A too-long interval that is a clean
 * multiple k of the local pitch means k − 1 missed pulses: its angle advances by k, so no per-pulse
 * rate is taken across it but revolution windows that span it stay right. Any other long gap breaks
 * the angle count by more than `span`, so no speed window straddles it.
 */
function cleanPulses(
  t: Float64Array,
  ppr: number,
  span: number,
): { t: Float64Array; angle: Float64Array; count: number } {
  const n = t.length;
  const d = new Float64Array(n - 1);
  for (let i = 0; i + 1 < n; i++) d[i] = t[i + 1] - t[i];
  const med = neighbourMedians(d, Math.max(ppr, MIN_NEIGHBOURS));
  const keptT = new Float64Array(n);
  const angle = new Float64Array(n);
  keptT[0] = t[0];
  let len = 1;
  const irregularity = (interval: number, m: number) =>
    interval > 0 ? Math.abs(Math.log(interval / m)) : Infinity;
  for (let j = 1; j < n; j++) {
    const m = med[j - 1];
    let g = t[j] - keptT[len - 1];
    let skip = false;
    while (g < SHORT_INTERVAL * m) {
      const dropThis = j + 1 < n ? irregularity(t[j + 1] - keptT[len - 1], m) : 0;
      const dropLast =
        len >= 2 ? irregularity(t[j] - keptT[len - 2], m) : j + 1 < n ? irregularity(t[j + 1] - t[j], m) : Infinity;
      if (dropThis <= dropLast) {
        skip = true;
        break;
      }
      if (len === 1) {
        keptT[0] = t[j];
        skip = true;
        break;
      }
      len--;
      g = t[j] - keptT[len - 1];
    }
    if (skip) continue;
    let step = 1;
    if (g > LONG_INTERVAL * m) {
      const k = Math.round(g / m);
      step = k <= MAX_MISSED_PULSES && Math.abs(g / m - k) < 0.3 ? k : span + MAX_MISSED_PULSES + 1;
    }
    keptT[len] = t[j];
    angle[len] = angle[len - 1] + step;
    len++;
  }
  return { t: keptT, angle, count: len };
}

/** Speeds over windows of exactly `span` pitches, at the window's mid-time. */
function windowRates(t: Float64Array, angle: Float64Array, count: number, ppr: number, span: number): SpeedCurve {
  const tS = new Float64Array(count);
  const rpm = new Float64Array(count);
  const revsPerWindow = span / ppr;
  let m = 0;
  let j = 0;
  for (let i = 0; i < count; i++) {
    const target = angle[i] + span;
    if (j <= i) j = i + 1;
    while (j < count && angle[j] < target) j++;
    if (j >= count) break;
    if (angle[j] !== target) continue;
    const dt = t[j] - t[i];
    if (!(dt > 0)) continue;
    tS[m] = 0.5 * (t[i] + t[j]);
    rpm[m] = (60 * revsPerWindow) / dt;
    m++;
  }
  return { tS: tS.slice(0, m), rpm: rpm.slice(0, m) };
}

/**
 * Speed from tacho pulse times: rates between pulses, with outlier rejection and angle-domain
 * averaging over whole revolutions [1, 2].
 *
 * Raw rate of interval i: rpm_i = 60 / (ppr·Δt_i), placed at the interval's mid-time. With
 * `rejectOutliers` (default true), an interval shorter than 0.5× or longer than 1.8× the median of its
 * neighbours (±ppr intervals, at least ±5) is taken as a spurious or missed pulse and dropped: a
 * spurious pulse is removed, a missed one leaves no rate but is counted in the shaft angle.
 * With `smoothRevs` = R > 0 (default 1), speed is revolutions over time: rpm = 60·R / (t_j − t_i)
 * where pulse j lies exactly round(R·ppr) pitches after pulse i, placed at (t_i + t_j)/2 — on a linear
 * ramp this is exactly the speed at that time. If the record is shorter than the window, the raw
 * per-pulse rates are returned instead.
 *
 * @param pulseTimesS pulse times (s), ascending
 * @param ppr         pulses per revolution, whole number ≥ 1
 * @returns speed (rpm) against time (s)
 * @throws SpeedError TOO_FEW_PULSES with fewer than 2 pulses; BAD_PPR
 *
 * References: [1] A. Brandt, *Noise and Vibration Analysis*, Wiley 2011, chapter on order tracking
 *   (tacho processing) [from memory]. [2] Median-based interval rejection: common practice.
 */
export function speedFromPulses(pulseTimesS: Float64Array, ppr: number, opts: PulseSpeedOptions = {}): SpeedCurve {
  return speedFromPulsesAt(pulseTimesS, ppr, opts, undefined);
}

function speedFromPulsesAt(
  pulseTimesS: Float64Array,
  ppr: number,
  opts: PulseSpeedOptions,
  level: number | undefined,
): SpeedCurve {
  checkPpr(ppr);
  if (pulseTimesS.length < 2) throw tooFewPulses(pulseTimesS.length, level);
  const smoothRevs = opts.smoothRevs ?? 1;
  if (!(smoothRevs >= 0 && Number.isFinite(smoothRevs))) {
    throw new SpeedError('BAD_OPTION', `The smoothing must be 0 or more revolutions, not ${smoothRevs}.`);
  }
  // Averaging over whole revolutions: the ppr pitch angles of one revolution add up to exactly 360°
  // however unevenly the teeth or slots are spaced, so the spacing errors that make per-pulse rates
  // ripple at shaft orders cancel. Averaging the per-pulse rates instead would not (mean of 1/Δt ≠ 1/mean Δt).
  const span = Math.max(1, Math.round(smoothRevs * ppr));
  let t: Float64Array;
  let angle: Float64Array;
  let count: number;
  if (opts.rejectOutliers ?? true) {
    ({ t, angle, count } = cleanPulses(pulseTimesS, ppr, span));
  } else {
    t = pulseTimesS;
    count = t.length;
    angle = new Float64Array(count);
    for (let i = 0; i < count; i++) angle[i] = i;
  }
  let curve = windowRates(t, angle, count, ppr, span);
  if (curve.tS.length === 0 && span > 1) curve = windowRates(t, angle, count, ppr, 1);
  if (curve.tS.length === 0) {
    throw new SpeedError(
      'NO_VALID_INTERVALS',
      `None of the ${pulseTimesS.length - 1} intervals between tacho pulses is regular enough to give a speed; ` +
        'check the pulses per revolution, the trigger level and the hysteresis.',
    );
  }
  return curve;
}

/**
 * Speed from a tacho channel: {@link tachoPulseTimes} then {@link speedFromPulses} [1].
 *
 * @param x    tacho channel, any unit      @param fsHz sampling rate (Hz), > 0
 * @param ppr  pulses per revolution, whole number ≥ 1
 * @param opts trigger options and pulse-speed options, defaults as in the two functions
 * @returns speed (rpm) against time (s from the first sample)
 * @throws SpeedError TOO_FEW_PULSES naming the trigger level used
 *
 * References: [1] A. Brandt, *Noise and Vibration Analysis*, Wiley 2011, chapter on order tracking
 *   (tacho processing) [from memory].
 */
export function speedFromTacho(
  x: Float32Array,
  fsHz: number,
  ppr: number,
  opts: TriggerOptions & PulseSpeedOptions = {},
): SpeedCurve {
  checkSampleRate(fsHz);
  checkPpr(ppr);
  const { level, hysteresis } = resolveTrigger(x, opts);
  const pulses = pulseTimesAt(x, fsHz, level, hysteresis, opts.slope ?? 'rising');
  return speedFromPulsesAt(pulses, ppr, opts, level);
}

/**
 * Speed from an analogue speed channel: rpm = K·x, block-averaged to about `decimateTo` values per
 * second to remove noise (boxcar mean of non-overlapping blocks; common practice).
 *
 * @param x          speed channel, unit U (e.g. V)
 * @param fsHz       sampling rate (Hz), > 0
 * @param rpmPerUnit K, rpm per unit U (e.g. 1000 rpm/V for a 0.001 V/rpm channel)
 * @param opts       `decimateTo` output values per second, default 100
 * @returns speed (rpm) against time (s, each block's mid-time); a shorter last block is kept
 * @throws SpeedError EMPTY_CHANNEL, BAD_SAMPLE_RATE, BAD_OPTION
 *
 * References: [1] Block averaging of a slowly varying channel: common practice.
 */
export function speedFromChannel(
  x: Float32Array,
  fsHz: number,
  rpmPerUnit: number,
  opts: { decimateTo?: number } = {},
): SpeedCurve {
  checkSampleRate(fsHz);
  const perSecond = opts.decimateTo ?? 100;
  if (!(perSecond > 0 && Number.isFinite(perSecond))) {
    throw new SpeedError('BAD_OPTION', `The output rate must be a positive number of values per second, not ${perSecond}.`);
  }
  const n = x.length;
  if (n === 0) throw new SpeedError('EMPTY_CHANNEL', 'The speed channel has no samples.');
  const block = Math.max(1, Math.round(fsHz / perSecond));
  const blocks = Math.ceil(n / block);
  const tS = new Float64Array(blocks);
  const rpm = new Float64Array(blocks);
  for (let b = 0; b < blocks; b++) {
    const start = b * block;
    const end = Math.min(n, start + block);
    let sum = 0;
    for (let k = start; k < end; k++) sum += x[k];
    tS[b] = (0.5 * (start + end - 1)) / fsHz;
    rpm[b] = (rpmPerUnit * sum) / (end - start);
  }
  return { tS, rpm };
}
