import { speedMapDifference } from '../../../../workers/dsp/compare';
import type { SpeedRaster } from '../map/speed-raster';
import { MapRaster } from '../map/map-raster';

/** ± this many dB span the difference map's colours. */
export const DIFFERENCE_RANGE_DB = 20;

/**
 * A run's map against speed less the baseline's (speedMapDifference) as a raster the map view paints:
 * each cell holds 10^(ΔL/10), so the raster's level (10·lg, reference 1, no weighting) is ΔL in dB.
 */
export function differenceRaster(baseline: SpeedRaster, run: SpeedRaster): { raster: MapRaster; fromRpm: number; toRpm: number; stepRpm: number } | { problem: string } {
  const step = Math.max(baseline.rpmStep, run.rpmStep);
  let d;
  try {
    d = speedMapDifference(baseline.map, run.map, step);
  } catch (e) {
    return { problem: e instanceof Error ? e.message : String(e) };
  }
  if (d.rpm.length < 2) return { problem: 'The two runs share too little of their speed range to compare maps.' };
  const raster = new MapRaster({ columns: d.rpm.length, x0: d.rpm[0], xStep: baseline.rpmStep, bins: d.bins, binHz: baseline.raster.grid.binHz }, 'Z', 1);
  raster.add(0, d.rpm.length, Float32Array.from(d.diffDb, (v) => 10 ** (v / 10)));
  return { raster, fromRpm: d.rpm[0], toRpm: d.rpm[d.rpm.length - 1], stepRpm: baseline.rpmStep };
}
