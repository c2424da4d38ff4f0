/**
 * Band and overall mean squares from power spectra, levels in decibels against the reference values
 * of ISO 1683:2015, and the broadband RMS against time.
 *
 * Spectrum convention used throughout: one-sided, "spectrum" scaling, in U² per bin (U the signal's
 * unit): P[k] = 2·|X[k]|²/(Σw)² for 0 < k < N/2, where X is the unnormalised DFT of the windowed
 * block w·x. A bin-centred sine of amplitude A then reads A²/2 in its own bin, while the sum of all
 * bins of any signal is ENBW·(mean square), ENBW = N·Σw²/(Σw)² in bins [1, 2]. Dividing sums of bins
 * by ENBW therefore gives the true mean square for tones and broadband noise alike.
 *
 * References:
 *   [1] G. Heinzel, A. Rüdiger, R. Schilling, "Spectrum and spectral density estimation by the
 *       Discrete Fourier transform (DFT), including a comprehensive list of window functions and
 *       some new flat-top windows", technical report, 2002.
 *   [2] F. J. Harris, "On the use of windows for harmonic analysis with the discrete Fourier
 *       transform", Proc. IEEE 66(1) (1978) 51–83.
 *   [3] ISO 1683:2015, Acoustics — Preferred reference values for acoustical and vibratory levels.
 */
import type { ThirdOctaveBand } from './third-octave';

/** Reference sound pressure in gases, 20 µPa (Pa) [ISO 1683:2015]. */
export const REF_SOUND_PRESSURE_PA = 20e-6;
/** Reference vibration acceleration, 1 µm/s² (m/s²) [ISO 1683:2015]. */
export const REF_ACCELERATION_MS2 = 1e-6;
/** Reference vibration velocity, 1 nm/s (m/s) [ISO 1683:2015]. */
export const REF_VELOCITY_MS = 1e-9;
/** Standard acceleration of gravity gn (m/s²), exact by the declaration of the 3rd CGPM (1901). */
export const STANDARD_GRAVITY = 9.80665;

/**
 * A level reference: a named one, or an RMS value in the signal's unit. 'g' gives levels re 1 gn
 * (dB re 1 g); 'unit' gives levels re 1 of the signal's unit.
 */
export type DbReference = 'sound-pressure' | 'acceleration-iso' | 'velocity-iso' | 'g' | 'unit' | number;

function checkPositive(name: string, v: number): void {
  if (!(v > 0) || !Number.isFinite(v)) throw new RangeError(`${name} must be finite and above 0 (got ${v}).`);
}

/**
 * The mean square in each band, from a one-sided "spectrum"-scaled power spectrum of a windowed
 * block (see the module note): the sum of the bins weighted by how much of each bin lies inside the
 * band, divided by the window's equivalent noise bandwidth (ENBW) [1, 2]. Bin k is taken to cover
 * [(k − ½)·binHz, (k + ½)·binHz], so the two edge bins of a band count in part and adjacent bands
 * that share an edge share those bins without loss or double counting.
 *
 * A band the spectrum does not cover entirely is NaN (not 0): one reaching above the last bin,
 * (length − 1)·binHz (the Nyquist frequency for an even block length), or below ½·binHz, into the
 * DC bin, which never counts.
 *
 * @param powerSpectrum  one-sided power spectrum, mean square per bin (U²), bin k at k·binHz
 * @param binHz          bin spacing fs/N (Hz), > 0
 * @param bands          bands with lowerHz < upperHz (Hz), e.g. from thirdOctaveBands
 * @param enbwBins       equivalent noise bandwidth of the window (bins), > 0: 1 rectangular, 1.5 Hann
 * @returns the mean square in each band (U²), in the order of bands
 * @throws RangeError if binHz or enbwBins is not finite and above 0
 *
 * References:
 *   [1] G. Heinzel, A. Rüdiger, R. Schilling, "Spectrum and spectral density estimation by the
 *       Discrete Fourier transform (DFT), …", technical report, 2002.
 *   [2] F. J. Harris, Proc. IEEE 66(1) (1978) 51–83.
 */
