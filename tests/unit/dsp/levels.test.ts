import FFT from 'fft.js';
import { describe, expect, it } from 'vitest';
import {
  REF_ACCELERATION_MS2,
  REF_SOUND_PRESSURE_PA,
  REF_VELOCITY_MS,
  STANDARD_GRAVITY,
  applyPowerGains,
  bandPowersFromSpectrum,
  dbReference,
  overallPower,
  rmsOverTime,
  toDb,
} from '../../../workers/dsp/levels';
import { type ThirdOctaveBand, thirdOctaveBand, thirdOctaveBands } from '../../../workers/dsp/third-octave';
import { weightingGainsPower } from '../../../workers/dsp/weighting';

// Periodic Hann window, w[n] = 0.5 − 0.5·cos(2πn/N); its ENBW is N·Σw²/(Σw)² = 1.5 bins
// (Harris 1978, Table 1; Heinzel, Rüdiger & Schilling 2002).
const HANN_ENBW_BINS = 1.5;

function hann(n: number): Float64Array {
  const w = new Float64Array(n);
  for (let i = 0; i < n; i++) w[i] = 0.5 - 0.5 * Math.cos((2 * Math.PI * i) / n);
  return w;
}

/**
 * Builds one-sided "spectrum"-scaled periodograms: P[k] = 2|X[k]|²/(Σw)² for 0 < k < N/2, and
 * |X[k]|²/(Σw)² at k = 0 and N/2, X the unnormalised DFT of w·x (Heinzel, Rüdiger & Schilling 2002).
 * `add` accumulates blocks so the caller can average.
 */
function periodogram(nfft: number) {
  const fft = new FFT(nfft);
  const w = hann(nfft);
  let sumW = 0;
  for (let i = 0; i < nfft; i++) sumW += w[i];
  const scale = 1 / (sumW * sumW);
  const windowed = new Float64Array(nfft);
  const out = fft.createComplexArray() as number[];
  const acc = new Float64Array(nfft / 2 + 1);
  let blocks = 0;
  return {
    add(x: ArrayLike<number>, offset = 0) {
      for (let i = 0; i < nfft; i++) windowed[i] = w[i] * x[offset + i];
      fft.realTransform(out, windowed);
      for (let k = 0; k <= nfft / 2; k++) {
        const re = out[2 * k];
        const im = out[2 * k + 1];
        acc[k] += (k === 0 || k === nfft / 2 ? 1 : 2) * (re * re + im * im) * scale;
      }
      blocks++;
    },
    mean(): Float64Array {
      const p = new Float64Array(acc.length);
      for (let k = 0; k < p.length; k++) p[k] = acc[k] / blocks;
      return p;
    },
  };
}

function sine(n: number, fsHz: number, fHz: number, amplitude: number, phase = 0.3): Float64Array {
  const x = new Float64Array(n);
  for (let i = 0; i < n; i++) x[i] = amplitude * Math.sin((2 * Math.PI * fHz * i) / fsHz + phase);
  return x;
}

