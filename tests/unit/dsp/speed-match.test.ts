/**
 * timeAtSameSpeed (workers/dsp/speed-match.ts) on speed curves whose answers follow from their formulas:
 * a linear run-up r(t) = r0 + a·t reaches r at t = (r − r0)/a; a run-up then coast-down passes each speed
 * twice. Linear interpolation between the curve's points (common practice), as rpmAt does.
 */
import { describe, expect, it } from 'vitest';
import { rpmAt, speedFromRamp, type SpeedCurve } from '../../../workers/dsp/speed';
import { timeAtSameSpeed } from '../../../workers/dsp/speed-match';

// 20 s run-up, 1000 → 5000 rpm (200 rpm/s), points every 10 ms
const runUp = speedFromRamp([{ tS: 0, rpm: 1000 }, { tS: 20, rpm: 5000 }], 20);
// coast-down 5000 → 1000 rpm over 16 s
const coast = speedFromRamp([{ tS: 0, rpm: 5000 }, { tS: 16, rpm: 1000 }], 16);
// up 1000 → 4000 rpm in 10 s (300 rpm/s), then down to 2000 rpm at 20 s (200 rpm/s)
const upDown = speedFromRamp([{ tS: 0, rpm: 1000 }, { tS: 10, rpm: 4000 }, { tS: 20, rpm: 2000 }], 20);

describe('timeAtSameSpeed', () => {
  it('finds the time of a speed on a monotonic run-up: t = (r − r0)/a', () => {
    expect(timeAtSameSpeed(runUp, 3000)).toBeCloseTo(10, 9);
    expect(timeAtSameSpeed(runUp, 1234.5)).toBeCloseTo(234.5 / 200, 9);
  });

  it('finds it on a coast-down', () => {
    expect(timeAtSameSpeed(coast, 2000)).toBeCloseTo((5000 - 2000) / 250, 9);
  });

  it('on a run-up then coast-down, takes the first crossing, or the one nearest the time given', () => {
    expect(timeAtSameSpeed(upDown, 3000)).toBeCloseTo(2000 / 300, 9);
    expect(timeAtSameSpeed(upDown, 3000, 4)).toBeCloseTo(2000 / 300, 9);
    expect(timeAtSameSpeed(upDown, 3000, 14)).toBeCloseTo(10 + 1000 / 200, 9);
    // 1500 rpm is passed only on the way up (the coast-down stops at 2000)
    expect(timeAtSameSpeed(upDown, 1500, 19)).toBeCloseTo(500 / 300, 9);
  });

  it('returns null for a speed the run never reaches, and takes the nearest end within 1 %', () => {
    expect(timeAtSameSpeed(runUp, 6000)).toBeNull();
    expect(timeAtSameSpeed(runUp, 900)).toBeNull();
    expect(timeAtSameSpeed(runUp, 5040)).toBeCloseTo(20, 9); // 0.8 % above the top: the top
    expect(timeAtSameSpeed(runUp, 995)).toBeCloseTo(0, 9);
    expect(timeAtSameSpeed(runUp, Number.NaN)).toBeNull();
    expect(timeAtSameSpeed({ tS: new Float64Array(0), rpm: new Float64Array(0) }, 1000)).toBeNull();
  });

  it('gives a time whose speed is within 0.1 % of the one asked, on an uneven curve', () => {
    // a curve with uneven steps and a non-linear law: r(t) = 1000 + 150·t + 20·t² sampled at jittered times
    const t = Float64Array.from({ length: 200 }, (_, i) => i * 0.1 + 0.03 * Math.sin(i * 1.7));
    const curve: SpeedCurve = { tS: t, rpm: t.map((v) => 1000 + 150 * v + 20 * v * v) };
    for (const r of [1100, 2345, 5000, 9000]) {
      const found = timeAtSameSpeed(curve, r);
      expect(found).not.toBeNull();
      expect(Math.abs(rpmAt(curve, found!) - r) / r).toBeLessThan(0.001);
    }
  });
});
