/**
 * Stationary loudness after Zwicker, ISO 532-1:2017 clause 5 (the procedure of its Annex A program):
 * one-third-octave levels → low-frequency weighting and grouping → core loudness per approximated
 * critical band → upper slopes → specific loudness N'(z) on 0.1 Bark steps → total loudness N.
 *
 * References:
 *   [1] ISO 532-1:2017, Acoustics — Methods for calculating loudness — Part 1: Zwicker method,
 *       clause 5 (stationary sounds), formulae for core loudness and loudness level, Annex A.
 *   [2] E. Zwicker, H. Fastl, Psychoacoustics — Facts and Models, 3rd ed., Springer 2007, ch. 8.
 */
import { A0, DCB, DDF, DLL, LOUDNESS_BAND_NOMINAL_HZ, LTQ, RAP, RNS, USL, ZUP } from './iso532-1-tables';

export type SoundField = 'free' | 'diffuse';

/** Number of one-third-octave bands the method takes (25 Hz … 12.5 kHz). */
export const LOUDNESS_BAND_COUNT = LOUDNESS_BAND_NOMINAL_HZ.length;
/** Critical-band-rate step of the specific loudness (Bark) and the number of values (0.1 … 24 Bark). */
export const BARK_STEP = 0.1;
export const SPECIFIC_LOUDNESS_POINTS = 240;

const CRITICAL_BANDS = 20;
const LOW_BANDS = 11;

export interface StationaryLoudness {
  /** Total loudness N (sone). */
  totalSone: number;
  /** Loudness level LN (phon). */
  levelPhon: number;
  /** Specific loudness N' (sone/Bark) at z = 0.1, 0.2, … 24 Bark. */
  specific: Float64Array;
  barkStep: typeof BARK_STEP;
}

/**
 * Loudness level LN (phon) from loudness N (sone), ISO 532-1:2017 clause 5 [1]:
 * LN = 40 + 33.22·lg N for N ≥ 1 sone (10 phon per doubling), LN = 40·(N + 0.0005)^0.35 below.
 */
export function loudnessLevelPhon(sone: number): number {
  if (!(sone >= 0)) throw new RangeError(`Loudness must be 0 sone or more (got ${sone}).`);
  return sone >= 1 ? 40 + 33.22 * Math.log10(sone) : 40 * (sone + 0.0005) ** 0.35;
}

/**
 * Levels of the 20 approximated critical bands (dB): the 11 lowest one-third-octave bands weighted by
 * DLL for their level range of RAP and summed in three groups (25–80, 100–160, 200–250 Hz) [1, Annex A].
 */
function criticalBandLevels(third: ArrayLike<number>): Float64Array {
  const weighted = new Float64Array(LOW_BANDS);
  for (let i = 0; i < LOW_BANDS; i++) {
    let j = 0;
    while (j < RAP.length - 1 && third[i] > RAP[j] - DLL[j][i]) j++;
    weighted[i] = 10 ** ((third[i] + DLL[j][i]) / 10);
  }
  const sum = (a: number, b: number) => weighted.subarray(a, b).reduce((s, v) => s + v, 0);
  const groups = [sum(0, 6), sum(6, 9), sum(9, 11)];
  const levels = new Float64Array(CRITICAL_BANDS);
  for (let k = 0; k < 3; k++) levels[k] = groups[k] > 0 ? 10 * Math.log10(groups[k]) : -Infinity;
  for (let i = LOW_BANDS; i < LOUDNESS_BAND_COUNT; i++) levels[i - LOW_BANDS + 3] = third[i];
  return levels;
}

/**
 * Core loudness N'c (sone/Bark) per approximated critical band, ISO 532-1:2017 clause 5 [1]:
 * N'c = 0.0635·10^(0.025·LTQ)·[(1 − s + s·10^((LE − LTQ)/10))^0.25 − 1], s = 0.25, with LE the
 * critical-band level less a0 (plus DDF in a diffuse field) less DCB; zero at or below LTQ. The lowest
 * band is scaled by 0.4 + 0.32·N'c^0.2 (at most 1), the correction for its breadth [1, Annex A].
 */
export function coreLoudness(thirdOctaveDb: ArrayLike<number>, field: SoundField): Float64Array {
  const levels = criticalBandLevels(thirdOctaveDb);
  const core = new Float64Array(CRITICAL_BANDS + 1);
  const s = 0.25;
  for (let i = 0; i < CRITICAL_BANDS; i++) {
    let le = levels[i] - A0[i];
    if (field === 'diffuse') le += DDF[i];
    if (le > LTQ[i]) {
      le -= DCB[i];
      const n = 0.0635 * 10 ** (0.025 * LTQ[i]) * ((1 - s + s * 10 ** ((le - LTQ[i]) / 10)) ** 0.25 - 1);
      core[i] = Math.max(0, n);
    }
  }
  core[0] *= Math.min(1, 0.4 + 0.32 * core[0] ** 0.2);
  return core;
}

