/**
 * Prominent discrete tones: the tone-to-noise ratio (TNR) and the prominence ratio (PR) of
 * ECMA-418-1 [1] (the methods formerly in ECMA-74 Annex D [2]), with their prominence criteria, and
 * a tone's level above the threshold of hearing of ISO 389-7:2005 [4].
 *
 * Input convention: an averaged one-sided power spectrum in mean square per bin ('spectrum' scaling,
 * see spectrum-scaling.ts and levels.ts), P[k] = c_k·|X[k]|²/(Σw)², bin k at k·binHz. The standard
 * asks for a Hann window and RMS (power) averaging of the spectra. A sum of bins divided by the
 * window's equivalent noise bandwidth (ENBW, in bins; 1.5 for Hann) is the true mean square in
 * those bins, for a tone and for broadband noise alike (the convention of levels.ts
 * bandPowersFromSpectrum). Band powers over [lo, hi] Hz count bin k as covering
 * [(k − ½)·binHz, (k + ½)·binHz], so edge bins count in part; the DC bin never counts.
 *
 * Scope: tones in the one-third-octave bands 100 Hz–10 kHz, i.e. 89.1 Hz ≤ ft ≤ 11 220 Hz [1];
 * outside it every function that judges a tone returns null.
 *
 * All powers returned are mean squares in the signal's unit squared (U², Pa² for sound pressure);
 * ratios are in dB, 10·lg of power ratios.
 *
 * References:
 *   [1] ECMA-418-1, Psychoacoustic metrics for ITT equipment — Part 1: Prominent discrete tones,
 *       clause 10 (critical band, formula 2), clause 11 (TNR, formulae 12–13), clause 12 (PR,
 *       Tables 2–3, formulae 24–26), 2024.
 *   [2] ECMA-74, Measurement of airborne noise emitted by information technology and
 *       telecommunications equipment, Annex D (prominent discrete tones).
 *   [3] E. Zwicker, E. Terhardt, "Analytical expressions for critical-band rate and critical
 *       bandwidth as a function of frequency", J. Acoust. Soc. Am. 68(5) (1980) 1523–1525.
 *   [4] ISO 389-7:2005, Acoustics — Reference zero for the calibration of audiometric equipment —
 *       Part 7, Table 1 (free field, frontal incidence).
 *   [5] F. J. Harris, "On the use of windows for harmonic analysis with the discrete Fourier
 *       transform", Proc. IEEE 66(1) (1978) 51–83 (ENBW).
 */
import { hearingThresholdDb } from './hearing-threshold';

/** Lowest tone frequency in scope (Hz): the lower edge of the 100 Hz one-third-octave band [1]. */
export const TONALITY_MIN_HZ = 89.1;
/** Highest tone frequency in scope (Hz): the upper edge of the 10 kHz one-third-octave band [1]. */
export const TONALITY_MAX_HZ = 11220;

/** Below this tone frequency the PR lower band starts at 20 Hz and is normalised to 100 Hz (formula 24). */
const PR_LOW_TONE_HZ = 171.4;
/** Tone-band search half-width, a fraction of the critical bandwidth (clause 11: ±15 % of Δfc). */
const TONE_SEARCH_FRACTION = 0.15;

/** Whether ft lies in the scope of the tonality methods, 89.1 Hz–11 220 Hz (ECMA-418-1 [1]). */
export function inTonalityScope(ftHz: number): boolean {
  return ftHz >= TONALITY_MIN_HZ && ftHz <= TONALITY_MAX_HZ;
}

function checkPositive(name: string, v: number): void {
  if (!(v > 0) || !Number.isFinite(v)) throw new RangeError(`${name} must be finite and above 0 (got ${v}).`);
}

/**
 * Critical bandwidth around a tone, ECMA-418-1 clause 10, formula 2 [1], the analytic form of
 * Zwicker & Terhardt [3]: Δfc = 25 + 75·[1 + 1.4·(ft/1000)²]^0.69 Hz (162.2 Hz at 1 kHz).
 *
 * @param ftHz  tone frequency ft (Hz), ≥ 0
 * @returns Δfc (Hz)
 *
 * References: [1] ECMA-418-1 (2024), formula 2. [3] E. Zwicker, E. Terhardt, J. Acoust. Soc. Am.
 *   68(5) (1980) 1523–1525.
 */
export function criticalBandwidthHz(ftHz: number): number {
  const r = ftHz / 1000;
  return 25 + 75 * Math.pow(1 + 1.4 * r * r, 0.69);
}

