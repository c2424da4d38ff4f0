/**
 * The hearing panel's curves: loudness (ISO 532-1) and tonality (ECMA-418-2) of a sound-pressure
 * channel against time, thinned for a plot, and the speed at each of their moments. The methods are
 * loudness/ and hearing-model/; this file only shapes what they return for the Bench.
 */
import { timeVaryingLoudness } from './loudness';
import { hearingModelTonality } from './hearing-model';
import { rpmAtTimes } from './speed';

export interface HearingRequest {
  /** The channel in Pa (calibrated) */
  samplesPa: Float32Array;
  fsHz: number;
  field: 'free' | 'diffuse';
}

export interface LoudnessCurve {
  method: 'ISO 532-1';
  t: Float64Array;
  sone: Float64Array;
  /** Loudness exceeded 5 % of the time, from the full-resolution series */
  n5Sone: number;
  maxSone: number;
}

export interface TonalityCurve {
  method: 'ECMA-418-2';
  t: Float64Array;
  tu: Float64Array;
  /** The tonal frequency at each moment, Hz (NaN where no tone is found) */
  tonalHz: Float64Array;
  averageTu: number;
  averageTonalHz: number;
}

/** At most this many points go to a plot: about one per screen pixel of a wide panel. */
export const HEARING_PLOT_POINTS = 1500;

/**
 * Thins a series to at most `points` by keeping the largest value of each run of samples (max-hold,
 * common practice for level displays: a short peak stays visible), with its own time and companion.
 */
export function maxHold(t: ArrayLike<number>, v: ArrayLike<number>, points = HEARING_PLOT_POINTS, companion?: ArrayLike<number>) {
  const n = Math.min(t.length, v.length);
  if (n <= points) {
    return { t: Float64Array.from({ length: n }, (_, i) => t[i]), v: Float64Array.from({ length: n }, (_, i) => v[i]), c: companion ? Float64Array.from({ length: n }, (_, i) => companion[i]) : undefined };
  }
  const out = { t: new Float64Array(points), v: new Float64Array(points), c: companion ? new Float64Array(points) : undefined };
  for (let k = 0; k < points; k++) {
    const a = Math.floor((k * n) / points);
    const b = Math.floor(((k + 1) * n) / points);
    let best = a;
    for (let i = a + 1; i < b; i++) if (!(v[i] <= v[best])) best = i;
    out.t[k] = t[best];
    out.v[k] = v[best];
    if (out.c && companion) out.c[k] = companion[best];
  }
  return out;
}

export function loudnessCurve(req: HearingRequest): LoudnessCurve {
  // already thinned by the method itself (each value the maximum of its stretch, at most 2000)
  const r = timeVaryingLoudness(req.samplesPa, req.fsHz, req.field);
  return { method: 'ISO 532-1', t: r.t, sone: r.sone, n5Sone: r.n5Sone, maxSone: r.maxSone };
}

export function tonalityCurve(req: HearingRequest): TonalityCurve {
  const r = hearingModelTonality(req.samplesPa, req.fsHz);
  const thin = maxHold(r.t, r.tu, HEARING_PLOT_POINTS, r.tonalHz);
  return { method: 'ECMA-418-2', t: thin.t, tu: thin.v, tonalHz: thin.c!, averageTu: r.averageTu, averageTonalHz: r.averageTonalHz };
}

/**
 * The speed at each moment `t`, read linearly between the map's frames (their times and speeds) by
 * speed.ts rpmAtTimes; NaN outside them or where the speed is unknown.
 */
export function speedAtTimes(t: ArrayLike<number>, frameTimes: ArrayLike<number>, frameRpm: ArrayLike<number>): Float64Array {
  const n = Math.min(frameTimes.length, frameRpm.length);
  const times = Float64Array.from(t);
  if (n === 0) return times.fill(NaN);
  const curve = { tS: Float64Array.from({ length: n }, (_, i) => frameTimes[i]), rpm: Float64Array.from({ length: n }, (_, i) => frameRpm[i]) };
  const rpm = rpmAtTimes(curve, times);
  for (let i = 0; i < times.length; i++) if (!(times[i] >= curve.tS[0] && times[i] <= curve.tS[n - 1])) rpm[i] = NaN;
  return rpm;
}
