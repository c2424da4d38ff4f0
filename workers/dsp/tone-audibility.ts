/**
 * Tonal audibility ΔL of ISO/TS 20065:2016 [1] (the method of ISO 1996-2:2017 Annex J [2], after
 * DIN 45681): how far a tone's level L_T lies above the masked threshold L_G + a_v set by the noise
 * in the critical band around it. Also a finder for the strongest distinct tones of a spectrum.
 *
 * Input convention as tonality.ts: an averaged one-sided power spectrum in mean square per bin
 * (Pa²), bin k at k·binHz, Hann window (ENBW 1.5 bins [3]) unless told otherwise. Summed tone lines
 * divided by the ENBW give the tone's mean square; a line of noise holds the noise power in
 * binHz·ENBW.
 *
 * Steps (clause numbers of [1] recalled from memory where marked):
 * - Critical band: Δf_c = 25 + 75·[1 + 1.4·(f_T/kHz)²]^0.69 Hz [1] (the Zwicker–Terhardt form [4]),
 *   with the tone at the geometric mean of its edges, as in ECMA-418-1: tonality.ts
 *   criticalBandwidthHz and criticalBandEdges.
 * - Mean narrow-band level L_S: the energetic mean of the lines in the critical band without the
 *   tone's line, repeated without the lines more than 6 dB above the last mean, until it changes by
 *   less than 0.005 dB or fewer than 5 lines remain on a side of the tone; less 10·lg(ENBW), so it is
 *   the level in one line spacing Δf.
 * - Tone level L_T: the peak line and the contiguous lines more than 6 dB above the mean, summed,
 *   less 10·lg(ENBW) (from memory).
 * - Masking noise level L_G = L_S + 10·lg(Δf_c/Δf).
 * - Masking index a_v = −2 − lg[1 + (f_T/502 Hz)^2.5] dB [1].
 * - Audibility ΔL = L_T − L_G − a_v [1]; the masked threshold is L_G + a_v.
 * Not done here: [1]'s checks of a tone's distinctness (edge steepness, bandwidth), the summing of
 * several tones in one critical band, and its 50 Hz lower limit; each tone is judged alone.
 *
 * References:
 *   [1] ISO/TS 20065:2016 (ISO/PAS 20065), Acoustics — Objective method for assessing the
 *       audibility of tones in noise — Engineering method, clause 5 (critical band, masking index,
 *       audibility).
 *   [2] ISO 1996-2:2017, Annex J.
 *   [3] F. J. Harris, Proc. IEEE 66(1) (1978) 51–83 (ENBW of the Hann window, 1.5 bins).
 *   [4] E. Zwicker, E. Terhardt, J. Acoust. Soc. Am. 68(5) (1980) 1523–1525.
 *   [5] J. O. Smith, Spectral Audio Signal Processing (W3K, 2011), quadratic interpolation of peaks.
 */
import { REF_SOUND_PRESSURE_PA, toDb } from './levels';
import { criticalBandEdges, criticalBandwidthHz, toneAudibility } from './tonality';

/** ENBW of the Hann window (bins) [3]. */
export const HANN_ENBW_BINS = 1.5;
/** Lines this far above the mean narrow-band level belong to a tone, not the noise [1]. */
const TONE_LINE_MARGIN_DB = 6;
/** The mean narrow-band level's iteration ends when it moves less than this (dB) [1]. */
const LS_TOLERANCE_DB = 0.005;
/** … or when fewer lines than this remain on either side of the tone [1]. */
const LS_MIN_LINES_A_SIDE = 5;
/** A peak counts as a tone for {@link findTones} this far above its critical band's L_S (Fanlight's choice). */
const FIND_MARGIN_DB = 10;
/** Candidate peaks examined by {@link findTones} at most, strongest first. */
const MAX_CANDIDATES = 400;

/** Result of {@link toneAudibilityTs20065}. */
export interface ToneAudibility {
  /** Frequency of the tone's peak, interpolated (Hz). */
  toneHz: number;
  /** Tone level L_T (dB re 20 µPa). */
  levelDb: number;
  /** Masked threshold L_G + a_v (dB re 20 µPa). */
  maskedThresholdDb: number;
  /** Masking index a_v (dB). */
  maskingIndexDb: number;
  /** Audibility ΔL = L_T − L_G − a_v (dB); above 0 the tone is audible over the noise. */
  audibilityDb: number;
  /** The critical band [f1, f2] around the tone (Hz). */
  criticalBandHz: [number, number];
  /** Its width Δf_c (Hz). */
  criticalBandwidthHz: number;
  /** Masking noise level L_G in the critical band (dB re 20 µPa). */
  maskingNoiseDb: number;
  /** Mean narrow-band level L_S, the noise in one line spacing (dB re 20 µPa). */
  narrowBandNoiseDb: number;
  /** L_T above the free-field threshold of hearing of ISO 389-7 (dB), tonality.ts toneAudibility; NaN outside 20 Hz–18 kHz. */
  aboveHearingThresholdDb: number;
}

