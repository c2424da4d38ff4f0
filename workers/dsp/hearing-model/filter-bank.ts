/**
 * The auditory filter bank of the hearing model of ECMA-418-2 [1], clause 5.1.4: 53 band-pass
 * filters on the model's critical-band-rate scale at 0.5 Bark_HMS spacing (z = 0.5 … 26.5), each a
 * recursive approximation of a fifth-order gammatone filter, run at the model's 48 kHz.
 *
 * Constants recalled from memory of [1] and marked so: Δf₀ = 81.9289 Hz and c = 0.1618 of the
 * critical-band-rate scale, filter order k = 5, the block sizes of the segmentation. The band centres
 * (about 41 Hz … 18.4 kHz) agree with /work/shared/references.md §12.
 *
 * References:
 *   [1] ECMA-418-2, Psychoacoustic metrics for ITT equipment — Part 2 (models based on human
 *       perception), 2nd edition, December 2022, clauses 5.1.4 (auditory filtering bank) and 5.1.5
 *       (segmentation).
 *   [2] R. D. Patterson et al., "Complex sounds and auditory images", in Auditory Physiology and
 *       Perception (Pergamon, 1992) 429–446 (the gammatone impulse response t^(k−1)·e^(−t/τ)).
 */

/** The model's sampling rate (Hz), ECMA-418-2 clause 5.1.2 [1]. */
export const HMS_FS_HZ = 48000;
/** Number of auditory bands, z = 0.5 … 26.5 Bark_HMS in steps of 0.5 [1]. */
export const BAND_COUNT = 53;
/** Band spacing on the critical-band-rate scale (Bark_HMS) [1]. */
export const BAND_STEP_BARK = 0.5;

/** Δf₀ (Hz), the bandwidth at low frequency, clause 5.1.4 [1] (from memory). */
const DELTA_F0_HZ = 81.9289;
/** c, the bandwidth's growth with frequency, clause 5.1.4 [1] (from memory). */
const BANDWIDTH_SLOPE = 0.1618;
/** Gammatone order k, clause 5.1.4 [1] (from memory). */
const FILTER_ORDER = 5;

/** Critical-band rate z (Bark_HMS) → centre frequency F(z) = (Δf₀/c)·sinh(c·z) (Hz), clause 5.1.4 [1]. */
export function bandCentreHz(zBark: number): number {
  return (DELTA_F0_HZ / BANDWIDTH_SLOPE) * Math.sinh(BANDWIDTH_SLOPE * zBark);
}

/** Inverse of {@link bandCentreHz}: z(f) = asinh(c·f/Δf₀)/c (Bark_HMS), clause 5.1.4 [1]. */
export function criticalBandRateBark(fHz: number): number {
  return Math.asinh((BANDWIDTH_SLOPE * fHz) / DELTA_F0_HZ) / BANDWIDTH_SLOPE;
}

/** Bandwidth of the auditory filter at fc, Δf = √(Δf₀² + (c·fc)²) (Hz), clause 5.1.4 [1]. */
export function bandBandwidthHz(fcHz: number): number {
  return Math.hypot(DELTA_F0_HZ, BANDWIDTH_SLOPE * fcHz);
}

/** The 53 band centres (Hz), band b at z = 0.5·(b + 1). */
export const BAND_CENTRES_HZ: Float64Array = Float64Array.from({ length: BAND_COUNT }, (_, b) =>
  bandCentreHz(BAND_STEP_BARK * (b + 1)),
);

/**
 * Block size of band b's segmentation at 48 kHz, clause 5.1.5 [1] (from memory): 8192 samples for
 * z ≤ 1.5, 4096 for z = 2 … 8, 2048 for z = 8.5 … 12.5, 1024 above. Longer blocks at low frequency
 * give the narrow filters time to resolve a period; the hop is a quarter block.
 */