/** Row of RNS/USL for a specific loudness n: the first range whose lower bound is below n. */
function rangeRow(n: number): number {
  let j = 0;
  while (j < RNS.length - 1 && RNS[j] >= n) j++;
  return j;
}

/**
 * Specific loudness N'(z) from the core loudness: each band holds its core value over its width on z;
 * where the next band is lower, the pattern falls along the upper slope USL (sone/Bark per Bark) of the
 * range RNS it is in, ISO 532-1:2017 Annex A [1] (Zwicker's slope procedure, [2] ch. 8). Returns the
 * total N (exact integral of the piecewise-linear pattern) and N' sampled at 0.1 … 24 Bark.
 */
export function specificFromCore(core: ArrayLike<number>): { totalSone: number; specific: Float64Array } {
  const specific = new Float64Array(SPECIFIC_LOUDNESS_POINTS);
  // Pieces of the pattern: [z1, z2, n1, n2] linear between the ends.
  let total = 0;
  let z1 = 0;
  let n1 = 0;
  let row = 0;
  const fill = (za: number, zb: number, na: number, nb: number) => {
    total += ((na + nb) / 2) * (zb - za);
    const slope = zb > za ? (nb - na) / (zb - za) : 0;
    // N' at the grid point z = (k + 1)·0.1 Bark, k = 0 … 239
    const kFrom = Math.max(0, Math.ceil(za / BARK_STEP - 1e-9) - 1);
    for (let k = kFrom; k < SPECIFIC_LOUDNESS_POINTS; k++) {
      const z = (k + 1) * BARK_STEP;
      if (z > zb + 1e-9) break;
      if (z >= za - 1e-9) specific[k] = na + slope * (z - za);
    }
  };
  for (let i = 0; i <= CRITICAL_BANDS; i++) {
    const zUp = ZUP[i];
    const ni = core[i] ?? 0;
    const group = Math.min(7, Math.max(0, i - 1));
    while (z1 < zUp - 1e-9) {
      if (n1 <= ni) {
        // rising or level: the band holds its core loudness to its upper edge
        row = rangeRow(ni);
        fill(z1, zUp, ni, ni);
        z1 = zUp;
        n1 = ni;
      } else {
        // falling along the upper slope of the current range, down to the range's floor or the band's core
        while (row < RNS.length - 1 && n1 <= RNS[row]) row++;
        const floor = Math.max(n1 > RNS[row] ? RNS[row] : 0, ni);
        const steep = USL[row][group];
        let z2 = z1 + (n1 - floor) / steep;
        let n2 = floor;
        if (z2 > zUp) {
          z2 = zUp;
          n2 = n1 - (z2 - z1) * steep;
        }
        fill(z1, z2, n1, n2);
        z1 = z2;
        n1 = n2;
        if (n1 <= ni + 1e-12 && z1 < zUp) {
          fill(z1, zUp, ni, ni);
          z1 = zUp;
          n1 = ni;
        }
      }
    }
  }
  return { totalSone: Math.max(0, total), specific };
}

/**
 * Stationary loudness of ISO 532-1:2017 clause 5 [1] from the 28 one-third-octave levels 25 Hz–12.5 kHz
 * (dB re 20 µPa; −Infinity for an empty band), in a free or diffuse field.
 *
 * @throws RangeError if there are not 28 levels or one is NaN or above 200 dB
 */
export function stationaryLoudness(thirdOctaveDb: ArrayLike<number>, field: SoundField): StationaryLoudness {
  if (thirdOctaveDb.length !== LOUDNESS_BAND_COUNT) {
    throw new RangeError(`Loudness needs ${LOUDNESS_BAND_COUNT} one-third-octave levels (25 Hz–12.5 kHz), got ${thirdOctaveDb.length}.`);
  }
  for (let i = 0; i < LOUDNESS_BAND_COUNT; i++) {
    const v = thirdOctaveDb[i];
    if (Number.isNaN(v) || v > 200) throw new RangeError(`One-third-octave level ${i} (${LOUDNESS_BAND_NOMINAL_HZ[i]} Hz) is ${v} dB; it must be a number up to 200 dB.`);
  }
  const { totalSone, specific } = specificFromCore(coreLoudness(thirdOctaveDb, field));
  return { totalSone, levelPhon: loudnessLevelPhon(totalSone), specific, barkStep: BARK_STEP };
}