/**
 * Edges of the critical band centred geometrically on a tone, ECMA-418-1 clause 10 [1]:
 * f1 = −Δfc/2 + √(Δfc² + 4·ft²)/2 and f2 = f1 + Δfc, so that f1·f2 = ft² and f2 − f1 = Δfc
 * (922.2 / 1084.4 Hz at 1 kHz).
 *
 * @param ftHz  tone frequency ft (Hz), ≥ 0
 * @returns [f1, f2] (Hz)
 *
 * References: [1] ECMA-418-1 (2024), clause 10.
 */
export function criticalBandEdges(ftHz: number): [number, number] {
  const dfc = criticalBandwidthHz(ftHz);
  const f1 = -dfc / 2 + Math.sqrt(dfc * dfc + 4 * ftHz * ftHz) / 2;
  return [f1, f1 + dfc];
}

/**
 * Lower edge f1,L of the PR lower band, the fitted polynomial of ECMA-418-1 Table 2 [1]:
 * f1,L = C0 + C1·ft + C2·ft² with (C0, C1, C2) = (20, 0, 0) for 89.1–171.4 Hz,
 * (−149.5, 1.001, −6.90·10⁻⁵) for 171.4–1600 Hz and (6.8, 0.806, −8.20·10⁻⁶) above 1600 Hz.
 *
 * @param ftHz  tone frequency ft (Hz), in scope
 * @returns f1,L (Hz)
 *
 * References: [1] ECMA-418-1 (2024), clause 12, Table 2.
 */
export function prLowerBandStartHz(ftHz: number): number {
  if (ftHz <= PR_LOW_TONE_HZ) return 20;
  if (ftHz <= 1600) return -149.5 + 1.001 * ftHz - 6.9e-5 * ftHz * ftHz;
  return 6.8 + 0.806 * ftHz - 8.2e-6 * ftHz * ftHz;
}

/**
 * Upper edge f2,U of the PR upper band, the fitted polynomial of ECMA-418-1 Table 3 [1]:
 * f2,U = C0 + C1·ft + C2·ft² with (C0, C1, C2) = (149.5, 1.035, 7.70·10⁻⁵) for 89.1–1600 Hz and
 * (3.3, 1.215, 2.16·10⁻⁵) above 1600 Hz.
 *
 * @param ftHz  tone frequency ft (Hz), in scope
 * @returns f2,U (Hz)
 *
 * References: [1] ECMA-418-1 (2024), clause 12, Table 3.
 */
export function prUpperBandEndHz(ftHz: number): number {
  if (ftHz <= 1600) return 149.5 + 1.035 * ftHz + 7.7e-5 * ftHz * ftHz;
  return 3.3 + 1.215 * ftHz + 2.16e-5 * ftHz * ftHz;
}

/** The three bands of the prominence ratio (Hz): lower [f1,L, f1,M], middle [f1,M, f2,M], upper [f2,M, f2,U]. */
export interface ProminenceBands {
  lowerHz: [number, number];
  middleHz: [number, number];
  upperHz: [number, number];
}

/**
 * The bands of the prominence ratio around a tone, ECMA-418-1 clause 12 [1]: the middle band is the
 * critical band of {@link criticalBandEdges}, the lower band runs from f1,L (Table 2) up to it and
 * the upper band from it up to f2,U (Table 3).
 *
 * @param ftHz  tone frequency ft (Hz)
 * @returns the three bands (Hz), or null outside the scope 89.1 Hz–11 220 Hz
 *
 * References: [1] ECMA-418-1 (2024), clause 12, Tables 2–3.
 */
export function prominenceBands(ftHz: number): ProminenceBands | null {
  if (!inTonalityScope(ftHz)) return null;
  const [f1, f2] = criticalBandEdges(ftHz);
  return { lowerHz: [prLowerBandStartHz(ftHz), f1], middleHz: [f1, f2], upperHz: [f2, prUpperBandEndHz(ftHz)] };
}

/**
 * Prominence criterion for the tone-to-noise ratio, ECMA-418-1 formulae 12–13 [1]:
 * ΔLT ≥ 8.0 dB for ft ≥ 1 kHz, ΔLT ≥ 8.0 + 8.33·lg(1000/ft) dB below (16.33 dB at 100 Hz).
 *
 * @param ftHz  tone frequency ft (Hz), > 0
 * @returns the limit (dB)
 *
 * References: [1] ECMA-418-1 (2024), clause 11, formulae 12–13.
 */
