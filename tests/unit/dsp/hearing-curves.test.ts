/**
 * The hearing panel's shaping of the loudness and tonality series: max-hold thinning (common practice
 * for level displays: each bucket keeps its largest value, so a short peak survives) and the speed at
 * each moment read linearly between the map's frames (linear interpolation, checked on a linear run-up
 * where it is exact).
 */
import { describe, expect, it } from 'vitest';
import { maxHold, speedAtTimes } from '../../../workers/dsp/hearing-curves';

describe('hearing curves', () => {
  it('keeps a short peak when thinning a long series', () => {
    const n = 100_000;
    const t = Float64Array.from({ length: n }, (_, i) => i * 0.002);
    const v = new Float64Array(n).fill(1);
    v[54_321] = 7; // one 2 ms spike
    const thin = maxHold(t, v, 1000);
    expect(thin.t.length).toBe(1000);
    expect(Math.max(...thin.v)).toBe(7);
    expect(thin.t[thin.v.indexOf(7)]).toBeCloseTo(54_321 * 0.002, 9);
    // times stay in order
    for (let i = 1; i < thin.t.length; i++) expect(thin.t[i]).toBeGreaterThan(thin.t[i - 1]);
  });

  it('keeps the companion value of the kept sample (the tonal frequency of the strongest moment)', () => {
    const t = Float64Array.from({ length: 10 }, (_, i) => i);
    const v = Float64Array.from([1, 3, 2, 0, 5, 4, 1, 1, 9, 2]);
    const hz = Float64Array.from({ length: 10 }, (_, i) => 1000 + i);
    const thin = maxHold(t, v, 2, hz);
    expect(Array.from(thin.v)).toEqual([5, 9]);
    expect(Array.from(thin.c!)).toEqual([1004, 1008]);
  });

  it('leaves a short series as it is', () => {
    const thin = maxHold([0, 1, 2], [3, 2, 1], 10);
    expect(Array.from(thin.v)).toEqual([3, 2, 1]);
  });

  it('reads the speed of a linear run-up exactly, and NaN outside the frames', () => {
    const frameTimes = Float64Array.from({ length: 50 }, (_, i) => 0.1 + i * 0.2);
    const frameRpm = Float64Array.from(frameTimes, (t) => 500 + 400 * t);
    const rpm = speedAtTimes([0.05, 0.1, 1.234, 5.5, 9.9, 10], frameTimes, frameRpm);
    expect(rpm[0]).toBeNaN();
    expect(rpm[1]).toBeCloseTo(540, 9);
    expect(rpm[2]).toBeCloseTo(500 + 400 * 1.234, 9);
    expect(rpm[3]).toBeCloseTo(500 + 400 * 5.5, 9);
    expect(rpm[4]).toBeCloseTo(500 + 400 * 9.9, 9);
    expect(rpm[5]).toBeNaN();
  });
});
