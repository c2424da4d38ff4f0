/**
 * Runs on one speed grid: bins, power means, interpolation across empty bins, deltas and the speed
 * intervals above a target. Hand-computed cases (common practice: power mean of the points in a bin,
 * linear interpolation in dB, crossings of the 0 dB excess interpolated linearly).
 */
import { describe, expect, it } from 'vitest';
import { deltaDb, exceedances, levelsDb, medianOnSpeedGrid, onSpeedGrid, speedGrid, speedMapDifference } from '../../../workers/dsp/compare';
import { targetAt } from '../../../workers/io/target-csv';

describe('the speed grid', () => {
  it('covers every run with bin centres (k + ½)·step', () => {
    const g = speedGrid([[1020, 2980], [1500, 2500]], 100);
    expect(g.length).toBe(20);
    expect(g[0]).toBe(1050);
    expect(g[19]).toBe(2950);
  });

  it('takes the power mean of the points in a bin: 1 and 3 → √5', () => {
    const g = speedGrid([[1000, 1099]], 100);
    const v = onSpeedGrid([1000, 1050], [1, 3], g, 100);
    expect(v[0]).toBeCloseTo(Math.sqrt(5), 12);
  });

  it('reads a coast-down as it reads the run-up', () => {
    const rpm = Array.from({ length: 41 }, (_, i) => 1000 + 50 * i);
    const rms = rpm.map((r) => r / 1000);
    const g = speedGrid([[1000, 3000]], 100);
    const up = onSpeedGrid(rpm, rms, g, 100);
    const down = onSpeedGrid([...rpm].reverse(), [...rms].reverse(), g, 100);
    expect(Array.from(down)).toEqual(Array.from(up));
  });

  it('leaves the grid empty outside a run that covers part of it', () => {
    const g = speedGrid([[1000, 3000]], 100);
    const a = onSpeedGrid([1000, 1500, 2000], [1, 1, 1], g, 100);
    expect(Number.isNaN(a[g.indexOf(2450)])).toBe(true);
    expect(a[g.indexOf(1250)]).toBeCloseTo(1, 12); // inside: interpolated between 1000 and 1500
  });

  it('interpolates in dB across empty bins: 0 dB at 1050 rpm, 20 dB at 1350 rpm → 6.67 and 13.33 dB between', () => {
    const g = speedGrid([[1000, 1399]], 100);
    const db = levelsDb(onSpeedGrid([1050, 1350], [1, 10], g, 100), 1);
    expect(db[1]).toBeCloseTo(20 / 3, 9);
    expect(db[2]).toBeCloseTo(40 / 3, 9);
  });

  it('gives deltas only where both runs have a level', () => {
    const d = deltaDb(Float64Array.from([1, 5, NaN]), Float64Array.from([0, 8, 3]));
    expect(Array.from(d.slice(0, 2))).toEqual([1, -3]);
    expect(Number.isNaN(d[2])).toBe(true);
  });

  it('takes the median carrier of the frames in each bin (a shift stays sharp)', () => {
    const g = speedGrid([[1000, 1199]], 100);
    const fc = medianOnSpeedGrid([1010, 1020, 1030, 1110, 1120], [8000, 8000, 12000, 12000, 12000], g, 100);
    expect(Array.from(fc)).toEqual([8000, 12000]);
  });
});

describe('exceedances of a target', () => {
  const grid = Float64Array.from([1000, 1100, 1200, 1300, 1400]);
  it('start and end where the excess crosses 0 dB, with the largest excess and where', () => {
    const level = Float64Array.from([-10, -4, 2, 6, -2]);
    const [e, ...rest] = exceedances(grid, level, () => 0);
    expect(rest).toEqual([]);
    expect(e.fromRpm).toBeCloseTo(1100 + (4 / 6) * 100, 9);
    expect(e.toRpm).toBeCloseTo(1300 + (6 / 8) * 100, 9);
    expect(e.maxExcessDb).toBe(6);
    expect(e.atRpm).toBe(1300);
  });

  it('follow a piecewise-linear target and stop where the target stops', () => {
    const points: [number, number][] = [
      [1000, -20],
      [1200, 0],
    ];
    // target −20, −10, 0 at 1000, 1100, 1200; none beyond
    const level = Float64Array.from([-25, -5, 5, 30, 30]);
    const [e] = exceedances(grid, level, (r) => targetAt(points, r));
    // excess −5 at 1000, +5 at 1100: the crossing is at 1050
    expect(e.fromRpm).toBeCloseTo(1050, 9);
    expect(e.toRpm).toBe(1200);
    expect(e.maxExcessDb).toBe(5);
  });
});

describe('the difference of two maps against speed', () => {
  it('is run − baseline in dB over the speeds both cover, bin by bin (10·lg of the power ratio)', () => {
    const base = { rpm: Float64Array.from([1000, 1100, 1200, 1300]), bins: 2, power: Float32Array.from([1, 1, 1, 2, 1, 4, 1, 8]) };
    // the run starts later and sits 5 rpm off the baseline's bins; its power doubles (+3.01 dB) and holds
    const run = { rpm: Float64Array.from([1105, 1205, 1305, 1405]), bins: 2, power: Float32Array.from([2, 4, 2, 8, 2, 16, 2, 32]) };
    const d = speedMapDifference(base, run, 50);
    expect(Array.from(d.rpm)).toEqual([1100, 1200, 1300]);
    for (let k = 0; k < d.diffDb.length; k++) expect(d.diffDb[k]).toBeCloseTo(10 * Math.log10(2), 5);
  });

  it('refuses maps with different frequency bins', () => {
    const a = { rpm: Float64Array.from([1000]), bins: 2, power: new Float32Array(2) };
    const b = { rpm: Float64Array.from([1000]), bins: 3, power: new Float32Array(3) };
    expect(() => speedMapDifference(a, b, 50)).toThrow(/different frequency bins/);
  });
});