export function bandBlockSize(band: number): number {
  const z = BAND_STEP_BARK * (band + 1);
  if (z <= 1.5) return 8192;
  if (z <= 8) return 4096;
  if (z <= 12.5) return 2048;
  return 1024;
}

/** Hop of band b's segmentation: a quarter block, clause 5.1.5 [1] (from memory). */
export const bandHop = (band: number) => bandBlockSize(band) / 4;

/**
 * Time constant τ of the k-th order gammatone whose equivalent rectangular bandwidth is Δf,
 * τ = [(2k − 2)! / (2^(2k−1)·((k − 1)!)²)] / Δf, clause 5.1.4 [1]: for k = 5 the factor is
 * 70/512 = 0.13671875 (the ERB of |1/(1 + j2πfτ)|^(2k), ∫ = π·(2k − 3)!!/(2k − 2)!!).
 */
export function gammatoneTimeConstantS(bandwidthHz: number): number {
  const k = FILTER_ORDER;
  let ratio = 1;
  for (let i = k; i <= 2 * k - 2; i++) ratio *= i; // (2k−2)!/(k−1)!
  for (let i = 2; i <= k - 1; i++) ratio /= i; // … /(k−1)!
  return ratio / 2 ** (2 * k - 1) / bandwidthHz;
}

/**
 * Filters x (at 48 kHz) through the auditory filter centred on fcHz, clause 5.1.4 [1], into out
 * (same length): the sampled complex gammatone h[n] = g·n⁴·(d·e^(jω))ⁿ, d = e^(−1/(fs·τ)),
 * ω = 2π·fc/fs. Its z-transform is g·P·(1 + 11P + 11P² + P³)/(1 − P)⁵ with P = d·e^(jω)·z⁻¹ (the
 * Eulerian numbers of Σ n⁴·Pⁿ), run as an FIR stage and five one-pole stages; g sets unit gain at fc.
 * The band signal is twice the real part, so a sine at fc passes with its amplitude. The
 * standard writes the same filter with its own coefficient recursion; this form is derived, not copied.
 */
export function filterBand(x: Float64Array, fcHz: number, out: Float64Array): void {
  const tau = gammatoneTimeConstantS(bandBandwidthHz(fcHz));
  const d = Math.exp(-1 / (HMS_FS_HZ * tau));
  const w = (2 * Math.PI * fcHz) / HMS_FS_HZ;
  const pr = d * Math.cos(w);
  const pi = d * Math.sin(w);
  const g = (1 - d) ** 5 / (d * (1 + 11 * d + 11 * d * d + d * d * d));
  // Powers P^m·c_m·g of the FIR numerator, c = [1, 11, 11, 1] for m = 1…4.
  const cr = new Float64Array(5);
  const ci = new Float64Array(5);
  let qr = 1;
  let qi = 0;
  const coef = [0, 1, 11, 11, 1];
  for (let m = 1; m <= 4; m++) {
    const nr = qr * pr - qi * pi;
    qi = qr * pi + qi * pr;
    qr = nr;
    cr[m] = g * coef[m] * qr;
    ci[m] = g * coef[m] * qi;
  }
  const sr = new Float64Array(FILTER_ORDER);
  const si = new Float64Array(FILTER_ORDER);
  let x1 = 0;
  let x2 = 0;
  let x3 = 0;
  let x4 = 0;
  for (let n = 0; n < x.length; n++) {
    let vr = cr[1] * x1 + cr[2] * x2 + cr[3] * x3 + cr[4] * x4;
    let vi = ci[1] * x1 + ci[2] * x2 + ci[3] * x3 + ci[4] * x4;
    x4 = x3;
    x3 = x2;
    x2 = x1;
    x1 = x[n];
    for (let s = 0; s < FILTER_ORDER; s++) {
      const yr = vr + pr * sr[s] - pi * si[s];
      const yi = vi + pr * si[s] + pi * sr[s];
      sr[s] = yr;
      si[s] = yi;
      vr = yr;
      vi = yi;
    }
    out[n] = 2 * vr;
  }
}