/** Masking index a_v = −2 − lg[1 + (f/502 Hz)^2.5] (dB), ISO/TS 20065 [1]. */
export function maskingIndexDb(fHz: number): number {
  return -2 - Math.log10(1 + (fHz / 502) ** 2.5);
}

/** The critical band around a tone, [f1, f2] with f1·f2 = f_T² and f2 − f1 = Δf_c [1] (tonality.ts criticalBandEdges). */
export function ts20065CriticalBand(fHz: number): [number, number] {
  return criticalBandEdges(fHz);
}

function checkSpectrum(p: Float64Array, binHz: number): void {
  if (p.length < 8) throw new RangeError(`powerSpectrumPa2 has ${p.length} lines: at least 8 are needed.`);
  if (!(binHz > 0) || !Number.isFinite(binHz)) throw new RangeError(`binHz must be finite and above 0 (got ${binHz}).`);
}

/** Line range [k1, k2] of the critical band around fHz, inside the spectrum and above DC. */
function bandLines(n: number, binHz: number, fHz: number): [number, number] {
  const [f1, f2] = criticalBandEdges(fHz);
  return [Math.max(1, Math.ceil(f1 / binHz)), Math.min(n - 1, Math.floor(f2 / binHz))];
}

/**
 * Mean narrow-band power per line (the power behind L_S before its ENBW correction) [1]: the
 * energetic mean of lines k1…k2 without the tone's line `centre`, repeated without the lines more
 * than 6 dB above the last mean, until it moves by less than 0.005 dB or fewer than 5 lines remain
 * on a side of the tone.
 */
export function meanNarrowBandPower(p: Float64Array, k1: number, k2: number, centre: number): number {
  const limitFactor = 10 ** (TONE_LINE_MARGIN_DB / 10);
  const tolerance = 10 ** (LS_TOLERANCE_DB / 10);
  let limit = Infinity;
  let mean = 0;
  for (let pass = 0; pass < 100; pass++) {
    let sum = 0;
    let below = 0;
    let above = 0;
    for (let k = k1; k <= k2; k++) {
      if (k === centre || !(p[k] <= limit)) continue;
      sum += p[k];
      if (k < centre) below++;
      else above++;
    }
    if (pass > 0 && (below < LS_MIN_LINES_A_SIDE || above < LS_MIN_LINES_A_SIDE)) break;
    const next = below + above ? sum / (below + above) : 0;
    const settled = pass > 0 && next <= mean * tolerance && next * tolerance >= mean;
    mean = next;
    if (settled) break;
    limit = mean * limitFactor;
  }
  return mean;
}

/** The peak line within ±max(2 lines, 5 % of Δf_c) of fHz. */
function peakLine(p: Float64Array, binHz: number, fHz: number): number {
  const reach = Math.max(2, Math.round((0.05 * criticalBandwidthHz(fHz)) / binHz));
  const centre = Math.round(fHz / binHz);
  let best = Math.min(p.length - 2, Math.max(1, centre));
  for (let k = Math.max(1, centre - reach); k <= Math.min(p.length - 2, centre + reach); k++) if (p[k] > p[best]) best = k;
  return best;
}

/** Peak frequency by quadratic interpolation of the log power of three lines [5] (Hz). */
function interpolatedPeakHz(p: Float64Array, binHz: number, k: number): number {
  if (k < 1 || k > p.length - 2 || !(p[k - 1] > 0 && p[k] > 0 && p[k + 1] > 0)) return k * binHz;
  const a = Math.log(p[k - 1]);
  const b = Math.log(p[k]);
  const c = Math.log(p[k + 1]);
  const den = a - 2 * b + c;
  const delta = den < 0 ? Math.max(-0.5, Math.min(0.5, (0.5 * (a - c)) / den)) : 0;
  return (k + delta) * binHz;
}

