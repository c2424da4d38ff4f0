/**
 * A speed curve and its readings: a typed ramp, the speed at given times, and the shaft and electrical
 * frequencies. Pure: the workers, the batch CLI and the tests share it (through speed.ts).
 */
import { SpeedError } from './speed-error';

/** Speed against time: `tS` in s (ascending), `rpm` in rev/min, one value per time. */
export interface SpeedCurve {
  tS: Float64Array;
  rpm: Float64Array;
}

/**
 * A typed speed ramp: piecewise linear between the given points, held flat before the first and
 * after the last (common practice).
 *
 * @param points     (time s, speed rpm) pairs, any order
 * @param durationS  length of the curve (s), from 0
 * @param stepS      time step (s), default 0.01; the last value is at `durationS`
 * @returns speed (rpm) against time (s)
 * @throws SpeedError EMPTY_RAMP without points; BAD_OPTION for a bad duration or step
 *
 * References: [1] Piecewise-linear interpolation: common practice.
 */
export function speedFromRamp(points: { tS: number; rpm: number }[], durationS: number, stepS = 0.01): SpeedCurve {
  if (points.length === 0) throw new SpeedError('EMPTY_RAMP', 'A speed ramp needs at least one point.');
  if (!(durationS >= 0 && Number.isFinite(durationS))) {
    throw new SpeedError('BAD_OPTION', `The ramp duration must be 0 s or more, not ${durationS}.`);
  }
  if (!(stepS > 0 && Number.isFinite(stepS))) {
    throw new SpeedError('BAD_OPTION', `The ramp step must be a positive number of seconds, not ${stepS}.`);
  }
  const sorted = [...points].sort((a, b) => a.tS - b.tS);
  const knots: SpeedCurve = {
    tS: Float64Array.from(sorted, (p) => p.tS),
    rpm: Float64Array.from(sorted, (p) => p.rpm),
  };
  const steps = Math.floor(durationS / stepS + 1e-9);
  const lastOnGrid = steps * stepS;
  const n = steps + 1 + (durationS - lastOnGrid > 1e-9 * stepS ? 1 : 0);
  const tS = new Float64Array(n);
  for (let i = 0; i <= steps; i++) tS[i] = i * stepS;
  if (n > steps + 1) tS[n - 1] = durationS;
  return { tS, rpm: rpmAtTimes(knots, tS) };
}

function valueBetween(curve: SpeedCurve, i: number, tS: number): number {
  const t0 = curve.tS[i];
  const t1 = curve.tS[i + 1];
  const r0 = curve.rpm[i];
  return t1 > t0 ? r0 + ((tS - t0) / (t1 - t0)) * (curve.rpm[i + 1] - r0) : r0;
}

/** Largest i with curve.tS[i] ≤ tS (callers have handled tS outside the curve). */
function segmentOf(times: Float64Array, tS: number): number {
  let lo = 0;
  let hi = times.length - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >>> 1;
    if (times[mid] <= tS) lo = mid;
    else hi = mid;
  }
  return lo;
}

/**
 * Speed at a time by linear interpolation of the curve, held at the first and last value outside
 * it; binary search (common practice).
 *
 * @param curve speed (rpm) against time (s)   @param tS time (s)
 * @returns speed (rpm); NaN for an empty curve
 */
export function rpmAt(curve: SpeedCurve, tS: number): number {
  const n = curve.tS.length;
  if (n === 0) return NaN;
  if (!(tS > curve.tS[0])) return curve.rpm[0];
  if (tS >= curve.tS[n - 1]) return curve.rpm[n - 1];
  return valueBetween(curve, segmentOf(curve.tS, tS), tS);
}

/**
 * {@link rpmAt} for many times. Ascending times are served by walking the curve once; a time that
 * goes backwards falls back to a binary search, so any order gives the right values.
 *
 * @param curve speed (rpm) against time (s)   @param times times (s), ideally ascending
 * @returns speed (rpm) at each time; NaN for an empty curve
 */
export function rpmAtTimes(curve: SpeedCurve, times: Float64Array): Float64Array {
  const out = new Float64Array(times.length);
  const n = curve.tS.length;
  if (n === 0) return out.fill(NaN);
  const first = curve.tS[0];
  const last = curve.tS[n - 1];
  let seg = 0;
  let previous = -Infinity;
  for (let k = 0; k < times.length; k++) {
    const t = times[k];
    if (!(t > first)) out[k] = curve.rpm[0];
    else if (t >= last) out[k] = curve.rpm[n - 1];
    else {
      if (t < previous) seg = segmentOf(curve.tS, t);
      while (curve.tS[seg + 1] <= t) seg++;
      out[k] = valueBetween(curve, seg, t);
    }
    previous = t;
  }
  return out;
}

/** Shaft rotation frequency (Hz) from speed (rpm): f = rpm/60. */
export function shaftHz(rpm: number): number {
  return rpm / 60;
}

/** Electrical (stator current) fundamental (Hz) of a machine with `polePairs` pole pairs: f = p·rpm/60. */
export function electricalHz(rpm: number, polePairs: number): number {
  return (polePairs * rpm) / 60;
}
