/**
 * Runs compared on one speed grid: each run's track (points against rpm, from a run-up or a coast-down)
 * is put on a common grid of rpm bins, levels are compared in dB against the baseline, and a level is
 * checked against a target (a limit curve, piecewise linear) for the speed ranges where it lies above.
 *
 * Methods (common practice in order analysis): a grid bin takes the power mean of the points that fall
 * in it; a bin with none, inside the run's speed range, is interpolated linearly in dB between the
 * nearest points on either side; outside the range it is empty (NaN). An exceedance starts and ends
 * where the excess L − T crosses 0 dB, interpolated linearly between grid points.
 */

/** Bin centres (k + ½)·step covering [lo, hi] of every range given. */
export function speedGrid(ranges: [number, number][], stepRpm: number): Float64Array {
  let lo = Infinity;
  let hi = -Infinity;
  for (const [a, b] of ranges) {
    if (Number.isFinite(a) && Number.isFinite(b)) {
      lo = Math.min(lo, a, b);
      hi = Math.max(hi, a, b);
    }
  }
  if (!(hi >= lo) || !(stepRpm > 0)) return new Float64Array(0);
  const k0 = Math.floor(lo / stepRpm);
  const k1 = Math.floor(hi / stepRpm);
  return Float64Array.from({ length: k1 - k0 + 1 }, (_, i) => (k0 + i + 0.5) * stepRpm);
}

/** The speed range a track covers (its lowest and highest finite point). */
export function speedRange(rpm: ArrayLike<number>, level: ArrayLike<number>): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  for (let i = 0; i < rpm.length; i++) {
    if (!Number.isFinite(rpm[i]) || !Number.isFinite(level[i])) continue;
    lo = Math.min(lo, rpm[i]);
    hi = Math.max(hi, rpm[i]);
  }
  return [lo, hi];
}

/**
 * A track's RMS levels on the grid (bins of width `stepRpm` centred on the grid points): the power mean
 * of its points in a bin, linear-in-dB interpolation across an empty bin inside its range, NaN outside.
 */
export function onSpeedGrid(rpm: ArrayLike<number>, rms: ArrayLike<number>, grid: Float64Array, stepRpm: number): Float64Array {
  const out = new Float64Array(grid.length).fill(NaN);
  if (grid.length === 0) return out;
  const k0 = Math.round(grid[0] / stepRpm - 0.5);
  const sum = new Float64Array(grid.length);
  const count = new Uint32Array(grid.length);
  const points: { r: number; db: number }[] = [];
  for (let i = 0; i < rpm.length; i++) {
    const r = rpm[i];
    const v = rms[i];
    if (!Number.isFinite(r) || !(v > 0)) continue;
    points.push({ r, db: 20 * Math.log10(v) });
    const k = Math.floor(r / stepRpm) - k0;
    if (k < 0 || k >= grid.length) continue;
    sum[k] += v * v;
    count[k]++;
  }
  if (points.length === 0) return out;
  points.sort((a, b) => a.r - b.r);
  const lo = points[0].r;
  const hi = points[points.length - 1].r;
  let j = 0;
  for (let k = 0; k < grid.length; k++) {
    if (count[k] > 0) {
      out[k] = Math.sqrt(sum[k] / count[k]);
      continue;
    }
    const g = grid[k];
    if (g < lo || g > hi) continue;
    while (j + 1 < points.length && points[j + 1].r < g) j++;
    const a = points[j];
    const b = points[Math.min(points.length - 1, j + 1)];
    const db = b.r === a.r ? a.db : a.db + ((g - a.r) / (b.r - a.r)) * (b.db - a.db);
    out[k] = 10 ** (db / 20);
  }
  return out;
}

/** Levels in dB re a reference RMS (NaN where there is none). */
export const levelsDb = (rms: Float64Array, refRms: number): Float64Array => Float64Array.from(rms, (v) => (v > 0 ? 20 * Math.log10(v / refRms) : NaN));

/** run − baseline, dB, where both have a level. */
export function deltaDb(runDb: Float64Array, baselineDb: Float64Array): Float64Array {
  return Float64Array.from(runDb, (v, k) => (Number.isFinite(v) && Number.isFinite(baselineDb[k]) ? v - baselineDb[k] : NaN));
}

export interface Exceedance {
  fromRpm: number;
  toRpm: number;
  /** The largest excess over the target in the interval, dB, and where */
  maxExcessDb: number;
  atRpm: number;
}

/**
 * The speed intervals where a level on the grid lies above a target: each starts and ends where the
 * excess crosses 0 dB (between two grid points with levels and target), or where the level or the
 * target stops.
 * @param target level of the target at a speed, NaN outside it
 */
