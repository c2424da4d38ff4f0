/**
 * The map against speed as a MapRaster, so it paints, probes and zooms like the map against time: its
 * columns are rpm bins (its grid's x is rpm, its step the rpm step). An rpm bin that no frame
 * fell in shows its nearest filled neighbour within a few bins (a fast run-up skips bins), else
 * nothing.
 */
import type { SpeedMap } from '../../../../workers/dsp/speed-map';
import type { StftLayout } from '../../../../workers/dsp/stft';
import type { Weighting } from '../../../../workers/dsp/weighting';
import { MapRaster } from './map-raster';

const FILL_BINS = 4;

export interface SpeedRaster {
  raster: MapRaster;
  map: SpeedMap;
  rpmStep: number;
  /** For each rpm bin, the bin whose spectrum it shows (−1 for none) */
  shown: Int32Array;
}

/** About 400 rpm bins over the run, in whole steps of 5 rpm. */
export function speedStep(frameRpm: Float64Array): number {
  let lo = Infinity;
  let hi = -Infinity;
  for (const r of frameRpm) {
    if (Number.isFinite(r)) {
      lo = Math.min(lo, r);
      hi = Math.max(hi, r);
    }
  }
  if (!(hi > lo)) return 5;
  return Math.max(5, Math.round((hi - lo) / 400 / 5) * 5);
}

export function speedRaster(map: SpeedMap, layout: StftLayout, rpmStep: number, weighting: Weighting, refRms: number): SpeedRaster | null {
  const n = map.rpm.length;
  if (n === 0) return null;
  const shown = new Int32Array(n).fill(-1);
  for (let i = 0; i < n; i++) {
    if (map.counts[i] > 0) {
      shown[i] = i;
      continue;
    }
    for (let d = 1; d <= FILL_BINS; d++) {
      if (i - d >= 0 && map.counts[i - d] > 0) {
        shown[i] = i - d;
        break;
      }
      if (i + d < n && map.counts[i + d] > 0) {
        shown[i] = i + d;
        break;
      }
    }
  }
  const bins = map.bins;
  const filled = new Float32Array(n * bins);
  for (let i = 0; i < n; i++) {
    if (shown[i] < 0) filled.fill(NaN, i * bins, (i + 1) * bins);
    else filled.set(map.power.subarray(shown[i] * bins, (shown[i] + 1) * bins), i * bins);
  }
  const raster = new MapRaster({ columns: n, x0: map.rpm[0], xStep: rpmStep, bins: layout.bins, binHz: layout.binHz }, weighting, refRms);
  raster.add(0, n, filled);
  return { raster, map, rpmStep, shown };
}