export function bandPowersFromSpectrum(
  powerSpectrum: Float32Array | Float64Array,
  binHz: number,
  bands: ThirdOctaveBand[],
  enbwBins: number,
): Float64Array {
  checkPositive('binHz', binHz);
  checkPositive('enbwBins', enbwBins);
  const p = powerSpectrum;
  const topHz = (p.length - 1) * binHz;
  const minHz = 0.5 * binHz;
  const invBin = 1 / binHz;
  const invEnbw = 1 / enbwBins;
  const out = new Float64Array(bands.length);
  for (let i = 0; i < bands.length; i++) {
    const loHz = bands[i].lowerHz;
    const hiHz = bands[i].upperHz;
    if (!(loHz >= minHz && hiHz <= topHz && hiHz > loHz)) {
      out[i] = NaN;
      continue;
    }
    // Band edges in bins; bin k spans [k − ½, k + ½], so the bin holding edge e is floor(e + ½).
    const a = loHz * invBin;
    const e = hiHz * invBin;
    const ka = Math.floor(a + 0.5);
    const kb = Math.floor(e + 0.5);
    let sum: number;
    if (ka === kb) {
      sum = p[ka] * (e - a);
    } else {
      sum = p[ka] * (ka + 0.5 - a) + p[kb] * (e - (kb - 0.5));
      for (let k = ka + 1; k < kb; k++) sum += p[k];
    }
    out[i] = sum * invEnbw;
  }
  return out;
}

/**
 * The overall mean square of a one-sided "spectrum"-scaled power spectrum (see the module note):
 * the sum of the bins fromBin … toBin − 1 divided by the window's ENBW [1, 2]. DC (bin 0) is left
 * out by default, so the result is the mean square of the fluctuating part.
 *
 * @param powerSpectrum  one-sided power spectrum, mean square per bin (U²)
 * @param enbwBins       equivalent noise bandwidth of the window (bins), > 0
 * @param fromBin        first bin summed (integer), default 1
 * @param toBin          one past the last bin summed (integer), default powerSpectrum.length
 * @returns the mean square (U²)
 * @throws RangeError if enbwBins is not finite and above 0, or the bin range is not
 *         0 ≤ fromBin ≤ toBin ≤ length in integers
 *
 * References:
 *   [1] G. Heinzel, A. Rüdiger, R. Schilling, "Spectrum and spectral density estimation by the
 *       Discrete Fourier transform (DFT), …", technical report, 2002.
 *   [2] F. J. Harris, Proc. IEEE 66(1) (1978) 51–83.
 */
export function overallPower(
  powerSpectrum: Float32Array | Float64Array,
  enbwBins: number,
  fromBin = 1,
  toBin = powerSpectrum.length,
): number {
  checkPositive('enbwBins', enbwBins);
  if (!Number.isInteger(fromBin) || !Number.isInteger(toBin) || fromBin < 0 || toBin < fromBin || toBin > powerSpectrum.length) {
    throw new RangeError(`Bin range ${fromBin}…${toBin} must satisfy 0 ≤ from ≤ to ≤ ${powerSpectrum.length}.`);
  }
  let sum = 0;
  for (let k = fromBin; k < toBin; k++) sum += powerSpectrum[k];
  return sum / enbwBins;
}

/**
 * A level in decibels from a mean square: L = 10·lg(meanSquare / ref²), the power-quantity level of
 * ISO 1683:2015 [1] (written with the RMS reference, so 10·lg of a mean square equals 20·lg of an RMS).
 *
 * @param meanSquare  mean square (U²), ≥ 0
 * @param refRms      reference RMS value (U), > 0, e.g. from {@link dbReference}
 * @returns the level (dB re refRms); −Infinity for 0, NaN for a negative or NaN mean square
 * @throws RangeError if refRms is not finite and above 0
 *
 * References:
 *   [1] ISO 1683:2015, Acoustics — Preferred reference values for acoustical and vibratory levels.
 */
export function toDb(meanSquare: number, refRms: number): number {
  checkPositive('refRms', refRms);
  return 10 * Math.log10(meanSquare / (refRms * refRms));
}

