import { describe, expect, it } from 'vitest';
import { createRealFft } from '../../../workers/dsp/fft';
import {
  HEARING_THRESHOLD_DB,
  HEARING_THRESHOLD_FREQUENCIES_HZ,
  aboveThreshold,
  hearingThresholdDb,
} from '../../../workers/dsp/hearing-threshold';
import { averageFrames, computeFrames, stftLayout } from '../../../workers/dsp/stft';
import {
  criticalBandEdges,
  criticalBandwidthHz,
  prLimitDb,
  prLowerBandStartHz,
  prUpperBandEndHz,
  prominenceBands,
  prominenceRatio,
  tnrLimitDb,
  toneAudibility,
  toneToNoiseRatio,
} from '../../../workers/dsp/tonality';
import { makeWindow } from '../../../workers/dsp/window';

/** |actual − expected| ≤ tol, for table values printed to a given number of decimals. */
const near = (actual: number, expected: number, tol: number) => expect(Math.abs(actual - expected)).toBeLessThanOrEqual(tol);
/** Half a unit in the last printed decimal, plus floating-point slack. */
const D1 = 0.051;
const D2 = 0.0051;

/**
 * An ideal spectrum for the worked example: white noise of one-sided PSD n0 (U²/Hz) read through a
 * window of ENBW 1 bin, so each bin holds n0·binHz, plus a tone of mean square tonePower in the bin at
 * ftHz (the ideal band sums of the worked example, references.md §5).
 */
function idealSpectrum(ftHz: number, tonePower: number, n0 = 1e-6, binHz = 1, bins = 8193): Float64Array {
  const p = new Float64Array(bins).fill(n0 * binHz);
  if (tonePower > 0) p[Math.round(ftHz / binHz)] += tonePower;
  return p;
}

