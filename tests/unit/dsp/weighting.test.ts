import { describe, expect, it } from 'vitest';
import { WEIGHTING_POLES_HZ, weightingDb, weightingGainsPower } from '../../../workers/dsp/weighting';

// IEC 61672-1:2013 Table 3, frequency weightings A and C at the nominal one-third-octave frequencies,
// 0.1 dB resolution [x, nominal label (Hz), A (dB), C (dB)]. The table belongs to the exact base-10
// mid-band frequency 1000·10^(x/10) Hz, not to the label.
const TABLE_3: ReadonlyArray<readonly [number, number, number, number]> = [
  [-20, 10, -70.4, -14.3],
  [-19, 12.5, -63.4, -11.2],
  [-18, 16, -56.7, -8.5],
  [-17, 20, -50.5, -6.2],
  [-16, 25, -44.7, -4.4],
  [-15, 31.5, -39.4, -3.0],
  [-14, 40, -34.6, -2.0],
  [-13, 50, -30.2, -1.3],
  [-12, 63, -26.2, -0.8],
  [-11, 80, -22.5, -0.5],
  [-10, 100, -19.1, -0.3],
  [-9, 125, -16.1, -0.2],
  [-8, 160, -13.4, -0.1],
  [-7, 200, -10.9, 0.0],
  [-6, 250, -8.6, 0.0],
  [-5, 315, -6.6, 0.0],
  [-4, 400, -4.8, 0.0],
  [-3, 500, -3.2, 0.0],
  [-2, 630, -1.9, 0.0],
  [-1, 800, -0.8, 0.0],
  [0, 1000, 0.0, 0.0],
  [1, 1250, 0.6, 0.0],
  [2, 1600, 1.0, -0.1],
  [3, 2000, 1.2, -0.2],
  [4, 2500, 1.3, -0.3],
  [5, 3150, 1.2, -0.5],
  [6, 4000, 1.0, -0.8],
  [7, 5000, 0.5, -1.3],
  [8, 6300, -0.1, -2.0],
  [9, 8000, -1.1, -3.0],
  [10, 10000, -2.5, -4.4],
  [11, 12500, -4.3, -6.2],
  [12, 16000, -6.6, -8.5],
  [13, 20000, -9.3, -11.2],
];

// The Annex E expressions evaluated at the exact mid-band frequencies, 0.01 dB [x, A (dB), C (dB)]
// (shared/references.md §1, computed values [C]).
const COMPUTED_AT_FM: ReadonlyArray<readonly [number, number, number]> = [
  [-20, -70.43, -14.33], [-19, -63.37, -11.25], [-18, -56.69, -8.53], [-17, -50.45, -6.24],
  [-16, -44.7, -4.41], [-15, -39.44, -3.01], [-14, -34.63, -2.0], [-13, -30.23, -1.29],
  [-12, -26.19, -0.82], [-11, -22.5, -0.5], [-10, -19.14, -0.3], [-9, -16.1, -0.17],
  [-8, -13.35, -0.09], [-7, -10.87, -0.03], [-6, -8.63, 0.0], [-5, -6.61, 0.02],
  [-4, -4.81, 0.03], [-3, -3.23, 0.03], [-2, -1.9, 0.03], [-1, -0.82, 0.02],
  [0, 0.0, 0.0], [1, 0.59, -0.03], [2, 0.98, -0.09], [3, 1.2, -0.17],
  [4, 1.27, -0.3], [5, 1.2, -0.5], [6, 0.97, -0.82], [7, 0.55, -1.29],
  [8, -0.12, -2.0], [9, -1.11, -3.01], [10, -2.49, -4.41], [11, -4.32, -6.24],
  [12, -6.6, -8.53], [13, -9.32, -11.25],
];

// Exact base-10 mid-band frequency (IEC 61260-1:2014), written out here so this test does not lean
// on the band module.
const exactMidbandHz = (x: number) => 1000 * 10 ** (x / 10);

// Rounds to 0.1 dB as the table does; "+ 0" turns −0 into 0.
const toTenth = (v: number) => Number(v.toFixed(1)) + 0;