/**
 * The RMS reference value for a level: 20 µPa for sound pressure in gases, 1 µm/s² for acceleration
 * and 1 nm/s for velocity (ISO 1683:2015 [1]); 1 gn = 9.80665 m/s² for levels re 1 g [2]; 1 for
 * levels re one unit; a number is taken as the reference itself.
 *
 * @param kind  a named reference or a reference RMS value (U), > 0
 * @returns the reference RMS value (Pa, m/s², m/s, or the signal's unit)
 * @throws RangeError if a numeric reference is not finite and above 0
 *
 * References:
 *   [1] ISO 1683:2015, Acoustics — Preferred reference values for acoustical and vibratory levels.
 *   [2] Declaration on the unit of mass and on the definition of weight; conventional value of gn,
 *       3rd General Conference on Weights and Measures (CGPM), 1901.
 */
export function dbReference(kind: DbReference): number {
  if (typeof kind === 'number') {
    checkPositive('Reference', kind);
    return kind;
  }
  switch (kind) {
    case 'sound-pressure':
      return REF_SOUND_PRESSURE_PA;
    case 'acceleration-iso':
      return REF_ACCELERATION_MS2;
    case 'velocity-iso':
      return REF_VELOCITY_MS;
    case 'g':
      return STANDARD_GRAVITY;
    case 'unit':
      return 1;
  }
}

/**
 * Bin-by-bin product of a power spectrum and power gains, e.g. those of weightingGainsPower, to
 * weight a spectrum in the frequency domain before band or overall sums.
 *
 * @param spectrum  power spectrum (U² per bin)
 * @param gains     power gains (dimensionless), the same length
 * @param out       optional array for the result, the same length (may be spectrum itself if it is
 *                  a Float64Array)
 * @returns the weighted spectrum (U² per bin)
 * @throws RangeError if the lengths differ
 */
export function applyPowerGains(
  spectrum: Float32Array | Float64Array,
  gains: Float32Array | Float64Array,
  out: Float64Array = new Float64Array(spectrum.length),
): Float64Array {
  const n = spectrum.length;
  if (gains.length !== n || out.length !== n) {
    throw new RangeError(`Spectrum (${n}), gains (${gains.length}) and output (${out.length}) lengths differ.`);
  }
  for (let k = 0; k < n; k++) out[k] = spectrum[k] * gains[k];
  return out;
}

/**
 * The RMS of consecutive, non-overlapping blocks of a signal: the unweighted time-averaged level of
 * IEC 61672-1:2013 [1] over each block, as a root mean square. Block i holds samples
 * i·n … i·n + n − 1 with n = round(blockS·fsHz), spans [i·n/fs, (i + 1)·n/fs) and is stamped with
 * the middle of that span; a last, incomplete block is dropped. DC is included (remove the mean
 * first for the fluctuating part only).
 *
 * @param x       samples (U)
 * @param fsHz    sampling rate (Hz), > 0
 * @param blockS  block length (s), > 0, at least one sample
 * @returns tS, block centre times (s), and rms, the block RMS values (U)
 * @throws RangeError if fsHz or blockS is not finite and above 0, or a block is under one sample
 *
 * References:
 *   [1] IEC 61672-1:2013, Electroacoustics — Sound level meters — Part 1: Specifications
 *       (time-averaged sound level).
 */
export function rmsOverTime(x: Float32Array, fsHz: number, blockS: number): { tS: Float64Array; rms: Float64Array } {
  checkPositive('fsHz', fsHz);
  checkPositive('blockS', blockS);
  const n = Math.round(blockS * fsHz);
  if (n < 1) throw new RangeError(`A block of ${blockS} s at ${fsHz} Hz is shorter than one sample.`);
  const count = Math.floor(x.length / n);
  const tS = new Float64Array(count);
  const rms = new Float64Array(count);
  for (let b = 0, start = 0; b < count; b++, start += n) {
    let sum = 0;
    for (let i = start, end = start + n; i < end; i++) {
      const v = x[i];
      sum += v * v;
    }
    rms[b] = Math.sqrt(sum / n);
    tS[b] = (start + 0.5 * n) / fsHz;
  }
  return { tS, rms };
}
