/**
 * What the comparison shows, from the runs' published sessions: one track of every run on one speed
 * grid with its difference from the baseline, and every run's carrier against speed. The grid, the
 * power means and the deltas are workers/dsp/compare.ts, as the batch CLI's compare does them. No DOM.
 */
import { deltaDb, levelsDb, medianOnSpeedGrid, onSpeedGrid, speedGrid, speedRange } from '../../../../workers/dsp/compare';
import type { GuideTrack } from '../../../../workers/dsp/guide-tracks';
import { familyLabel } from '../../../../workers/dsp/guide-formula';
import type { InverterReport } from '../../../../workers/dsp/inverter-analysis';
import { db1 } from '../../../lib/tone-text';
import { carrierSummary, groupDigits } from '../analysis/findings-text';
import type { LevelReference } from '../map/level-reference';

export interface TrackComparison {
  grid: Float64Array;
  /** Per run, dB on the grid (NaN outside its speed range, or where the run has no such track yet) */
  db: Float64Array[];
  /** Per run, run − baseline, dB */
  delta: Float64Array[];
}

/** One line's track in every run (levels in dB against rpm, as the dock computed them), the baseline first. */
export function compareTrack(tracks: (GuideTrack | null)[], stepRpm: number): TrackComparison {
  const ranges = tracks.filter((t): t is GuideTrack => t !== null).map((t) => speedRange(t.x, t.db));
  const grid = speedGrid(ranges, stepRpm);
  const db = tracks.map((t) => (t ? levelsDb(onSpeedGrid(t.x, Float64Array.from(t.db, (v) => 10 ** (v / 20)), grid, stepRpm), 1) : new Float64Array(grid.length).fill(NaN)));
  return { grid, db, delta: db.map((d) => deltaDb(d, db[0])) };
}

/** Every run's carrier against speed on one grid: the median of its frames in each bin. */
export function compareCarriers(runs: { frameRpm: Float64Array | null; carrierHz: ArrayLike<number> | null }[], stepRpm: number): { grid: Float64Array; hz: Float64Array[] } {
  const ranges = runs.filter((r) => r.frameRpm).map((r) => speedRange(r.frameRpm!, r.frameRpm!));
  const grid = speedGrid(ranges, stepRpm);
  return {
    grid,
    hz: runs.map((r) => (r.frameRpm && r.carrierHz ? medianOnSpeedGrid(r.frameRpm, r.carrierHz, grid, stepRpm) : new Float64Array(grid.length).fill(NaN))),
  };
}

export interface FindingsRow {
  carrier: string;
  shifts: string;
  spread: string;
  poles: string;
  families: string;
}

/** A run's findings in words, as the comparison's table and a saved comparison show them. */
export function findingsRow(r: InverterReport | null, reference: LevelReference): FindingsRow | null {
  if (!r) return null;
  const top = r.strongestFamilies.filter((f) => f.peakRms > 0 && Number.isFinite(f.peakRpm)).slice(0, 3);
  return {
    carrier: carrierSummary(r),
    shifts: r.carrierShifts.length ? r.carrierShifts.map((s) => `${groupDigits(s.fromHz)} → ${groupDigits(s.toHz)} Hz at ${groupDigits(s.rpm)} rpm`).join('; ') : 'none',
    spread: r.carrierSpreadHz === null ? 'steady' : `${groupDigits(r.carrierSpreadHz)} Hz`,
    poles: r.polePairs.value === null ? '—' : `${r.polePairs.value}${r.polePairs.ambiguous ? ' (ambiguous)' : ''}`,
    families: top.map((f) => `${familyLabel(f.m, f.n)} ${db1(20 * Math.log10(f.peakRms / reference.refRms))} dB`).join(', '),
  };
}
