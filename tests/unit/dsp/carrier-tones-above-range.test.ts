/**
 * Carrier tones above ECMA-418-1's range (11.2 kHz), where most inverter whines sit: on a microphone
 * they are still listed, with no TNR or PR (ECMA-418-1 defines them from 89.1 Hz to 11.2 kHz only) but
 * with their level, their height over the ISO 389-7 threshold and their ISO/TS 20065 audibility.
 *
 * Expected values worked out by hand from the construction (invented signal, known answers):
 * a line of peak amplitude A has the level 10·lg((A²/2)/(20 µPa)²) (ISO 1683 reference); white noise of
 * RMS σ sampled at fs has the one-sided density σ²/(fs/2) Pa²/Hz, so the masking noise in the critical
 * band is L_G = 10·lg(σ²·Δf_c/(fs/2)/(20 µPa)²), with Δf_c = 25 + 75·(1 + 1.4·(f/kHz)²)^0.69 Hz and the
 * masking index a_v = −2 − lg(1 + (f/502 Hz)^2.5) dB (ISO/TS 20065:2016 clause 5); ΔL = L_T − L_G − a_v.
 */
import { describe, expect, it } from 'vitest';
import { synthesiseDrive } from '../../../seeds/synthetic-drive';
import { analyseSignal } from '../../support/analyse-signal';

const FS = 51200;
const REF = 20e-6;
const A = 0.02; // Pa peak
const SIGMA = 0.002; // Pa RMS of the white noise

describe('carrier tones above 11.2 kHz on a microphone', async () => {
  const rpm = (t: number) => 3000 + 200 * t;
  const x = synthesiseDrive({
    fsHz: FS,
    durationS: 6,
    rpm,
    polePairs: 4,
    carrierHz: () => 14000,
    families: [
      { m: 1, n: 1, amplitude: A },
      { m: 1, n: -1, amplitude: A },
    ],
    noiseRms: SIGMA,
    seed: 29,
  });
  const { report } = await analyseSignal(x, FS, rpm, { polePairs: 4, soundPressure: true, tonalityAtS: 3 });
  const { report: vibration } = await analyseSignal(x, FS, rpm, { polePairs: 4, tonalityAtS: 3 });

  it('lists them with no TNR or PR, their level and their height over the threshold of hearing', () => {
    const high = report.tonality.tones.filter((t) => !t.inTnrPrRange);
    // the two sidebands; family lines in the noise floor (10 dB or more under the masked threshold) are left out
    expect(high.length).toBe(2);
    const levelDb = 10 * Math.log10(A ** 2 / 2 / REF ** 2); // 57.0 dB
    for (const t of high.slice(0, 2)) {
      expect(Math.abs(t.n)).toBe(1);
      expect(t.hz).toBeGreaterThan(11200);
      expect(t.tnrDb).toBeNull();
      expect(t.prDb).toBeNull();
      expect(t.prominent).toBe(false);
      expect(Math.abs(t.levelDb! - levelDb)).toBeLessThan(1);
      // ISO 389-7 rises steeply above 12.5 kHz: the margin is the level less a threshold of 10–25 dB there
      expect(t.aboveThresholdDb!).toBeLessThan(t.levelDb! - 5);
      expect(t.aboveThresholdDb!).toBeGreaterThan(t.levelDb! - 35);
    }
  });

  it('gives each the audibility over the masking noise of ISO/TS 20065, as worked out by hand', () => {
    for (const t of report.tonality.tones.filter((x) => !x.inTnrPrRange).slice(0, 2)) {
      const f = t.hz;
      const bandHz = 25 + 75 * (1 + 1.4 * (f / 1000) ** 2) ** 0.69;
      const lg = 10 * Math.log10((SIGMA ** 2 * bandHz) / (FS / 2) / REF ** 2);
      const av = -2 - Math.log10(1 + (f / 502) ** 2.5);
      const expected = 10 * Math.log10(A ** 2 / 2 / REF ** 2) - lg - av;
      // the other sideband sits 2·fe away, outside the noise lines TS 20065 averages only in part: 1.5 dB
      expect(Math.abs(t.audibilityDb! - expected)).toBeLessThan(1.5);
    }
  });

  it('leaves tones above the range out for a channel that is not sound pressure (no ear to judge by)', () => {
    expect(vibration.tonality.tones.every((t) => t.inTnrPrRange)).toBe(true);
    expect(vibration.tonality.tones.every((t) => t.audibilityDb === null)).toBe(true);
  });
});