export function exceedances(grid: Float64Array, levelDb: Float64Array, target: (rpm: number) => number): Exceedance[] {
  const excess = Float64Array.from(grid, (g, k) => levelDb[k] - target(g));
  const out: Exceedance[] = [];
  let open: Exceedance | null = null;
  for (let k = 0; k < grid.length; k++) {
    const e = excess[k];
    if (Number.isFinite(e) && e > 0) {
      if (!open) {
        const p = k - 1;
        // the crossing between the last point below (or at) the target and this one
        const from = p >= 0 && Number.isFinite(excess[p]) ? grid[p] + ((0 - excess[p]) / (e - excess[p])) * (grid[k] - grid[p]) : grid[k];
        open = { fromRpm: from, toRpm: grid[k], maxExcessDb: e, atRpm: grid[k] };
      }
      open.toRpm = grid[k];
      if (e > open.maxExcessDb) {
        open.maxExcessDb = e;
        open.atRpm = grid[k];
      }
      continue;
    }
    if (open) {
      const p = k - 1;
      if (Number.isFinite(e)) open.toRpm = grid[p] + ((excess[p] - 0) / (excess[p] - e)) * (grid[k] - grid[p]);
      out.push(open);
      open = null;
    }
  }
  if (open) out.push(open);
  return out;
}

/**
 * A per-frame value (the carrier, Hz) against speed on the grid: the median of the frames in each bin,
 * NaN where no frame with a value fell. The median keeps a shift sharp (no blend of two carriers).
 */
export function medianOnSpeedGrid(frameRpm: ArrayLike<number>, values: ArrayLike<number>, grid: Float64Array, stepRpm: number): Float64Array {
  const out = new Float64Array(grid.length).fill(NaN);
  if (grid.length === 0) return out;
  const k0 = Math.round(grid[0] / stepRpm - 0.5);
  const bins: number[][] = Array.from({ length: grid.length }, () => []);
  for (let f = 0; f < frameRpm.length; f++) {
    const v = values[f];
    if (!Number.isFinite(frameRpm[f]) || !Number.isFinite(v)) continue;
    const k = Math.floor(frameRpm[f] / stepRpm) - k0;
    if (k >= 0 && k < grid.length) bins[k].push(v);
  }
  bins.forEach((b, k) => {
    if (b.length === 0) return;
    b.sort((x, y) => x - y);
    out[k] = b.length % 2 ? b[b.length >> 1] : (b[b.length / 2 - 1] + b[b.length / 2]) / 2;
  });
  return out;
}

/** A map against speed as speed-map.ts makes it: rpm bins × frequency bins of mean squares. */
export interface SpeedGridMap {
  rpm: Float64Array;
  power: Float32Array;
  bins: number;
}

/**
 * A run's map less the baseline's, in dB, over the speeds both cover: for each of the baseline's rpm
 * bins there, the run's bin nearest in speed (within `maxGapRpm`), frequency bin by frequency bin.
 * A cell either map lacks (no frame, or no power) is 0 dB: no difference shown. Both maps must have the
 * same frequency bins (the same sample rate and block).
 */
export function speedMapDifference(base: SpeedGridMap, run: SpeedGridMap, maxGapRpm: number): { rpm: Float64Array; diffDb: Float32Array; bins: number } {
  if (base.bins !== run.bins) throw new RangeError(`The runs' maps have different frequency bins (${base.bins} and ${run.bins}): compare runs with the same sample rate and block size.`);
  const bins = base.bins;
  // the baseline's bins with a run bin within reach, and that bin
  const pairs: [number, number][] = [];
  let j = 0;
  for (let i = 0; i < base.rpm.length; i++) {
    const r = base.rpm[i];
    while (j + 1 < run.rpm.length && Math.abs(run.rpm[j + 1] - r) <= Math.abs(run.rpm[j] - r)) j++;
    if (Math.abs(run.rpm[j] - r) <= maxGapRpm) pairs.push([i, j]);
  }
  const diffDb = new Float32Array(pairs.length * bins);
  pairs.forEach(([i, jj], k) => {
    const a = i * bins;
    const b = jj * bins;
    const out = k * bins;
    for (let f = 0; f < bins; f++) {
      const p0 = base.power[a + f];
      const p1 = run.power[b + f];
      diffDb[out + f] = p0 > 0 && p1 > 0 ? 10 * Math.log10(p1 / p0) : 0;
    }
  });
  const rows = pairs.map(([i]) => i);
  return { rpm: Float64Array.from(rows, (i) => base.rpm[i]), diffDb, bins };
}