describe('weightingDb', () => {
  it('derives the Annex E pole frequencies from fr, fL, fH, D and fA', () => {
    // IEC 61672-1:2013 Annex E: f1 = 20.598997, f2 = 107.65265, f3 = 737.86223, f4 = 12194.217 Hz.
    expect(WEIGHTING_POLES_HZ.f1).toBeCloseTo(20.598997, 6);
    expect(WEIGHTING_POLES_HZ.f2).toBeCloseTo(107.65265, 5);
    expect(WEIGHTING_POLES_HZ.f3).toBeCloseTo(737.86223, 5);
    expect(WEIGHTING_POLES_HZ.f4).toBeCloseTo(12194.217, 3);
  });

  it('is exactly 0 dB at 1 kHz for A, C and Z', () => {
    // IEC 61672-1:2013 Annex E normalisation: the weightings are 0 dB at the reference frequency 1 kHz.
    expect(Math.abs(weightingDb('A', 1000))).toBeLessThan(1e-12);
    expect(Math.abs(weightingDb('C', 1000))).toBeLessThan(1e-12);
    expect(weightingDb('Z', 1000)).toBe(0);
  });

  it.each(TABLE_3)('matches IEC 61672-1 Table 3 at x = %i (%s Hz)', (x, _label, aTab, cTab) => {
    // IEC 61672-1:2013 Table 3, ±0.05 dB about the 0.1 dB entries, at the exact mid-band frequency.
    // 160 Hz (x = −8) is −13.3503 dB: within 0.05 dB of −13.4 and rounding to it only because the
    // normalisation uses the computed A(1 kHz) = −1.99966 dB, not −2.000 (shared/references.md §1).
    const f = exactMidbandHz(x);
    const a = weightingDb('A', f);
    const c = weightingDb('C', f);
    expect(Math.abs(a - aTab)).toBeLessThanOrEqual(0.05);
    expect(Math.abs(c - cTab)).toBeLessThanOrEqual(0.05);
    expect(toTenth(a)).toBe(aTab);
    expect(toTenth(c)).toBe(cTab);
    expect(weightingDb('Z', f)).toBe(0);
  });

  it.each(COMPUTED_AT_FM)('agrees with the Annex E values computed at x = %i to 0.01 dB', (x, aC, cC) => {
    // shared/references.md §1, columns A(fm) and C(fm), computed values [C].
    const f = exactMidbandHz(x);
    expect(weightingDb('A', f)).toBeCloseTo(aC, 2);
    expect(weightingDb('C', f)).toBeCloseTo(cC, 2);
  });

  it('differs from the table when evaluated at the label rather than the exact mid-band', () => {
    // shared/references.md §1 pitfalls [C]: 12.5 Hz gives −63.58 dB (table −63.4 at 12.589 Hz),
    // 16 kHz gives −6.71 dB (table −6.6 at 15.849 kHz).
    expect(weightingDb('A', 12.5)).toBeCloseTo(-63.58, 2);
    expect(weightingDb('A', 16000)).toBeCloseTo(-6.71, 2);
  });

  it('has its A maximum of about +1.27 dB near 2.5 kHz', () => {
    // shared/references.md §1 [C]: maximum +1.2707 dB near 2.512 kHz; A(50 Hz) −30.27, A(120 Hz) −16.71 dB.
    let best = -Infinity;
    let bestHz = 0;
    for (let f = 1000; f <= 5000; f += 0.5) {
      const a = weightingDb('A', f);
      if (a > best) {
        best = a;
        bestHz = f;
      }
    }
    expect(best).toBeCloseTo(1.2707, 3);
    expect(Math.abs(bestHz - 2512)).toBeLessThan(30);
    expect(weightingDb('A', 50)).toBeCloseTo(-30.27, 2);
    expect(weightingDb('A', 120)).toBeCloseTo(-16.71, 2);
  });

  it('is −Infinity at 0 Hz for A and C, 0 dB for Z', () => {
    // IEC 61672-1:2013 Annex E: A has four and C two zeros at f = 0.
    expect(weightingDb('A', 0)).toBe(-Infinity);
    expect(weightingDb('C', 0)).toBe(-Infinity);
    expect(weightingDb('Z', 0)).toBe(0);
  });

  it('rises as f⁴ (A) and f² (C) far below f1 and falls as f⁻² far above f4', () => {
    // IEC 61672-1:2013 Annex E expressions: A has four zeros and C two at f = 0; both have a double
    // pole at f4, so the amplitude goes as f⁴ / f² at the bottom and as f⁻² at the top.
    const perDoubling = (w: 'A' | 'C', f: number) => weightingDb(w, 2 * f) - weightingDb(w, f);
    const sixDb = 20 * Math.log10(2);
    expect(perDoubling('A', 0.01)).toBeCloseTo(4 * sixDb, 3);
    expect(perDoubling('C', 0.01)).toBeCloseTo(2 * sixDb, 3);
    expect(perDoubling('A', 1e8)).toBeCloseTo(-2 * sixDb, 3);
    expect(perDoubling('C', 1e8)).toBeCloseTo(-2 * sixDb, 3);
  });
});

describe('weightingGainsPower', () => {
  it('gives 10^(dB/10) per bin for A and C, 1 for Z, 0 at DC', () => {
    // Definition of a power gain from a level difference: g = 10^(ΔL/10).
    const f = new Float64Array([0, 10, 31.5, 100, 1000, 2500, 10000, 20000, 24000]);
    for (const w of ['A', 'C'] as const) {
      const g = weightingGainsPower(w, f);
      expect(g.length).toBe(f.length);
      expect(g[0]).toBe(0);
      for (let i = 1; i < f.length; i++) expect(g[i]).toBeCloseTo(10 ** (weightingDb(w, f[i]) / 10), 12);
      expect(g[4]).toBeCloseTo(1, 14);
    }
    expect(Array.from(weightingGainsPower('Z', f))).toEqual(Array(f.length).fill(1));
  });

  it('accepts Float32Array bin frequencies', () => {
    // IEC 61672-1:2013 Table 3: A(100 Hz) = −19.1 dB.
    const g = weightingGainsPower('A', new Float32Array([100]));
    expect(10 * Math.log10(g[0])).toBeCloseTo(-19.14, 2);
  });
});
