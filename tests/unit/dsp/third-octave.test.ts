import { describe, expect, it } from 'vitest';
import { OCTAVE_RATIO_G, thirdOctaveBand, thirdOctaveBands } from '../../../workers/dsp/third-octave';

// ISO 266:1997 preferred frequencies, the nominal one-third-octave labels from 10 Hz to 20 kHz.
const ISO_266_NOMINAL_HZ = [
  10, 12.5, 16, 20, 25, 31.5, 40, 50, 63, 80, 100, 125, 160, 200, 250, 315, 400, 500, 630, 800, 1000, 1250,
  1600, 2000, 2500, 3150, 4000, 5000, 6300, 8000, 10000, 12500, 16000, 20000,
];

// Exact mid-band and band-edge frequencies of the base-10 system, IEC 61260-1:2014, as tabulated to
// 5–6 significant figures in shared/references.md §2 [x, fm, f1, f2] (Hz).
const EXACT: ReadonlyArray<readonly [number, number, number, number]> = [
  [-20, 10, 8.9125, 11.22],
  [-19, 12.5893, 11.22, 14.125],
  [-17, 19.9526, 17.783, 22.387],
  [-15, 31.6228, 28.184, 35.481],
  [-10, 100, 89.125, 112.2],
  [-8, 158.489, 141.25, 177.83],
  [-1, 794.328, 707.95, 891.25],
  [0, 1000, 891.25, 1122],
  [4, 2511.89, 2238.7, 2818.4],
  [10, 10000, 8912.5, 11220],
  [12, 15848.9, 14125, 17783],
  [13, 19952.6, 17783, 22387],
];

/** |a − b| within half a unit of the last of `digits` significant figures of b. */
function toSignificant(a: number, b: number, digits: number) {
  const unit = 10 ** (Math.floor(Math.log10(Math.abs(b))) - digits + 1);
  expect(Math.abs(a - b)).toBeLessThanOrEqual(0.5 * unit * (1 + 1e-9));
}

describe('thirdOctaveBand', () => {
  it('uses the base-10 octave ratio G = 10^(3/10)', () => {
    // IEC 61260-1:2014: G = 10^(3/10) = 1.9952623…
    expect(OCTAVE_RATIO_G).toBeCloseTo(1.9952623, 7);
  });

  it('puts x = 10 at exactly 10 000 Hz with edges 8912.5–11 220 Hz', () => {
    // IEC 61260-1:2014 exact mid-band fm = 1000·G^(x/3) and edges fm·G^(∓1/6).
    const b = thirdOctaveBand(10);
    expect(b.centerHz).toBe(10000);
    expect(b.nominalHz).toBe(10000);
    expect(b.lowerHz).toBeCloseTo(8912.509, 3);
    expect(b.upperHz).toBeCloseTo(11220.185, 3);
  });

  it('puts x = −17 at 19.9526 Hz with edges 17.783–22.387 Hz, labelled 20 Hz', () => {
    // IEC 61260-1:2014 exact frequencies; ISO 266 label 20 Hz.
    const b = thirdOctaveBand(-17);
    expect(b.centerHz).toBeCloseTo(19.9526, 4);
    expect(b.lowerHz).toBeCloseTo(17.783, 3);
    expect(b.upperHz).toBeCloseTo(22.387, 3);
    expect(b.nominalHz).toBe(20);
  });

  it('keeps whole decades exact', () => {
    // IEC 61260-1:2014: G^(x/3) = 10^(x/10), so x = 10·n is 1000·10^n Hz.
    expect(thirdOctaveBand(-20).centerHz).toBe(10);
    expect(thirdOctaveBand(-10).centerHz).toBe(100);
    expect(thirdOctaveBand(0).centerHz).toBe(1000);
    expect(thirdOctaveBand(20).centerHz).toBe(100000);
  });

  it.each(EXACT)('matches the exact frequencies at x = %i', (x, fm, f1, f2) => {
    // IEC 61260-1:2014 exact mid-band and band-edge frequencies (shared/references.md §2, [C]).
    const b = thirdOctaveBand(x);
    toSignificant(b.centerHz, fm, 6);
    toSignificant(b.lowerHz, f1, 5);
    toSignificant(b.upperHz, f2, 5);
  });

  it('has f2/f1 = G^(1/3) = 1.2589254 and fm the geometric mean of its edges', () => {
    // IEC 61260-1:2014: f2/f1 = G^(1/b) for b = 3; fm = √(f1·f2).
    for (let x = -20; x <= 13; x++) {
      const b = thirdOctaveBand(x);
      expect(b.upperHz / b.lowerHz).toBeCloseTo(1.2589254, 7);
      expect(Math.sqrt(b.lowerHz * b.upperHz) / b.centerHz).toBeCloseTo(1, 12);
    }
  });

  it('shares bit-identical edges between neighbours', () => {
    // IEC 61260-1:2014: the upper edge of band x is the lower edge of band x + 1.
    for (let x = -25; x <= 20; x++) expect(thirdOctaveBand(x).upperHz).toBe(thirdOctaveBand(x + 1).lowerHz);
  });

  it('labels bands with the ISO 266 preferred frequencies, repeating each decade', () => {
    // ISO 266:1997 R10 preferred series: 1, 1.25, 1.6, 2, 2.5, 3.15, 4, 5, 6.3, 8 times powers of ten.
    expect(thirdOctaveBand(-30).nominalHz).toBe(1);
    expect(thirdOctaveBand(-25).nominalHz).toBe(3.15);
    expect(thirdOctaveBand(-39).nominalHz).toBe(0.125);
    expect(thirdOctaveBand(15).nominalHz).toBe(31500);
  });

  it('rejects a band number that is not an integer', () => {
    expect(() => thirdOctaveBand(0.5)).toThrow(RangeError);
  });
});

describe('thirdOctaveBands', () => {
  it('gives the 31 bands 20 Hz – 20 kHz by default', () => {
    // ISO 266:1997 labels; IEC 61260-1:2014 band numbers x = −17 … 13.
    const bands = thirdOctaveBands();
    expect(bands.map((b) => b.nominalHz)).toEqual(ISO_266_NOMINAL_HZ.slice(3));
    expect(bands.map((b) => b.x)).toEqual(Array.from({ length: 31 }, (_, i) => i - 17));
  });

  it('maps 10 Hz – 20 kHz to the ISO 266 labels', () => {
    // ISO 266:1997 preferred frequencies.
    expect(thirdOctaveBands(10, 20000).map((b) => b.nominalHz)).toEqual(ISO_266_NOMINAL_HZ);
  });

  it('selects by nominal label, inclusive at both ends', () => {
    // ISO 266:1997 labels: 31.5 Hz is band x = −15 although its exact mid-band is 31.62 Hz.
    expect(thirdOctaveBands(31.5, 63).map((b) => b.nominalHz)).toEqual([31.5, 40, 50, 63]);
    expect(thirdOctaveBands(30, 70).map((b) => b.nominalHz)).toEqual([31.5, 40, 50, 63]);
    expect(thirdOctaveBands(1000, 1000).map((b) => b.x)).toEqual([0]);
    expect(thirdOctaveBands(1010, 1200)).toEqual([]);
    expect(thirdOctaveBands(2000, 1000)).toEqual([]);
  });

  it('rejects limits that are not finite or not above 0 Hz', () => {
    expect(() => thirdOctaveBands(0, 100)).toThrow(RangeError);
    expect(() => thirdOctaveBands(20, Infinity)).toThrow(RangeError);
    expect(() => thirdOctaveBands(NaN, 100)).toThrow(RangeError);
  });
});