/** Seeded Gaussian noise: mulberry32 uniform generator and the Box–Muller transform. */
function gaussianNoise(n: number, sigma: number, seed: number): Float32Array {
  let s = seed >>> 0;
  const uniform = () => {
    s = (s + 0x6d2b79f5) >>> 0;
    let t = s;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  const x = new Float32Array(n);
  for (let i = 0; i < n; i += 2) {
    const r = sigma * Math.sqrt(-2 * Math.log(1 - uniform()));
    const a = 2 * Math.PI * uniform();
    x[i] = r * Math.cos(a);
    if (i + 1 < n) x[i + 1] = r * Math.sin(a);
  }
  return x;
}

describe('critical band', () => {
  it('Δfc = 25 + 75·[1 + 1.4·(ft/1000)²]^0.69: 162.2 Hz at 1 kHz, 117.3 Hz at 500 Hz (ECMA-418-1 formula 2)', () => {
    near(criticalBandwidthHz(1000), 162.2, D1);
    near(criticalBandwidthHz(500), 117.3, D1);
  });

  it('Δfc column of the references.md §5 table: 100.7 / 104.5 / 300.8 / 685.4 Hz at 100 / 250 / 2000 / 4000 Hz (formula 2)', () => {
    near(criticalBandwidthHz(100), 100.7, D1);
    near(criticalBandwidthHz(250), 104.5, D1);
    near(criticalBandwidthHz(2000), 300.8, D1);
    near(criticalBandwidthHz(4000), 685.4, D1);
  });

  it('geometric edges 922.2 / 1084.4 Hz at 1 kHz, f1·f2 = ft² and f2 − f1 = Δfc (ECMA-418-1 clause 10)', () => {
    const [f1, f2] = criticalBandEdges(1000);
    near(f1, 922.2, D1);
    near(f2, 1084.4, D1);
    expect(f1 * f2).toBeCloseTo(1000 * 1000, 6);
    expect(f2 - f1).toBeCloseTo(criticalBandwidthHz(1000), 10);
  });

  it('geometric edges of the references.md §5 table: 444.8/562.1, 1855.3/2156.0, 3671.9/4357.4 Hz (clause 10)', () => {
    const cases: [number, number, number][] = [
      [500, 444.8, 562.1],
      [2000, 1855.3, 2156.0],
      [4000, 3671.9, 4357.4],
    ];
    for (const [ft, lo, hi] of cases) {
      const [f1, f2] = criticalBandEdges(ft);
      near(f1, lo, D1);
      near(f2, hi, D1);
    }
  });
});

describe('prominence criteria and PR bands', () => {
  it('TNR limits 16.33 / 13.02 / 10.51 / 8.00 dB at 100 / 250 / 500 / 1000 Hz, 8.00 above (ECMA-418-1 formulae 12–13, references.md §5 table)', () => {
    near(tnrLimitDb(100), 16.33, D2);
    near(tnrLimitDb(250), 13.02, D2);
    near(tnrLimitDb(500), 10.51, D2);
    near(tnrLimitDb(1000), 8.0, D2);
    near(tnrLimitDb(2000), 8.0, D2);
    near(tnrLimitDb(4000), 8.0, D2);
  });

  it('PR limits 19.00 / 15.02 / 12.01 / 9.00 dB at 100 / 250 / 500 / 1000 Hz, 9.00 above (ECMA-418-1 formulae 25–26, references.md §5 table)', () => {
    near(prLimitDb(100), 19.0, D2);
    near(prLimitDb(250), 15.02, D2);
    near(prLimitDb(500), 12.01, D2);
    near(prLimitDb(1000), 9.0, D2);
    near(prLimitDb(2000), 9.0, D2);
    near(prLimitDb(4000), 9.0, D2);
  });

  it('f1,L and f2,U columns of the references.md §5 table (ECMA-418-1 Tables 2–3)', () => {
    const cases: [number, number, number][] = [
      [100, 20.0, 253.8],
      [250, 96.4, 413.1],
      [500, 333.7, 686.2],
      [1000, 782.5, 1261.5],
      [2000, 1586.0, 2519.7],
      [4000, 3099.6, 5208.9],
    ];
    for (const [ft, fl, fu] of cases) {
      near(prLowerBandStartHz(ft), fl, D1);
      near(prUpperBandEndHz(ft), fu, D1);
    }
  });

  it('the fitted edges join where Tables 2–3 change pieces, 171.4 Hz and 1600 Hz, within 0.1 Hz (ECMA-418-1 Tables 2–3)', () => {
    near(prLowerBandStartHz(171.4 + 1e-9), prLowerBandStartHz(171.4), 0.1);
    near(prLowerBandStartHz(1600 + 1e-9), prLowerBandStartHz(1600), 0.1);
    near(prUpperBandEndHz(1600 + 1e-9), prUpperBandEndHz(1600), 0.1);
  });

  it('scope 89.1 Hz–11 220 Hz: outside it the methods return null (ECMA-418-1 scope)', () => {
    const p = idealSpectrum(1000, 0, 1e-6, 1, 16385);
    for (const ft of [80, 89, 11300, 12000]) {
      expect(prominenceBands(ft)).toBeNull();
      expect(toneToNoiseRatio(p, 1, 1, ft)).toBeNull();
      expect(prominenceRatio(p, 1, 1, ft)).toBeNull();
    }
    expect(toneToNoiseRatio(p, 1, 1, 89.1)).not.toBeNull();
    expect(prominenceRatio(p, 1, 1, 11220)).not.toBeNull();
  });

  it('rejects a bin spacing or ENBW that is not above 0', () => {
    const p = idealSpectrum(1000, 1);
    expect(() => toneToNoiseRatio(p, 0, 1, 1000)).toThrow(RangeError);
    expect(() => prominenceRatio(p, 1, Number.NaN, 1000)).toThrow(RangeError);
  });
});

describe('worked example: white noise of PSD N0 and ideal band sums (references.md §5)', () => {
  const n0 = 1e-6;

  it('1 kHz tone of power 10·N0·Δfc: TNR 10.00 dB, PR 10.52 dB, prominent by both', () => {
    const ft = 1000;
    const p = idealSpectrum(ft, 10 * n0 * criticalBandwidthHz(ft), n0);
    const tnr = toneToNoiseRatio(p, 1, 1, ft)!;
    const pr = prominenceRatio(p, 1, 1, ft)!;
    near(tnr.deltaLtDb, 10.0, 0.1);
    near(pr.deltaLpDb, 10.52, 0.15);
    expect(tnr.prominent).toBe(true);
    expect(pr.prominent).toBe(true);
    expect(tnr.limitDb).toBe(8);
    expect(pr.limitDb).toBe(9);
    // The tone band closes on the flat floor one bin either side of the peak.
    expect(tnr.peakHz).toBe(1000);
    expect(tnr.toneBandHz).toEqual([999, 1001]);
  });

  it('1 kHz tone of power 100·N0·Δfc: TNR 20.00 dB, PR 20.15 dB', () => {
    const ft = 1000;
    const p = idealSpectrum(ft, 100 * n0 * criticalBandwidthHz(ft), n0);
    near(toneToNoiseRatio(p, 1, 1, ft)!.deltaLtDb, 20.0, 0.1);
    near(prominenceRatio(p, 1, 1, ft)!.deltaLpDb, 20.15, 0.15);
  });

  it('noise alone: PR = 10·lg[162.2/((139.7 + 177.1)/2)] ≈ 0.10 dB at 1 kHz, not prominent', () => {
    const pr = prominenceRatio(idealSpectrum(1000, 0, n0), 1, 1, 1000)!;
    near(pr.deltaLpDb, 0.1, 0.02);
    expect(pr.prominent).toBe(false);
  });

  it('250 Hz tone with TNR 15.00 dB: PR 15.07 dB, prominent by both (limits 13.02 / 15.02 dB)', () => {
    const ft = 250;
    const p = idealSpectrum(ft, 10 ** 1.5 * n0 * criticalBandwidthHz(ft), n0);
    const tnr = toneToNoiseRatio(p, 1, 1, ft)!;
    const pr = prominenceRatio(p, 1, 1, ft)!;
    near(tnr.deltaLtDb, 15.0, 0.1);
    near(pr.deltaLpDb, 15.07, 0.03);
    expect(tnr.prominent).toBe(true);
    expect(pr.prominent).toBe(true);
  });

  it('ENBW divides out: the same spectrum read as ENBW 1.5 bins gives the same ratios (levels.ts convention)', () => {
    const ft = 1000;
    const p = idealSpectrum(ft, 10 * n0 * criticalBandwidthHz(ft), n0);
    expect(toneToNoiseRatio(p, 1, 1.5, ft)!.deltaLtDb).toBeCloseTo(toneToNoiseRatio(p, 1, 1, ft)!.deltaLtDb, 10);
    expect(toneToNoiseRatio(p, 1, 1.5, ft)!.toneMeanSquare).toBeCloseTo((10 * n0 * criticalBandwidthHz(ft)) / 1.5, 12);
  });

  it('below 171.4 Hz the lower band starts at 20 Hz and WL is normalised to 100 Hz: noise alone at 150 Hz gives PR = 10·lg[Δfc/((100 + ΔfU)/2)] (ECMA-418-1 formula 24)', () => {
    const ft = 150;
    const pr = prominenceRatio(idealSpectrum(ft, 0, n0), 1, 1, ft)!;
    expect(pr.bands.lowerHz[0]).toBe(20);
    const [f2, fu] = pr.bands.upperHz;
    const expected = 10 * Math.log10(criticalBandwidthHz(ft) / ((100 + (fu - f2)) / 2));
    expect(pr.deltaLpDb).toBeCloseTo(expected, 9);
    expect(pr.lowerMeanSquare).toBeCloseTo(100 * n0, 12);
  });
});

describe('a real signal: 2 kHz tone in seeded white noise, Hann, averaged spectra (workers/dsp)', () => {
  it('TNR and PR equal their designed values within 1 dB (tone power / (N0·Δfc); ECMA-418-1 clauses 11–12)', async () => {
    const fsHz = 48000;
    const blockSize = 4096; // 11.7 Hz bins; 2 kHz falls between bins 170 and 171
    const sigma = 0.1;
    const n0 = (2 * sigma * sigma) / fsHz; // one-sided PSD of white noise, U²/Hz
    const ft = 2000;
    const dfc = criticalBandwidthHz(ft);
    const designedTnrDb = 12;
    const tonePower = 10 ** (designedTnrDb / 10) * n0 * dfc; // mean square A²/2
    const amplitude = Math.sqrt(2 * tonePower);

    const samples = 8 * fsHz;
    const x = gaussianNoise(samples, sigma, 20240601);
    for (let i = 0; i < samples; i++) x[i] += amplitude * Math.sin((2 * Math.PI * ft * i) / fsHz + 0.4);

    const layout = stftLayout(samples, fsHz, { window: 'hann', blockSize, overlap: 0.5 });
    const win = makeWindow('hann', blockSize);
    const map = new Float32Array(layout.frames * layout.bins);
    computeFrames(x, 0, layout, win, await createRealFft(blockSize), 0, layout.frames, map);
    const spectrum = averageFrames(map, layout.bins, 0, layout.frames);

    const tnr = toneToNoiseRatio(spectrum, layout.binHz, win.enbwBins, ft)!;
    near(tnr.deltaLtDb, designedTnrDb, 1);
    expect(tnr.prominent).toBe(true);
    expect(Math.abs(tnr.peakHz - ft)).toBeLessThanOrEqual(layout.binHz);
    near(10 * Math.log10(tnr.toneMeanSquare / tonePower), 0, 0.5);

    // Designed PR from the same ideal band sums: WM = tone + N0·Δfc, WL + WU = N0·(widths).
    const b = prominenceBands(ft)!;
    const flanks = (b.lowerHz[1] - b.lowerHz[0] + (b.upperHz[1] - b.upperHz[0])) / 2;
    const designedPrDb = 10 * Math.log10((tonePower + n0 * dfc) / (n0 * flanks));
    const pr = prominenceRatio(spectrum, layout.binHz, win.enbwBins, ft)!;
    near(pr.deltaLpDb, designedPrDb, 1);
    expect(pr.prominent).toBe(true);
  });
});

describe('threshold of hearing (ISO 389-7:2005 Table 1, free field, frontal incidence)', () => {
  it('holds one threshold per tabulated frequency, frequencies ascending from 20 Hz to 18 kHz', () => {
    expect(HEARING_THRESHOLD_DB.length).toBe(HEARING_THRESHOLD_FREQUENCIES_HZ.length);
    for (let i = 1; i < HEARING_THRESHOLD_FREQUENCIES_HZ.length; i++) {
      expect(HEARING_THRESHOLD_FREQUENCIES_HZ[i]).toBeGreaterThan(HEARING_THRESHOLD_FREQUENCIES_HZ[i - 1]);
    }
    expect(HEARING_THRESHOLD_FREQUENCIES_HZ[0]).toBe(20);
    expect(HEARING_THRESHOLD_FREQUENCIES_HZ.at(-1)).toBe(18000);
  });

  it('2.4 dB at 1 kHz, −5.4 dB at 4 kHz, 13.9 dB at 10 kHz; 78.5 dB at 20 Hz, 73.2 dB at 18 kHz (ISO 389-7 Table 1)', () => {
    expect(hearingThresholdDb(1000)).toBeCloseTo(2.4, 10);
    expect(hearingThresholdDb(4000)).toBeCloseTo(-5.4, 10);
    expect(hearingThresholdDb(10000)).toBeCloseTo(13.9, 10);
    expect(hearingThresholdDb(20)).toBeCloseTo(78.5, 10);
    expect(hearingThresholdDb(18000)).toBeCloseTo(73.2, 10);
  });

  it('between 1000 and 1250 Hz lies between 2.4 and 3.5 dB, linear in lg f (ISO 389-7 Table 1)', () => {
    const f = 1100;
    const t = hearingThresholdDb(f);
    expect(t).toBeGreaterThan(2.4);
    expect(t).toBeLessThan(3.5);
    expect(t).toBeCloseTo(2.4 + (1.1 * Math.log(f / 1000)) / Math.log(1.25), 10);
    // the geometric mean of the two entries lies halfway in dB
    expect(hearingThresholdDb(Math.sqrt(1000 * 1250))).toBeCloseTo((2.4 + 3.5) / 2, 10);
  });

  it('is NaN outside 20 Hz–18 kHz', () => {
    expect(hearingThresholdDb(19.9)).toBeNaN();
    expect(hearingThresholdDb(18001)).toBeNaN();
    expect(hearingThresholdDb(Number.NaN)).toBeNaN();
  });

  it('aboveThreshold and toneAudibility: level minus the ISO 389-7 threshold', () => {
    expect(aboveThreshold(3, 1000)).toBe(true);
    expect(aboveThreshold(2, 1000)).toBe(false);
    expect(aboveThreshold(100, 10)).toBe(false);
    expect(toneAudibility(40, 1000)).toBeCloseTo(37.6, 10);
    expect(toneAudibility(0, 4000)).toBeCloseTo(5.4, 10);
    expect(toneAudibility(40, 19000)).toBeNaN();
  });
});
