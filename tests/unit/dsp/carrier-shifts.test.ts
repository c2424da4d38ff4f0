/**
 * Carrier steps and the levels passed through during a switch. The carrier schedules here are known by
 * construction (synthesised; invented values). While detectCarrier's vote window (0.6 s) straddles a
 * switch, the two carriers' votes are split and an order sweeping through can win for a moment: such a
 * passing level, held for less than the window, is not a shift of its own.
 */
import { describe, expect, it } from 'vitest';
import { analyseSignal } from '../../support/analyse-signal';
import { VOTE_WINDOW_S } from '../../../workers/dsp/carrier';
import { carrierShifts } from '../../../workers/dsp/carrier-shifts';
import { synthesiseDrive } from '../../../seeds/synthetic-drive';

const HOP_S = 0.04;
const BIN_HZ = 6.25;
const time = (f: number) => f * HOP_S;

/** A carrier track of levels held for the given seconds. */
function track(levels: [hz: number, seconds: number][]): Float64Array {
  const out: number[] = [];
  for (const [hz, s] of levels) for (let i = 0; i < Math.round(s / HOP_S); i++) out.push(hz);
  return Float64Array.from(out);
}

const rpmOf = (n: number) => Float64Array.from({ length: n }, (_, f) => 1000 + 100 * f);

describe('carrier shifts', () => {
  it('a level passed through for less than the vote window is no shift: 8 → (4) → 10 kHz is one step', () => {
    const c = track([[8000, 5], [4018.75, 0.36], [10000, 5]]);
    const shifts = carrierShifts(c, time, rpmOf(c.length), BIN_HZ);
    expect(shifts).toHaveLength(1);
    expect(shifts[0].fromHz).toBe(8000);
    expect(shifts[0].toHz).toBe(10000);
    // at the middle of the passing level, within one vote window of where 8 kHz ended (5 s)
    expect(Math.abs(shifts[0].t - 5.18)).toBeLessThan(VOTE_WINDOW_S);
  });

  it('a blip away and back within the window is no shift at all', () => {
    const c = track([[8000, 5], [2000, 0.4], [8000, 5]]);
    expect(carrierShifts(c, time, rpmOf(c.length), BIN_HZ)).toEqual([]);
  });

  it('a level held longer than the window stays a level: two shifts', () => {
    const c = track([[8000, 5], [10000, 1.5], [12000, 5]]);
    const shifts = carrierShifts(c, time, rpmOf(c.length), BIN_HZ);
    expect(shifts.map((s) => [s.fromHz, s.toHz])).toEqual([
      [8000, 10000],
      [10000, 12000],
    ]);
  });

  it('on a run-up whose 48th order crosses 4 kHz as the carrier switches from 8 to 10 kHz, one shift', async () => {
    const FS = 51200;
    const T = 20;
    const rpm = (t: number) => 1000 + (8000 * t) / T;
    const carrier = (t: number) => (rpm(t) < 5000 ? 8000 : 10000);
    const x = synthesiseDrive({
      fsHz: FS,
      durationS: T,
      rpm,
      polePairs: 4,
      carrierHz: carrier,
      orders: [
        { order: 8, amplitude: 0.05 },
        { order: 48, amplitude: 0.03 },
      ],
      families: [
        { m: 1, n: 1, amplitude: 0.02 },
        { m: 1, n: -1, amplitude: 0.02 },
      ],
      noiseRms: 0.002,
      seed: 3,
    });
    const { layout, report } = await analyseSignal(x, FS, rpm);
    expect(report.carrierShifts).toHaveLength(1);
    const [s] = report.carrierShifts;
    expect(Math.abs(s.rpm - 5000) / 5000).toBeLessThan(0.02);
    expect(Math.abs(s.fromHz - 8000)).toBeLessThanOrEqual(layout.binHz);
    expect(Math.abs(s.toHz - 10000)).toBeLessThanOrEqual(layout.binHz);
  });
});