/** Seeded Gaussian noise: mulberry32 uniform generator and the Box–Muller transform. */
function gaussian(seed: number) {
  let s = seed >>> 0;
  const uniform = () => {
    s = (s + 0x6d2b79f5) >>> 0;
    let t = s;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  return (out: Float64Array, sigma: number) => {
    for (let i = 0; i < out.length; i += 2) {
      const r = sigma * Math.sqrt(-2 * Math.log(1 - uniform()));
      const a = 2 * Math.PI * uniform();
      out[i] = r * Math.cos(a);
      if (i + 1 < out.length) out[i + 1] = r * Math.sin(a);
    }
  };
}

const db = (ratio: number) => 10 * Math.log10(ratio);
const band = (x: number): ThirdOctaveBand[] => [thirdOctaveBand(x)];

describe('bandPowersFromSpectrum', () => {
  const fsHz = 51200;

  it('reads 0.5 for a 1 kHz sine of amplitude 1 in the 1 kHz band, bin-centred or not', () => {
    // Mean square of a sine is A²/2; Σ_k P[k] = ENBW·(mean square) for a "spectrum"-scaled
    // periodogram (Heinzel, Rüdiger & Schilling 2002; Harris 1978).
    const nfft = 8192; // 6.25 Hz bins, 1 kHz is bin 160
    for (const fHz of [1000, 1010.3]) {
      const pg = periodogram(nfft);
      pg.add(sine(nfft, fsHz, fHz, 1));
      const [p] = bandPowersFromSpectrum(pg.mean(), fsHz / nfft, band(0), HANN_ENBW_BINS);
      expect(Math.abs(db(p / 0.5))).toBeLessThan(0.05);
    }
  });

  it('splits a tone exactly on a band edge between the two bands without loss', () => {
    // As above (Σ_k P[k] = ENBW·mean square), with the edge 1000·10^(1/20) Hz shared by the 1 kHz and
    // 1.25 kHz bands (IEC 61260-1:2014).
    const nfft = 8192;
    const pg = periodogram(nfft);
    pg.add(sine(nfft, fsHz, thirdOctaveBand(0).upperHz, 1));
    const [lo, hi] = bandPowersFromSpectrum(pg.mean(), fsHz / nfft, [thirdOctaveBand(0), thirdOctaveBand(1)], HANN_ENBW_BINS);
    expect(lo).toBeGreaterThan(0.1);
    expect(hi).toBeGreaterThan(0.1);
    expect(Math.abs(db((lo + hi) / 0.5))).toBeLessThan(0.1);
  });

  it('reads σ²·(f2 − f1)/(fs/2) for white Gaussian noise, and the bands add up to the overall', () => {
    // White noise of variance σ² spreads evenly over 0 … fs/2, so a band holds σ²·(f2 − f1)/(fs/2)
    // (Heinzel, Rüdiger & Schilling 2002, with ENBW = 1.5 bins for Hann). 2000 blocks of 1024 give a
    // relative standard error of about √(1.5/(bandwidth·40 s)), under 3 % (0.13 dB) from 200 Hz up.
    const nfft = 1024;
    const binHz = fsHz / nfft;
    const blocks = 2000;
    const sigma = 0.3;
    const noise = gaussian(20240601);
    const x = new Float64Array(nfft);
    const pg = periodogram(nfft);
    for (let b = 0; b < blocks; b++) {
      noise(x, sigma);
      pg.add(x);
    }
    const p = pg.mean();

    const checked = thirdOctaveBands(200, 20000);
    const powers = bandPowersFromSpectrum(p, binHz, checked, HANN_ENBW_BINS);
    for (let i = 0; i < checked.length; i++) {
      const expected = (sigma * sigma * (checked[i].upperHz - checked[i].lowerHz)) / (fsHz / 2);
      expect(Math.abs(db(powers[i] / expected))).toBeLessThan(0.5);
    }

    // Parseval: the overall over all bins but DC is the variance (less half a bin at Nyquist).
    const overall = overallPower(p, HANN_ENBW_BINS);
    expect(Math.abs(db(overall / (sigma * sigma)))).toBeLessThan(0.1);

    // The 31.5 Hz … 20 kHz bands tile 28.2 Hz … 22.4 kHz: their sum is the overall of those bins.
    const all = thirdOctaveBands(31.5, 20000);
    let sum = 0;
    for (const v of bandPowersFromSpectrum(p, binHz, all, HANN_ENBW_BINS)) sum += v;
    const spanHz = all[all.length - 1].upperHz - all[0].lowerHz;
    expect(Math.abs(db(sum / ((sigma * sigma * spanHz) / (fsHz / 2))))).toBeLessThan(0.1);
    const firstBin = Math.floor(all[0].lowerHz / binHz + 0.5);
    const lastBin = Math.floor(all[all.length - 1].upperHz / binHz + 0.5);
    expect(Math.abs(db(sum / overallPower(p, HANN_ENBW_BINS, firstBin, lastBin + 1)))).toBeLessThan(0.02);
  });

  it('weights the two edge bins by the part of [(k − ½)·binHz, (k + ½)·binHz] inside the band', () => {
    // Rectangle-rule integration over bins of width binHz: a flat spectrum of 1 per bin gives the
    // bandwidth in bins, whatever the edges.
    const flat = new Float64Array(2049).fill(1);
    const bands = thirdOctaveBands(20, 20000);
    const binHz = 12.5;
    const powers = bandPowersFromSpectrum(flat, binHz, bands, 1);
    for (let i = 0; i < bands.length; i++) {
      expect(powers[i]).toBeCloseTo((bands[i].upperHz - bands[i].lowerHz) / binHz, 10);
    }
    const narrow: ThirdOctaveBand[] = [{ x: 0, nominalHz: 0, centerHz: 100, lowerHz: 101, upperHz: 104 }];
    const ramp = new Float64Array(64);
    for (let k = 0; k < ramp.length; k++) ramp[k] = k;
    // Bin 10 spans 95 … 105 Hz at 10 Hz bins: 3/10 of it lies in 101 … 104 Hz.
    expect(bandPowersFromSpectrum(ramp, 10, narrow, 2)[0]).toBeCloseTo((10 * 0.3) / 2, 12);
    // Edges 96 and 117 Hz: 9/10 of bin 10, all of bin 11, 2/10 of bin 12 (115 … 125 Hz).
    narrow[0] = { ...narrow[0], lowerHz: 96, upperHz: 117 };
    expect(bandPowersFromSpectrum(ramp, 10, narrow, 1)[0]).toBeCloseTo(10 * 0.9 + 11 + 12 * 0.2, 12);
  });

  it('matches a bin-by-bin overlap integral for an arbitrary spectrum', () => {
    // Rectangle-rule integration as above, done the slow way for each bin.
    const noise = gaussian(7);
    const p = new Float64Array(4097);
    noise(p, 1);
    for (let k = 0; k < p.length; k++) p[k] = p[k] * p[k];
    const binHz = 6.25;
    const bands = thirdOctaveBands(20, 20000);
    const p32 = Float32Array.from(p);
    const fast = bandPowersFromSpectrum(p32, binHz, bands, 1.5);
    for (let i = 0; i < bands.length; i++) {
      let slow = 0;
      for (let k = 1; k < p32.length; k++) {
        const overlap = Math.min(bands[i].upperHz, (k + 0.5) * binHz) - Math.max(bands[i].lowerHz, (k - 0.5) * binHz);
        if (overlap > 0) slow += (p32[k] * overlap) / binHz;
      }
      expect(fast[i]).toBeCloseTo(slow / 1.5, 9);
    }
  });

  it('gives NaN for bands the spectrum does not cover', () => {
    // fs = 16 kHz: Nyquist 8 kHz; the 8 kHz band reaches 8912.5 Hz (IEC 61260-1:2014 edges).
    const nfft = 1024;
    const flat = new Float64Array(nfft / 2 + 1).fill(1);
    const bands = thirdOctaveBands(20, 20000);
    const powers = bandPowersFromSpectrum(flat, 16000 / nfft, bands, 1.5);
    bands.forEach((b, i) => {
      if (b.upperHz <= 8000 && b.lowerHz >= 7.8125) expect(powers[i]).not.toBeNaN();
      else expect(powers[i]).toBeNaN();
    });
    expect(powers[bands.findIndex((b) => b.nominalHz === 6300)]).not.toBeNaN();
    expect(powers[bands.findIndex((b) => b.nominalHz === 8000)]).toBeNaN();
    expect(powers[bands.findIndex((b) => b.nominalHz === 20000)]).toBeNaN();
    // 250 Hz bins: the 20 Hz band lies inside the DC bin, which never counts.
    expect(bandPowersFromSpectrum(flat, 250, band(-17), 1.5)[0]).toBeNaN();
  });

  it('rejects a bin spacing or ENBW that is not above 0', () => {
    const flat = new Float64Array(16);
    expect(() => bandPowersFromSpectrum(flat, 0, band(0), 1.5)).toThrow(RangeError);
    expect(() => bandPowersFromSpectrum(flat, 10, band(0), 0)).toThrow(RangeError);
  });
});

describe('overallPower', () => {
  it('sums the bins from fromBin to toBin − 1 and divides by the ENBW, DC excluded by default', () => {
    // Σ_k P[k] = ENBW·(mean square) (Heinzel, Rüdiger & Schilling 2002).
    const p = new Float64Array([100, 1, 2, 3, 4]);
    expect(overallPower(p, 2)).toBe(5);
    expect(overallPower(p, 1, 0)).toBe(110);
    expect(overallPower(p, 1, 2, 4)).toBe(5);
    expect(overallPower(p, 1, 3, 3)).toBe(0);
  });

  it('reads A²/2 for a windowed sine', () => {
    // Mean square of a sine, A²/2, with the Hann ENBW of 1.5 bins (Harris 1978).
    const pg = periodogram(4096);
    pg.add(sine(4096, 48000, 1234.5, 3));
    expect(overallPower(pg.mean(), HANN_ENBW_BINS)).toBeCloseTo(4.5, 3);
  });

  it('rejects a bin range outside the spectrum', () => {
    const p = new Float64Array(8);
    expect(() => overallPower(p, 1, -1)).toThrow(RangeError);
    expect(() => overallPower(p, 1, 1, 9)).toThrow(RangeError);
    expect(() => overallPower(p, 1, 5, 4)).toThrow(RangeError);
    expect(() => overallPower(p, 0)).toThrow(RangeError);
  });
});

describe('toDb and dbReference', () => {
  it('gives 93.98 dB re 20 µPa for 1 Pa, and 94.0 dB for 1.0024 Pa', () => {
    // ISO 1683:2015 reference sound pressure 20 µPa; check values of shared/references.md §8 [C].
    expect(toDb(1, REF_SOUND_PRESSURE_PA).toFixed(2)).toBe('93.98');
    expect(toDb(1.0024 ** 2, dbReference('sound-pressure')).toFixed(1)).toBe('94.0');
  });

  it('gives 120.00 dB re 1 µm/s² for 1 m/s² and 139.83 dB for 1 gn', () => {
    // ISO 1683:2015 reference acceleration 1 µm/s²; gn = 9.80665 m/s² (3rd CGPM, 1901).
    expect(toDb(1, REF_ACCELERATION_MS2).toFixed(2)).toBe('120.00');
    expect(toDb(STANDARD_GRAVITY ** 2, dbReference('acceleration-iso')).toFixed(2)).toBe('139.83');
    // Levels re 10 µm/s² (the older reference) are 20 dB lower.
    expect(toDb(1, 10 * REF_ACCELERATION_MS2).toFixed(2)).toBe('100.00');
  });

  it('gives 120 dB re 1 nm/s for 1 mm/s', () => {
    // ISO 1683:2015 reference velocity 1 nm/s.
    expect(toDb(1e-3 ** 2, REF_VELOCITY_MS)).toBeCloseTo(120, 10);
  });

  it('adds two equal incoherent levels to +3.01 dB', () => {
    // Power addition of uncorrelated signals: 10·lg 2 = 3.0103 dB.
    expect(toDb(2, 1) - toDb(1, 1)).toBeCloseTo(3.0103, 4);
  });

  it('names the references', () => {
    // ISO 1683:2015; gn exact by the 3rd CGPM (1901).
    expect(dbReference('sound-pressure')).toBe(20e-6);
    expect(dbReference('acceleration-iso')).toBe(1e-6);
    expect(dbReference('velocity-iso')).toBe(1e-9);
    expect(dbReference('g')).toBe(9.80665);
    expect(dbReference('unit')).toBe(1);
    expect(dbReference(0.5)).toBe(0.5);
    expect(toDb(1, dbReference('g'))).toBeCloseTo(-19.83, 2);
  });

  it('gives −Infinity for silence and rejects a reference that is not above 0', () => {
    expect(toDb(0, 1)).toBe(-Infinity);
    expect(() => toDb(1, 0)).toThrow(RangeError);
    expect(() => dbReference(-1)).toThrow(RangeError);
    expect(() => dbReference(NaN)).toThrow(RangeError);
  });
});

describe('applyPowerGains', () => {
  it('multiplies bin by bin, so an A-weighted 100 Hz tone reads 19.1 dB below its unweighted level', () => {
    // IEC 61672-1:2013 Table 3: A(100 Hz) = −19.1 dB (−19.14 dB from Annex E, shared/references.md §1 [C]).
    const fsHz = 51200;
    const nfft = 8192;
    const pg = periodogram(nfft);
    pg.add(sine(nfft, fsHz, 100, 1));
    const p = pg.mean();
    const freqHz = new Float64Array(p.length);
    for (let k = 0; k < p.length; k++) freqHz[k] = (k * fsHz) / nfft;
    const weighted = applyPowerGains(p, weightingGainsPower('A', freqHz));
    const [unweighted] = bandPowersFromSpectrum(p, fsHz / nfft, band(-10), HANN_ENBW_BINS);
    const [aWeighted] = bandPowersFromSpectrum(weighted, fsHz / nfft, band(-10), HANN_ENBW_BINS);
    expect(Math.abs(db(aWeighted / unweighted) + 19.14)).toBeLessThan(0.05);
  });

  it('writes into a given array and rejects mismatched lengths', () => {
    const out = new Float64Array(3);
    expect(applyPowerGains(new Float32Array([1, 2, 3]), new Float64Array([2, 0.5, 0]), out)).toBe(out);
    expect(Array.from(out)).toEqual([2, 1, 0]);
    expect(() => applyPowerGains(new Float64Array(3), new Float64Array(2))).toThrow(RangeError);
  });
});

describe('rmsOverTime', () => {
  it('reads A/√2 in every block of whole periods, stamped at the block centres', () => {
    // RMS of a sine of amplitude A over whole periods is A/√2 (also exactly for the sampled sum).
    const fsHz = 48000;
    const x = Float32Array.from(sine(Math.round(1.05 * fsHz), fsHz, 50, 2, 1.1));
    const { tS, rms } = rmsOverTime(x, fsHz, 0.1); // 5 periods per block; the last 0.05 s is dropped
    expect(rms.length).toBe(10);
    expect(tS.length).toBe(10);
    for (let i = 0; i < rms.length; i++) {
      expect(rms[i]).toBeCloseTo(2 / Math.SQRT2, 6);
      expect(tS[i]).toBeCloseTo(0.05 + 0.1 * i, 12);
    }
  });

  it('follows a level that changes from block to block', () => {
    // RMS of a constant c is |c|.
    const x = new Float32Array(30);
    x.fill(3, 0, 10);
    x.fill(-4, 10, 20);
    const { tS, rms } = rmsOverTime(x, 10, 1);
    expect(Array.from(rms)).toEqual([3, 4, 0]);
    expect(Array.from(tS)).toEqual([0.5, 1.5, 2.5]);
  });

  it('returns no blocks for a signal shorter than one block, and rejects bad rates and lengths', () => {
    expect(rmsOverTime(new Float32Array(5), 10, 1).rms.length).toBe(0);
    expect(() => rmsOverTime(new Float32Array(5), 0, 1)).toThrow(RangeError);
    expect(() => rmsOverTime(new Float32Array(5), 10, 0.01)).toThrow(RangeError);
  });
});