/**
 * Tonal audibility ΔL of the tone near toneHz, ISO/TS 20065 [1] (steps in the module note).
 *
 * @param powerSpectrumPa2  averaged one-sided power spectrum, mean square per line (Pa²), line k at k·binHz
 * @param binHz             line spacing (Hz), > 0
 * @param toneHz            the tone's frequency (Hz); its peak is sought within ±max(2 lines, 5 % of Δf_c)
 * @param enbwBins          the window's ENBW (lines), 1.5 for Hann [3]
 * @throws RangeError if the spectrum is too short, binHz or toneHz is not usable, or the tone lies
 *         outside the spectrum
 */
export function toneAudibilityTs20065(
  powerSpectrumPa2: Float64Array,
  binHz: number,
  toneHz: number,
  enbwBins = HANN_ENBW_BINS,
): ToneAudibility {
  const p = powerSpectrumPa2;
  checkSpectrum(p, binHz);
  if (!(toneHz > binHz) || toneHz > (p.length - 2) * binHz) {
    throw new RangeError(`toneHz ${toneHz} lies outside the spectrum's lines (${binHz} … ${(p.length - 2) * binHz} Hz).`);
  }
  const peak = peakLine(p, binHz, toneHz);
  const ft = interpolatedPeakHz(p, binHz, peak);
  const dfc = criticalBandwidthHz(ft);
  const [k1, k2] = bandLines(p.length, binHz, ft);
  const ls = meanNarrowBandPower(p, k1, k2, peak);
  // Tone lines: the peak and its contiguous neighbours more than 6 dB above L_S.
  const toneLimit = ls * 10 ** (TONE_LINE_MARGIN_DB / 10);
  let lo = peak;
  while (lo - 1 >= 1 && p[lo - 1] > toneLimit) lo--;
  let hi = peak;
  while (hi + 1 < p.length && p[hi + 1] > toneLimit) hi++;
  let toneSum = 0;
  for (let k = lo; k <= hi; k++) toneSum += p[k];
  const levelDb = toDb(toneSum / enbwBins, REF_SOUND_PRESSURE_PA);
  const narrowBandNoiseDb = toDb(ls / enbwBins, REF_SOUND_PRESSURE_PA);
  const maskingNoiseDb = narrowBandNoiseDb + 10 * Math.log10(dfc / binHz);
  const av = maskingIndexDb(ft);
  return {
    toneHz: ft,
    levelDb,
    maskedThresholdDb: maskingNoiseDb + av,
    maskingIndexDb: av,
    audibilityDb: levelDb - maskingNoiseDb - av,
    criticalBandHz: ts20065CriticalBand(ft),
    criticalBandwidthHz: dfc,
    maskingNoiseDb,
    narrowBandNoiseDb,
    aboveHearingThresholdDb: toneAudibility(levelDb, ft),
  };
}

/**
 * Frequencies of the strongest distinct tonal peaks of a spectrum, strongest first: local maxima
 * (over ±2 lines) whose peak line lies more than 10 dB above the mean narrow-band level L_S of their
 * critical band ([1]'s noise estimate; the margin is Fanlight's), at least 3 lines from a stronger
 * tone already taken. Frequencies are interpolated [5].
 *
 * @param powerSpectrumPa2  averaged one-sided power spectrum, mean square per line (Pa²)
 * @param binHz             line spacing (Hz), > 0
 * @param max               how many tones at most, ≥ 0
 * @throws RangeError if the spectrum is too short or binHz or max is not usable
 */
export function findTones(powerSpectrumPa2: Float64Array, binHz: number, max: number): number[] {
  const p = powerSpectrumPa2;
  checkSpectrum(p, binHz);
  if (!(max >= 0) || !Number.isInteger(max)) throw new RangeError(`max must be a whole number ≥ 0 (got ${max}).`);
  const candidates: number[] = [];
  for (let k = 2; k < p.length - 2; k++) {
    const v = p[k];
    if (v > 0 && v >= p[k - 1] && v >= p[k + 1] && v > p[k - 2] && v > p[k + 2]) candidates.push(k);
  }
  candidates.sort((a, b) => p[b] - p[a]);
  const margin = 10 ** (FIND_MARGIN_DB / 10);
  const taken: number[] = [];
  for (const k of candidates.slice(0, MAX_CANDIDATES)) {
    if (taken.length >= max) break;
    if (taken.some((j) => Math.abs(j - k) < 3)) continue;
    const [k1, k2] = bandLines(p.length, binHz, k * binHz);
    if (p[k] > margin * meanNarrowBandPower(p, k1, k2, k)) taken.push(k);
  }
  return taken.map((k) => interpolatedPeakHz(p, binHz, k));
}