export function tnrLimitDb(ftHz: number): number {
  return ftHz >= 1000 ? 8 : 8 + 8.33 * Math.log10(1000 / ftHz);
}

/**
 * Prominence criterion for the prominence ratio, ECMA-418-1 formulae 25–26 [1]:
 * ΔLP ≥ 9.0 dB for ft ≥ 1 kHz, ΔLP ≥ 9.0 + 10·lg(1000/ft) dB below (19.0 dB at 100 Hz).
 *
 * @param ftHz  tone frequency ft (Hz), > 0
 * @returns the limit (dB)
 *
 * References: [1] ECMA-418-1 (2024), clause 12, formulae 25–26.
 */
export function prLimitDb(ftHz: number): number {
  return ftHz >= 1000 ? 9 : 9 + 10 * Math.log10(1000 / ftHz);
}

/**
 * Sum of the bins over [loHz, hiHz], bin k covering [(k − ½)·binHz, (k + ½)·binHz] and counted by
 * the fraction inside (the convention of levels.ts bandPowersFromSpectrum). The caller keeps the
 * band inside the spectrum's cover [½·binHz, (n − 1)·binHz].
 */
function binSum(p: Float32Array | Float64Array, binHz: number, loHz: number, hiHz: number): number {
  const a = loHz / binHz;
  const e = hiHz / binHz;
  const ka = Math.floor(a + 0.5);
  const kb = Math.floor(e + 0.5);
  if (ka === kb) return p[ka] * (e - a);
  let sum = p[ka] * (ka + 0.5 - a) + p[kb] * (e - (kb - 0.5));
  for (let k = ka + 1; k < kb; k++) sum += p[k];
  return sum;
}

/** The part of [loHz, hiHz] the spectrum covers, [½·binHz, (n − 1)·binHz], or null if none. */
function covered(n: number, binHz: number, loHz: number, hiHz: number): [number, number] | null {
  const lo = Math.max(loHz, 0.5 * binHz);
  const hi = Math.min(hiHz, (n - 1) * binHz);
  return hi > lo ? [lo, hi] : null;
}

/** Result of {@link toneToNoiseRatio}. */
export interface ToneToNoiseResult {
  /** Tone frequency ft the critical band and the criterion were evaluated for (Hz): the caller's value. */
  ft: number;
  /** Frequency of the spectrum's peak bin taken as the tone (Hz). */
  peakHz: number;
  /** Tone-to-noise ratio ΔLT = 10·lg(Wt/Wn) (dB); +Infinity if no noise is left, −Infinity if no tone. */
  deltaLtDb: number;
  /** The tone band: centre frequencies of its two edge bins, the level minima either side of the peak (Hz). */
  toneBandHz: [number, number];
  /** The critical band [f1, f2] around ft (Hz). */
  criticalBandHz: [number, number];
  /** Wt, the tone's mean square, noise under it removed (U²). */
  toneMeanSquare: number;
  /** Wn, the noise mean square in the critical band, rescaled to Δfc (U²). */
  noiseMeanSquare: number;
  /** Whether ΔLT ≥ limitDb. */
  prominent: boolean;
  /** The prominence criterion at ft, formulae 12–13 (dB). */
  limitDb: number;
}

/**
 * Tone-to-noise ratio of a tone, ECMA-418-1 clause 11 [1] (ECMA-74 Annex D [2]):
 * ΔLT = 10·lg(Wt/Wn), with Wn = (Wtot − Wt)·Δfc/Δftot.
 *
 * - The tone is the largest bin within ±15 % of Δfc around ft. Its band runs from that peak outward,
 *   on each side, for as long as the level keeps falling, to the first level minimum (at least one
 *   bin, at most to ±15 % of Δfc around ft, and never past the critical band).
 * - Wt: the sum of the tone band's bins less the noise floor under it, taken as the straight line
 *   between the two edge bins' levels, divided by the ENBW (a simplified reading of clause 11's
 *   tone-bandwidth rule).
 * - Wtot: the power in the critical band [f1, f2] of {@link criticalBandEdges}, over the width
 *   Δftot of it the spectrum actually covers; Wn rescales the rest to the full Δfc.
 * - Criterion {@link tnrLimitDb}: formulae 12–13.
 *
 * ECMA-74 Annex D wrote the rescaling as Δfc/(Δftot − Δft) with Δft the tone bandwidth; here the
 * noise under the tone stays in Wtot − Wt, so Δftot is the right divisor.
 *
 * @param spectrum  averaged one-sided power spectrum, mean square per bin (U²), bin k at k·binHz;
 *                  Hann window and power averaging per [1]
 * @param binHz     bin spacing fs/N (Hz), > 0
 * @param enbwBins  equivalent noise bandwidth of the window (bins), > 0: 1.5 for Hann [5]
 * @param ftHz      tone frequency ft (Hz)
 * @returns the result, or null if ft is outside the scope 89.1 Hz–11 220 Hz or the spectrum does not
 *          reach ft
 * @throws RangeError if binHz or enbwBins is not finite and above 0
 *
 * References: [1] ECMA-418-1 (2024), clauses 10–11, formulae 2 and 12–13. [2] ECMA-74, Annex D.
 *   [5] F. J. Harris, Proc. IEEE 66(1) (1978) 51–83.
 */
