/**
 * Tracks where two guides cross: the band sum holds both components, so the findings take each one's level
 * from the coupled Vold–Kalman filter there (Vold & Leuridan, SAE 931288, 1993) and say which points it
 * served. Known by construction: an order and a carrier family of constant, different amplitudes whose
 * frequencies cross during a run-up (levels invented for the test).
 */
import { describe, expect, it } from 'vitest';
import { analyseInverter } from '../../../workers/dsp/inverter-analysis';
import { A_FAMILY as aFam, A_ORDER as a48, crossingRunUp, P } from '../../support/crossing-run-up';

const db = (x: number) => 20 * Math.log10(x);

describe('tracks at crossings (Vold–Kalman)', async () => {
  // order 48 meets fc − fe (3000 − 4·rpm/60 Hz) at about 3460 rpm
  const { x, layout, win, power, frameRpm } = await crossingRunUp();
  const common = { power, layout, window: 'hann' as const, enbwBins: win.enbwBins, frameRpm, polePairs: P, orders: [48], families: [{ m: 1, n: -1 }] };
  const withCarrier = (samples?: Float32Array) => {
    const report = analyseInverter({ ...common, samples });
    return report;
  };

  it('serves exactly the crossing points from the filter, each component within 1 dB of its amplitude there', () => {
    const report = withCarrier(x);
    const o = report.orders[0];
    const fam = report.families[0];
    const crossed = o.crossing.map((c, i) => (c ? i : -1)).filter((i) => i >= 0);
    expect(crossed.length).toBeGreaterThan(0);
    for (const i of crossed) expect(o.filtered[i]).toBe(true);
    expect(o.filtered.filter((f, i) => f && !o.crossing[i])).toEqual([]);
    // the points the filter served read each component alone
    for (const i of crossed) expect(Math.abs(db(o.rms[i]) - db(a48 / Math.SQRT2))).toBeLessThan(1);
    const famCrossed = fam.crossing.map((c, i) => (c ? i : -1)).filter((i) => i >= 0);
    for (const i of famCrossed) {
      expect(fam.filtered[i]).toBe(true);
      expect(Math.abs(db(fam.rms[i]) - db(aFam / Math.SQRT2))).toBeLessThan(1);
    }
  });

  it('without the samples the crossing points stay band sums (flagged, not filtered)', () => {
    const report = withCarrier();
    const fam = report.families[0];
    expect(fam.filtered.every((f) => !f)).toBe(true);
    const famCrossed = fam.crossing.map((c, i) => (c ? i : -1)).filter((i) => i >= 0);
    // the band sum there holds the order too: several dB above the family alone
    expect(Math.max(...famCrossed.map((i) => db(fam.rms[i]) - db(aFam / Math.SQRT2)))).toBeGreaterThan(3);
  });
});
