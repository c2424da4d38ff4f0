import FFTJS from 'fft.js';
import { describe, expect, it } from 'vitest';
import {
  BAND_CENTRES_HZ,
  BAND_COUNT,
  HMS_FS_HZ,
  bandBandwidthHz,
  bandBlockSize,
  criticalBandRateBark,
  filterBand,
} from '../../../workers/dsp/hearing-model/filter-bank';
import { P0_PA, specificLoudnessBasis } from '../../../workers/dsp/hearing-model/nonlinearity';
import { resampleTo48k } from '../../../workers/dsp/hearing-model/resample';
import { interpolateOnGrid } from '../../../workers/dsp/hearing-model/tonality-time';

const sine = (fHz: number, amp: number, n: number, fs: number) =>
  Float64Array.from({ length: n }, (_, i) => amp * Math.sin((2 * Math.PI * fHz * i) / fs));

const peakAbs = (x: Float64Array, from: number, to: number) => {
  let m = 0;
  for (let i = from; i < to; i++) m = Math.max(m, Math.abs(x[i]));
  return m;
};

describe('auditory filter bank (ECMA-418-2 clause 5.1.4)', () => {
  it('has 53 bands from about 41 Hz to 18.4 kHz at 0.5 Bark_HMS', () => {
    // /work/shared/references.md §12: F(z) = (81.9289/0.1618)·sinh(0.1618·z), z = 0.5 … 26.5, about 41 Hz … 18.4 kHz.
    expect(BAND_COUNT).toBe(53);
    expect(BAND_CENTRES_HZ[0]).toBeCloseTo((81.9289 / 0.1618) * Math.sinh(0.1618 * 0.5), 9);
    expect(BAND_CENTRES_HZ[0]).toBeCloseTo(41.0, 1);
    expect(BAND_CENTRES_HZ[52] / 1000).toBeCloseTo(18.43, 2);
    for (let b = 0; b < BAND_COUNT; b++) expect(criticalBandRateBark(BAND_CENTRES_HZ[b])).toBeCloseTo(0.5 * (b + 1), 9);
  });

  it('passes a sine at a band centre with its amplitude', () => {
    // The filter is normalised to unit gain at fc (clause 5.1.4); the band signal is twice the real part.
    for (const b of [20, 30, 45, 52]) {
      const fc = BAND_CENTRES_HZ[b];
      const out = new Float64Array(HMS_FS_HZ / 2);
      filterBand(sine(fc, 1, out.length, HMS_FS_HZ), fc, out);
      expect(peakAbs(out, out.length / 2, out.length)).toBeCloseTo(1, 2);
    }
  });

  it('has an equivalent rectangular bandwidth equal to Δf = √(Δf₀² + (c·fc)²)', () => {
    // ERB = ∫|H(f)|² df / |H(fc)|², from the impulse response's spectrum; the gammatone's τ is set
    // from Δf by clause 5.1.4's factor (2k − 2)!/(2^(2k−1)·((k − 1)!)²). 2 %: the sampled filter.
    const n = 1 << 16;
    const fft = new FFTJS(n);
    for (const b of [16, 30, 44]) {
      const fc = BAND_CENTRES_HZ[b];
      const impulse = new Float64Array(n);
      impulse[0] = 1;
      const h = new Float64Array(n);
      filterBand(impulse, fc, h);
      const spec = fft.createComplexArray();
      fft.realTransform(spec, h);
      let area = 0;
      let peak = 0;
      for (let k = 1; k < n / 2; k++) {
        const p = spec[2 * k] ** 2 + spec[2 * k + 1] ** 2;
        area += p;
        peak = Math.max(peak, p);
      }
      const erb = (area / peak) * (HMS_FS_HZ / n);
      expect(Math.abs(erb / bandBandwidthHz(fc) - 1)).toBeLessThan(0.02);
    }
  });

  it('uses longer blocks for the lower bands (clause 5.1.5)', () => {
    expect([0, 3, 16, 25, 52].map(bandBlockSize)).toEqual([8192, 4096, 2048, 1024, 1024]);
  });
});

describe('resampleTo48k (ECMA-418-2 clause 5.1.2)', () => {
  it('turns a 1 kHz sine at 44.1 kHz and at 51.2 kHz into the same sine at 48 kHz', () => {
    // Band-limited interpolation keeps a sine well inside the pass band: compare with the sine
    // sampled at 48 kHz directly (away from the edges), within 0.1 % of the amplitude.
    for (const fs of [44100, 51200]) {
      const y = resampleTo48k(sine(1000, 1, fs, fs), fs);
      expect(y.length).toBe(48000);
      const ref = sine(1000, 1, 48000, 48000);
      let err = 0;
      for (let i = 1000; i < 47000; i++) err = Math.max(err, Math.abs(y[i] - ref[i]));
      expect(err).toBeLessThan(1e-3);
    }
  });

  it('refuses a rate that is not a positive number', () => {
    expect(() => resampleTo48k(new Float64Array(10), 0)).toThrow(/sampleRateHz/);
  });
});

describe('specific loudness nonlinearity (ECMA-418-2 clause 5.1.8)', () => {
  it('is linear in pressure far below the first threshold and compressive far above the last', () => {
    // The formula's limits: slope v₀ = 1 below 15 dB, slope v₈ (from memory 0.6434) above 85 dB.
    const low = P0_PA * 10 ** (-20 / 20);
    expect(specificLoudnessBasis(2 * low) / specificLoudnessBasis(low)).toBeCloseTo(2, 2);
    const high = P0_PA * 10 ** (120 / 20);
    const slope = Math.log10(specificLoudnessBasis(10 * high) / specificLoudnessBasis(high));
    expect(slope).toBeCloseTo(0.6434, 2);
    expect(specificLoudnessBasis(0)).toBe(0);
  });
});

describe('interpolateOnGrid (ECMA-418-2 clause 6.2.6)', () => {
  it('interpolates linearly between block centres and holds the end values', () => {
    const out = interpolateOnGrid(Float64Array.of(1, 2, 3), Float64Array.of(10, 20, 40), Float64Array.of(0, 1.5, 2.5, 4));
    expect(Array.from(out)).toEqual([10, 15, 30, 40]);
  });
});