export function toneToNoiseRatio(
  spectrum: Float32Array | Float64Array,
  binHz: number,
  enbwBins: number,
  ftHz: number,
): ToneToNoiseResult | null {
  checkPositive('binHz', binHz);
  checkPositive('enbwBins', enbwBins);
  if (!inTonalityScope(ftHz)) return null;
  const p = spectrum;
  const n = p.length;
  if (n < 4 || ftHz > (n - 2) * binHz) return null;

  const dfc = criticalBandwidthHz(ftHz);
  const [f1, f2] = criticalBandEdges(ftHz);
  const half = TONE_SEARCH_FRACTION * dfc;
  // Bins allowed in the tone band: inside ±15 % of Δfc around ft and inside the critical band,
  // never DC (k ≥ 1); the Nyquist bin may be an edge.
  const kFirst = Math.max(1, Math.ceil(Math.max(ftHz - half, f1) / binHz));
  const kLast = Math.min(n - 1, Math.floor(Math.min(ftHz + half, f2) / binHz));
  let peak = Math.min(Math.max(Math.round(ftHz / binHz), 2), n - 2);
  for (let k = kFirst; k <= kLast; k++) if (p[k] > p[peak]) peak = k;
  // Keep one bin either side of the peak, and DC out of the band.
  peak = Math.min(Math.max(peak, 2), n - 2);

  // Walk down each flank while the level falls; at least one bin either side of the peak.
  const loLimit = Math.max(1, Math.min(kFirst, peak - 1));
  const hiLimit = Math.min(n - 1, Math.max(kLast, peak + 1));
  let lo = peak - 1;
  while (lo - 1 >= loLimit && p[lo - 1] < p[lo]) lo--;
  let hi = peak + 1;
  while (hi + 1 <= hiLimit && p[hi + 1] < p[hi]) hi++;

  let toneSum = 0;
  for (let k = lo; k <= hi; k++) toneSum += p[k];
  // The noise floor under the tone: a straight line between the edge levels, summed over lo…hi.
  const floorSum = ((hi - lo + 1) * (p[lo] + p[hi])) / 2;
  const wt = Math.max(0, toneSum - floorSum) / enbwBins;

  const cover = covered(n, binHz, f1, f2);
  if (!cover) return null;
  const dftot = cover[1] - cover[0];
  const wtot = binSum(p, binHz, cover[0], cover[1]) / enbwBins;
  const wn = (Math.max(0, wtot - wt) * dfc) / dftot;

  const deltaLtDb = wt === 0 ? -Infinity : wn === 0 ? Infinity : 10 * Math.log10(wt / wn);
  const limitDb = tnrLimitDb(ftHz);
  return {
    ft: ftHz,
    peakHz: peak * binHz,
    deltaLtDb,
    toneBandHz: [lo * binHz, hi * binHz],
    criticalBandHz: [f1, f2],
    toneMeanSquare: wt,
    noiseMeanSquare: wn,
    prominent: deltaLtDb >= limitDb,
    limitDb,
  };
}

/** Result of {@link prominenceRatio}. */
export interface ProminenceRatioResult {
  /** Tone frequency ft (Hz): the caller's value. */
  ft: number;
  /** Prominence ratio ΔLP = 10·lg WM − 10·lg[(WL + WU)/2] (dB); NaN if a band lies outside the spectrum. */
  deltaLpDb: number;
  /** The three bands (Hz). */
  bands: ProminenceBands;
  /** WL, WM, WU: mean squares in the lower (normalised to 100 Hz for ft ≤ 171.4 Hz), middle and upper bands (U²). */
  lowerMeanSquare: number;
  middleMeanSquare: number;
  upperMeanSquare: number;
  /** Whether ΔLP ≥ limitDb. */
  prominent: boolean;
  /** The prominence criterion at ft, formulae 25–26 (dB). */
  limitDb: number;
}

