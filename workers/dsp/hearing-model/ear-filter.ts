/**
 * Pre-processing and the outer and middle/inner ear filter of the hearing model of ECMA-418-2 [1].
 *
 * - Clause 5.1.2: the signal, in Pa at 48 kHz, is faded in over the first 240 samples (5 ms) with a
 *   raised cosine, so the filters do not ring on a switched-on signal (from memory).
 * - Clause 5.1.3: three second-order recursive sections in cascade at 48 kHz, coefficients of the
 *   standard's table (recalled from memory, six decimals as printed). Each section has a₁ = b₁.
 *
 * References:
 *   [1] ECMA-418-2, 2nd edition, December 2022, clauses 5.1.2–5.1.3.
 */
import { filterSections, type Biquad } from '../biquad';
import { HMS_FS_HZ } from './filter-bank';

/** One section: b0, b1, b2, a1, a2 (a0 = 1), ECMA-418-2 clause 5.1.3 [1] (from memory). */
const EAR_SECTIONS: readonly (readonly [number, number, number, number, number])[] = [
  [1.015896, -1.925299, 0.922118, -1.925299, 0.938014],
  [0.958943, -1.806088, 0.876438, -1.806088, 0.835381],
  [0.961372, -1.763632, 0.82153, -1.763632, 0.782902],
];

const EAR_BIQUADS: Biquad[] = EAR_SECTIONS.map(([b0, b1, b2, a1, a2]) => ({ b0, b1, b2, a1, a2 }));

/** Samples of the raised-cosine fade-in, ECMA-418-2 clause 5.1.2 [1] (from memory). */
const FADE_IN_SAMPLES = 240;

/** Fades x in over the first 240 samples in place, ECMA-418-2 clause 5.1.2 [1]. */
export function fadeIn(x: Float64Array): void {
  const n = Math.min(FADE_IN_SAMPLES, x.length);
  for (let i = 0; i < n; i++) x[i] *= 0.5 - 0.5 * Math.cos((Math.PI * i) / FADE_IN_SAMPLES);
}

/** Runs x (48 kHz) through the outer and middle/inner ear filter, ECMA-418-2 clause 5.1.3 [1]; returns a new array. */
export function earFilter(x: Float64Array): Float64Array {
  return filterSections(x, EAR_BIQUADS);
}

/** |H(f)| of the ear filter at fHz, the product of the sections' magnitude responses at 48 kHz. */
export function earFilterGain(fHz: number): number {
  const w = (2 * Math.PI * fHz) / HMS_FS_HZ;
  const c1 = Math.cos(w);
  const s1 = Math.sin(w);
  const c2 = Math.cos(2 * w);
  const s2 = Math.sin(2 * w);
  let gain = 1;
  for (const [b0, b1, b2, a1, a2] of EAR_SECTIONS) {
    const nr = b0 + b1 * c1 + b2 * c2;
    const ni = -(b1 * s1 + b2 * s2);
    const dr = 1 + a1 * c1 + a2 * c2;
    const di = -(a1 * s1 + a2 * s2);
    gain *= Math.hypot(nr, ni) / Math.hypot(dr, di);
  }
  return gain;
}
