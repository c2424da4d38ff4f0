/**
 * Comparison playback: where in another run the machine turns at the same speed, so that switching runs
 * keeps the speed rather than the time. The curve is read as piecewise linear between its points (as
 * rpmAt in speed.ts does); every crossing of the asked speed is found, and the one nearest a given time
 * chosen (a run-up then coast-down passes each speed twice). Common practice: linear interpolation.
 */
import type { SpeedCurve } from './speed';

/** A speed outside the run's range by less than this fraction is taken as the nearest end of the range. */
export const SPEED_MATCH_TOLERANCE = 0.01;

/** The times at which the piecewise-linear curve equals `rpm`, ascending (flat stretches give the point nearest `nearS`, else their start). */
function crossings(curve: SpeedCurve, rpm: number, nearS: number | undefined): number[] {
  const { tS, rpm: r } = curve;
  const out: number[] = [];
  const push = (t: number) => {
    if (out.length === 0 || t > out[out.length - 1]) out.push(t);
  };
  if (tS.length === 1) {
    if (r[0] === rpm) push(tS[0]);
    return out;
  }
  for (let i = 0; i + 1 < tS.length; i++) {
    const t0 = tS[i];
    const t1 = tS[i + 1];
    const r0 = r[i];
    const r1 = r[i + 1];
    if (!(Number.isFinite(t0) && Number.isFinite(t1) && Number.isFinite(r0) && Number.isFinite(r1))) continue;
    if (r0 === r1) {
      if (r0 === rpm) push(nearS === undefined ? t0 : Math.min(t1, Math.max(t0, nearS)));
      continue;
    }
    if ((rpm - r0) * (rpm - r1) > 0) continue; // not between the two
    push(t0 + ((rpm - r0) / (r1 - r0)) * (t1 - t0));
  }
  return out;
}

/**
 * The time in a run at which its speed equals `rpm`, s.
 * @param curve the run's speed against time
 * @param rpm   the speed sought, rpm; within SPEED_MATCH_TOLERANCE (1 %) outside the run's range, the
 *              nearest end of the range is taken
 * @param nearS among several crossings, the one nearest this time (default: the first)
 * @returns the time, s; null when the run never turns at that speed (or the curve or speed is unusable)
 */
export function timeAtSameSpeed(curve: SpeedCurve, rpm: number, nearS?: number): number | null {
  const n = Math.min(curve.tS.length, curve.rpm.length);
  if (n === 0 || !Number.isFinite(rpm)) return null;
  let lo = Infinity;
  let hi = -Infinity;
  for (let i = 0; i < n; i++) {
    const v = curve.rpm[i];
    if (!Number.isFinite(v) || !Number.isFinite(curve.tS[i])) continue;
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  if (!(hi >= lo)) return null;
  let target = rpm;
  if (rpm < lo) {
    if (lo - rpm > SPEED_MATCH_TOLERANCE * Math.abs(lo)) return null;
    target = lo;
  } else if (rpm > hi) {
    if (rpm - hi > SPEED_MATCH_TOLERANCE * Math.abs(hi)) return null;
    target = hi;
  }
  const near = nearS !== undefined && Number.isFinite(nearS) ? nearS : undefined;
  const found = crossings(curve, target, near);
  if (!found.length) return null;
  if (near === undefined) return found[0];
  let best = found[0];
  for (const t of found) if (Math.abs(t - near) < Math.abs(best - near)) best = t;
  return best;
}
