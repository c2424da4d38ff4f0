/**
 * One-third-octave bands of IEC 61260-1:2014 in the base-10 system, with the nominal labels of
 * ISO 266.
 *
 * References:
 *   [1] IEC 61260-1:2014, Electroacoustics — Octave-band and fractional-octave-band filters —
 *       Part 1: Specifications (octave frequency ratio G = 10^(3/10), reference frequency 1000 Hz,
 *       exact mid-band and band-edge frequencies).
 *   [2] ISO 266:1997, Acoustics — Preferred frequencies (the R10 series of ISO 3 preferred numbers).
 */

/** One band: x is the band number (0 is the 1 kHz band); frequencies in Hz. */
export interface ThirdOctaveBand {
  x: number;
  nominalHz: number;
  centerHz: number;
  lowerHz: number;
  upperHz: number;
}

/** Octave frequency ratio of the base-10 system [1], G = 10^(3/10) ≈ 1.9952623. */
export const OCTAVE_RATIO_G = 10 ** 0.3;

/** Reference frequency of [1] (Hz). */
export const REFERENCE_FREQUENCY_HZ = 1000;

// ISO 266 preferred values for one decade, times 100 so that they are exact integers [2].
const R10_MANTISSA_X100 = [100, 125, 160, 200, 250, 315, 400, 500, 630, 800];

/**
 * 1000 Hz · 10^(e/d), with whole decades exact: G^(x/3) = 10^(x/10), and dividing by an exactly
 * representable power of ten rounds correctly where multiplying by 10^(−k) would not.
 */
function decadePower(e: number, d: number): number {
  return e >= 0 ? REFERENCE_FREQUENCY_HZ * 10 ** (e / d) : REFERENCE_FREQUENCY_HZ / 10 ** (-e / d);
}

function nominalHz(x: number): number {
  const decade = Math.floor(x / 10);
  const m = R10_MANTISSA_X100[x - 10 * decade];
  // m · 10^(decade + 1): 1000 Hz is m = 100 at decade 0.
  const p = decade + 1;
  return p >= 0 ? m * 10 ** p : m / 10 ** -p;
}

/**
 * The one-third-octave band number x of IEC 61260-1:2014 [1] in the base-10 system: exact mid-band
 * frequency fm = fr·G^(x/3), band edges fm·G^(∓1/6), with G = 10^(3/10) and fr = 1000 Hz; the nominal
 * label is the ISO 266 preferred frequency [2] of the same band.
 *
 * Adjacent bands share bit-identical edges (both are computed as fr·10^((2x ± 1)/20)), so band
 * sums neither overlap nor leave gaps.
 *
 * @param x  band number (integer); 0 is the 1 kHz band, −17 the 20 Hz band, 13 the 20 kHz band
 * @returns the band, frequencies in Hz
 * @throws RangeError if x is not an integer
 *
 * References:
 *   [1] IEC 61260-1:2014, Electroacoustics — Octave-band and fractional-octave-band filters — Part 1.
 *   [2] ISO 266:1997, Acoustics — Preferred frequencies.
 */
export function thirdOctaveBand(x: number): ThirdOctaveBand {
  if (!Number.isInteger(x)) throw new RangeError(`Band number x=${x} must be an integer.`);
  return {
    x,
    nominalHz: nominalHz(x),
    centerHz: decadePower(x, 10),
    lowerHz: decadePower(2 * x - 1, 20),
    upperHz: decadePower(2 * x + 1, 20),
  };
}

/**
 * The one-third-octave bands of IEC 61260-1:2014 [1] (base 10) whose ISO 266 nominal frequency [2]
 * lies between the two limits, in ascending order.
 *
 * @param minNominalHz  lowest nominal mid-band frequency to include (Hz), > 0; default 20
 * @param maxNominalHz  highest nominal mid-band frequency to include (Hz); default 20000
 * @returns the bands (see {@link thirdOctaveBand}); empty if no nominal frequency is in range
 * @throws RangeError if a limit is not finite or minNominalHz ≤ 0
 *
 * References:
 *   [1] IEC 61260-1:2014, Electroacoustics — Octave-band and fractional-octave-band filters — Part 1.
 *   [2] ISO 266:1997, Acoustics — Preferred frequencies.
 */
export function thirdOctaveBands(minNominalHz = 20, maxNominalHz = 20000): ThirdOctaveBand[] {
  if (!Number.isFinite(minNominalHz) || !Number.isFinite(maxNominalHz) || minNominalHz <= 0) {
    throw new RangeError(`Band limits must be finite and above 0 Hz (got ${minNominalHz}–${maxNominalHz} Hz).`);
  }
  const bands: ThirdOctaveBand[] = [];
  if (maxNominalHz < minNominalHz) return bands;
  // Nominal and exact frequencies differ by about 1 % at most, far less than one band (26 %), so one
  // spare band either side is enough to catch every nominal frequency in range.
  const xLo = Math.floor(10 * Math.log10(minNominalHz / REFERENCE_FREQUENCY_HZ)) - 1;
  const xHi = Math.ceil(10 * Math.log10(maxNominalHz / REFERENCE_FREQUENCY_HZ)) + 1;
  for (let x = xLo; x <= xHi; x++) {
    const nominal = nominalHz(x);
    if (nominal >= minNominalHz && nominal <= maxNominalHz) bands.push(thirdOctaveBand(x));
  }
  return bands;
}
