/**
 * Frequency weightings A, C and Z of sound level meters, from the analytic expressions of
 * IEC 61672-1:2013 Annex E, for weighting spectra in the frequency domain.
 *
 * References:
 *   [1] IEC 61672-1:2013, Electroacoustics — Sound level meters — Part 1: Specifications,
 *       Annex E (analytical expressions for frequency weightings C, A and Z) and Table 3.
 */

export type Weighting = 'A' | 'C' | 'Z';

// Annex E design constants [1]: the reference frequency, the −3 dB corner frequencies of the
// C weighting (10^1.5 Hz and 10^3.9 Hz), D² = 1/2, and the high-pass corner of the A weighting.
const FR_HZ = 1000;
const FL_HZ = 10 ** 1.5;
const FH_HZ = 10 ** 3.9;
const D = Math.SQRT1_2;
const FA_HZ = 10 ** 2.45;

const B = (FR_HZ ** 2 + (FL_HZ ** 2 * FH_HZ ** 2) / FR_HZ ** 2 - D * (FL_HZ ** 2 + FH_HZ ** 2)) / (1 - D);
const C = FL_HZ ** 2 * FH_HZ ** 2;
const ROOT = Math.sqrt(B * B - 4 * C);

/** Pole frequencies of Annex E [1], in Hz: ≈ 20.598997, 107.65265, 737.86223, 12194.217. */
export const WEIGHTING_POLES_HZ = Object.freeze({
  f1: Math.sqrt((-B - ROOT) / 2),
  f2: ((3 - Math.sqrt(5)) / 2) * FA_HZ,
  f3: ((3 + Math.sqrt(5)) / 2) * FA_HZ,
  f4: Math.sqrt((-B + ROOT) / 2),
});

const F1SQ = WEIGHTING_POLES_HZ.f1 ** 2;
const F2SQ = WEIGHTING_POLES_HZ.f2 ** 2;
const F3SQ = WEIGHTING_POLES_HZ.f3 ** 2;
const F4SQ = WEIGHTING_POLES_HZ.f4 ** 2;

// The squared magnitudes are written as products of ratios, each ≤ 1, so that no power of f
// overflows or loses precision at any frequency; they equal the squares of Annex E's expressions.
function rawPowerA(f2: number): number {
  const r1 = f2 / (f2 + F1SQ);
  const r4 = F4SQ / (f2 + F4SQ);
  return r1 * r1 * (f2 / (f2 + F2SQ)) * (f2 / (f2 + F3SQ)) * r4 * r4;
}

function rawPowerC(f2: number): number {
  const r1 = f2 / (f2 + F1SQ);
  const r4 = F4SQ / (f2 + F4SQ);
  return r1 * r1 * r4 * r4;
}

// Normalised by the computed value at 1 kHz (A1000 ≈ −1.99966 dB, C1000 ≈ −0.06190 dB) rather than
// the rounded −2.000 / −0.062 dB, so the weighting is exactly 0 dB at 1 kHz.
const NORM_A = 1 / rawPowerA(FR_HZ * FR_HZ);
const NORM_C = 1 / rawPowerC(FR_HZ * FR_HZ);

/**
 * The A, C or Z frequency weighting at one frequency, from the analytic expressions of
 * IEC 61672-1:2013 Annex E, equations (E.1) for C and (E.6) for A [1], normalised to 0 dB at 1 kHz.
 *
 * @param w    'A', 'C' or 'Z' (Z is 0 dB at every frequency)
 * @param fHz  frequency (Hz); the sign is ignored
 * @returns the weighting (dB); −Infinity at 0 Hz for A and C, NaN for a NaN frequency
 *
 * References:
 *   [1] IEC 61672-1:2013, Electroacoustics — Sound level meters — Part 1: Specifications, Annex E.
 */
export function weightingDb(w: Weighting, fHz: number): number {
  if (w === 'Z') return Number.isNaN(fHz) ? NaN : 0;
  const f2 = fHz * fHz;
  return 10 * Math.log10(w === 'A' ? rawPowerA(f2) * NORM_A : rawPowerC(f2) * NORM_C);
}

/**
 * Linear power gains 10^(W(f)/10) of the A, C or Z weighting of IEC 61672-1:2013 Annex E [1],
 * one per frequency, for multiplying a power spectrum bin by bin. Weighting in the frequency domain
 * follows the analog curve up to the Nyquist frequency, which a bilinear time-domain filter does not.
 *
 * @param w       'A', 'C' or 'Z'
 * @param freqHz  bin frequencies (Hz)
 * @returns power gains (dimensionless, ≥ 0), the same length as freqHz; 0 at 0 Hz for A and C,
 *          1 everywhere for Z
 *
 * References:
 *   [1] IEC 61672-1:2013, Electroacoustics — Sound level meters — Part 1: Specifications, Annex E.
 */
export function weightingGainsPower(w: Weighting, freqHz: Float64Array | Float32Array): Float64Array {
  const n = freqHz.length;
  const out = new Float64Array(n);
  if (w === 'Z') {
    out.fill(1);
  } else if (w === 'A') {
    for (let i = 0; i < n; i++) {
      const f = freqHz[i];
      out[i] = rawPowerA(f * f) * NORM_A;
    }
  } else {
    for (let i = 0; i < n; i++) {
      const f = freqHz[i];
      out[i] = rawPowerC(f * f) * NORM_C;
    }
  }
  return out;
}
