/**
 * Tracks where two guides cross: the band sum holds both components, so the findings take each one's level
 * from the coupled Vold–Kalman filter there (Vold & Leuridan, SAE 931288, 1993) and say which points it
 * served. Known by construction: an order and a carrier family of constant, different amplitudes whose
 * frequencies cross during a run-up (levels invented for the test).
 */
import { describe, expect, it } from 'vitest';
import { createRealFft } from '../../../workers/dsp/fft';
import { analyseInverter } from '../../../workers/dsp/inverter-analysis';
import { computeFrames, frameTimeS, stftLayout } from '../../../workers/dsp/stft';
import { makeWindow } from '../../../workers/dsp/window';
import { tone } from '../../support/tones';

const FS = 25600;
const T = 6;
const N = FS * T;
const rpm = (t: number) => 1000 + 500 * t; // 1000 → 4000 rpm
const FC = 3000;
const P = 4;
const db = (x: number) => 20 * Math.log10(x);

describe('tracks at crossings (Vold–Kalman)', async () => {
  // order 48 meets fc − fe (3000 − 4·rpm/60 Hz) at about 3460 rpm
  const a48 = 0.3;
  const aFam = 0.12;
  const order = tone(N, FS, (t) => (48 * rpm(t)) / 60, () => a48, 0.2);
  const family = tone(N, FS, (t) => FC - (P * rpm(t)) / 60, () => aFam, 1.0);
  // its partner fc + fe, so that the carrier is found from the symmetric pair (it crosses nothing here)
  const partner = tone(N, FS, (t) => FC + (P * rpm(t)) / 60, () => aFam, -0.5);
  const x = Float32Array.from(order, (v, i) => v + family[i] + partner[i]);
  const layout = stftLayout(N, FS, { window: 'hann', blockSize: 4096, overlap: 0.75 });
  const win = makeWindow('hann', 4096);
  const power = new Float32Array(layout.frames * layout.bins);
  computeFrames(x, 0, layout, win, await createRealFft(4096), 0, layout.frames, power);
  const frameRpm = Float64Array.from({ length: layout.frames }, (_, f) => rpm(frameTimeS(layout, f)));
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
