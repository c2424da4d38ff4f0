/**
 * The reference threshold of hearing for free-field listening, frontal incidence, binaural, by
 * otologically normal young listeners (18–25 years): ISO 389-7:2005 Table 1 [1], in dB re 20 µPa
 * (the sound pressure level at the listener's position with the listener absent).
 *
 * Between the tabulated frequencies the threshold is interpolated linearly in log-frequency (a
 * straight line on the usual logarithmic frequency axis); the standard tabulates values only, so the
 * interpolation is Fanlight's convention, not part of [1]. Outside the table, 20 Hz–18 kHz, the
 * threshold is not defined here and reads NaN.
 *
 * References:
 *   [1] ISO 389-7:2005, Acoustics — Reference zero for the calibration of audiometric equipment —
 *       Part 7: Reference threshold of hearing under free-field and diffuse-field listening
 *       conditions, Table 1 (free field, frontal incidence).
 *   [2] ISO 1683:2015, Acoustics — Preferred reference values for acoustical and vibratory levels
 *       (the 20 µPa reference).
 */

/** Frequencies of ISO 389-7:2005 Table 1 (Hz), ascending. */
export const HEARING_THRESHOLD_FREQUENCIES_HZ: readonly number[] = Object.freeze([
  20, 25, 31.5, 40, 50, 63, 80, 100, 125, 160, 200, 250, 315, 400, 500, 630, 750, 800, 1000, 1250, 1500, 1600,
  2000, 2500, 3000, 3150, 4000, 5000, 6000, 6300, 8000, 9000, 10000, 11200, 12500, 14000, 16000, 18000,
]);

/**
 * Reference thresholds of hearing of ISO 389-7:2005 Table 1, free field, frontal incidence (dB re
 * 20 µPa), one for each entry of {@link HEARING_THRESHOLD_FREQUENCIES_HZ}.
 */
export const HEARING_THRESHOLD_DB: readonly number[] = Object.freeze([
  78.5, 68.7, 59.5, 51.1, 44.0, 37.5, 31.5, 26.5, 22.1, 17.9, 14.4, 11.4, 8.6, 6.2, 4.4, 3.0, 2.4, 2.2, 2.4, 3.5, 2.4,
  1.7, -1.3, -4.2, -5.8, -6.0, -5.4, -1.5, 4.3, 6.0, 12.6, 13.9, 13.9, 13.0, 12.3, 18.4, 40.2, 73.2,
]);

/**
 * The free-field reference threshold of hearing at a frequency, after ISO 389-7:2005 Table 1 [1]:
 * the tabulated value at a tabulated frequency, else linear interpolation in lg f between the two
 * neighbouring entries, T(f) = T_a + (T_b − T_a)·lg(f/f_a)/lg(f_b/f_a).
 *
 * @param fHz  frequency (Hz)
 * @returns the threshold (dB re 20 µPa); NaN for a frequency outside 20 Hz–18 kHz or not a number
 *
 * References:
 *   [1] ISO 389-7:2005, Table 1 (free field, frontal incidence, binaural listening).
 */
export function hearingThresholdDb(fHz: number): number {
  const f = HEARING_THRESHOLD_FREQUENCIES_HZ;
  const t = HEARING_THRESHOLD_DB;
  const last = f.length - 1;
  if (!(fHz >= f[0] && fHz <= f[last])) return NaN;
  if (fHz === f[last]) return t[last];
  // First entry above fHz: the table is short (38 entries), so a scan is as quick as a bisection.
  let b = 1;
  while (f[b] <= fHz) b++;
  const a = b - 1;
  if (fHz === f[a]) return t[a];
  const u = Math.log(fHz / f[a]) / Math.log(f[b] / f[a]);
  return t[a] + (t[b] - t[a]) * u;
}

/**
 * Whether a sound pressure level lies above the free-field threshold of hearing of ISO 389-7:2005 [1]
 * at its frequency (strictly above: a level at the threshold is taken as not audible).
 *
 * @param levelDb  sound pressure level (dB re 20 µPa), e.g. of a tone found in a spectrum
 * @param fHz      its frequency (Hz)
 * @returns true if levelDb > hearingThresholdDb(fHz); false outside 20 Hz–18 kHz or for NaN input
 *
 * References:
 *   [1] ISO 389-7:2005, Table 1 (free field, frontal incidence, binaural listening).
 */
export function aboveThreshold(levelDb: number, fHz: number): boolean {
  return levelDb > hearingThresholdDb(fHz);
}