/**
 * Prominence ratio of a tone, ECMA-418-1 clause 12 [1] (ECMA-74 Annex D [2]):
 * ΔLP = 10·lg WM − 10·lg[(WL + WU)/2], WM the power in the critical band around ft, WL in
 * [f1,L, f1,M] and WU in [f2,M, f2,U] ({@link prominenceBands}, Tables 2–3). For ft ≤ 171.4 Hz the
 * lower band starts at 20 Hz and is normalised to a 100 Hz width, WL → WL·100/ΔfL (formula 24).
 * Criterion {@link prLimitDb}: formulae 25–26.
 *
 * Band powers are sums of bins, edge bins in part, divided by the ENBW (see the module note), so
 * they are true mean squares for tones and noise alike.
 *
 * @param spectrum  averaged one-sided power spectrum, mean square per bin (U²), bin k at k·binHz;
 *                  Hann window and power averaging per [1]
 * @param binHz     bin spacing fs/N (Hz), > 0
 * @param enbwBins  equivalent noise bandwidth of the window (bins), > 0: 1.5 for Hann [5]
 * @param ftHz      tone frequency ft (Hz)
 * @returns the result, or null if ft is outside the scope 89.1 Hz–11 220 Hz; deltaLpDb is NaN (and
 *          prominent false) if the spectrum does not cover all three bands, from above ½·binHz to
 *          at most (length − 1)·binHz
 * @throws RangeError if binHz or enbwBins is not finite and above 0
 *
 * References: [1] ECMA-418-1 (2024), clause 12, Tables 2–3, formulae 24–26. [2] ECMA-74, Annex D.
 *   [5] F. J. Harris, Proc. IEEE 66(1) (1978) 51–83.
 */
export function prominenceRatio(
  spectrum: Float32Array | Float64Array,
  binHz: number,
  enbwBins: number,
  ftHz: number,
): ProminenceRatioResult | null {
  checkPositive('binHz', binHz);
  checkPositive('enbwBins', enbwBins);
  const bands = prominenceBands(ftHz);
  if (!bands) return null;
  const n = spectrum.length;
  const top = (n - 1) * binHz;
  const [fl, f1] = bands.lowerHz;
  const [f2, fu] = bands.upperHz;
  const limitDb = prLimitDb(ftHz);
  if (!(fl >= 0.5 * binHz && fu <= top)) {
    const nan = Number.NaN;
    return {
      ft: ftHz,
      deltaLpDb: nan,
      bands,
      lowerMeanSquare: nan,
      middleMeanSquare: nan,
      upperMeanSquare: nan,
      prominent: false,
      limitDb,
    };
  }
  let wl = binSum(spectrum, binHz, fl, f1) / enbwBins;
  if (ftHz <= PR_LOW_TONE_HZ) wl *= 100 / (f1 - fl);
  const wm = binSum(spectrum, binHz, f1, f2) / enbwBins;
  const wu = binSum(spectrum, binHz, f2, fu) / enbwBins;
  const deltaLpDb = 10 * Math.log10(wm) - 10 * Math.log10((wl + wu) / 2);
  return {
    ft: ftHz,
    deltaLpDb,
    bands,
    lowerMeanSquare: wl,
    middleMeanSquare: wm,
    upperMeanSquare: wu,
    prominent: deltaLpDb >= limitDb,
    limitDb,
  };
}

/**
 * How far a tone's level lies above the free-field threshold of hearing of ISO 389-7:2005 [4], the
 * audibility screen a prominent tone must also pass [1]: L − T(ft), T from
 * hearing-threshold.ts hearingThresholdDb (linear in lg f between the Table 1 entries).
 * The tone's level is e.g. toDb(toneMeanSquare, REF_SOUND_PRESSURE_PA) of a {@link toneToNoiseRatio}
 * result for a spectrum in Pa² (levels.ts).
 *
 * @param levelDb  the tone's sound pressure level (dB re 20 µPa)
 * @param ftHz     its frequency (Hz)
 * @returns L − T(ft) (dB), positive when audible; NaN outside 20 Hz–18 kHz
 *
 * References: [1] ECMA-418-1 (2024). [4] ISO 389-7:2005, Table 1.
 */
export function toneAudibility(levelDb: number, ftHz: number): number {
  return levelDb - hearingThresholdDb(ftHz);
}
