/**
 * Second-order recursive sections in cascade, run in the transposed direct form II (Oppenheim &
 * Schafer, Discrete-Time Signal Processing, 3rd ed., §6.4.1): the loudness filter bank (ISO 532-1) and
 * the ear filter of the hearing model (ECMA-418-2) share it.
 */

/** One section with a0 = 1: y = (b0 + b1 z⁻¹ + b2 z⁻²) / (1 + a1 z⁻¹ + a2 z⁻²) · x. */
export interface Biquad {
  b0: number;
  b1: number;
  b2: number;
  a1: number;
  a2: number;
}

/** Runs the sections over x one after another into a new array. */
export function filterSections(x: ArrayLike<number>, sections: readonly Biquad[]): Float64Array {
  const y = Float64Array.from(x);
  for (const { b0, b1, b2, a1, a2 } of sections) {
    let s1 = 0;
    let s2 = 0;
    for (let i = 0; i < y.length; i++) {
      const v = y[i];
      const out = b0 * v + s1;
      s1 = b1 * v - a1 * out + s2;
      s2 = b2 * v - a2 * out;
      y[i] = out;
    }
  }
  return y;
}
