/**
 * Psychoacoustic tonality of the hearing model of ECMA-418-2 [1] (Sottek's model [2]), in tu_HMS:
 * time-dependent, time-averaged and specific (per auditory band), with the tonal frequency.
 * Unlike the TNR and PR of ECMA-418-1 (89.1 Hz – 11.2 kHz), it covers bands up to about 18.4 kHz,
 * where inverter carriers sit.
 *
 * Why our own code: no well-known npm package implements ECMA-418-2 to our knowledge, so the chain
 * is written here from the standard, clause by clause:
 *   5.1.2 resampling to 48 kHz (resample.ts) and fade-in (ear-filter.ts);
 *   5.1.3 outer and middle/inner ear filter (ear-filter.ts);
 *   5.1.4 auditory filter bank, 53 bands at 0.5 Bark_HMS (filter-bank.ts);
 *   5.1.5 segmentation, band-dependent blocks, hop a quarter block (filter-bank.ts, band-blocks.ts);
 *   5.1.6–5.1.9 rectification, RMS, nonlinearity, threshold in quiet (nonlinearity.ts);
 *   6.2.2–6.2.5 ACF, averaging over neighbouring bands, ACF window, tonal and noise loudness
 *   (tonal-loudness.ts); 6.2.6–6.2.11 here.
 * Constants recalled from memory of the standard are marked in each module; the deviations
 * (Fanlight's choices where a clause is not recalled) are named where they are made.
 *
 * References:
 *   [1] ECMA-418-2, Psychoacoustic metrics for ITT equipment — Part 2 (models based on human
 *       perception), 2nd edition, December 2022, clauses 5.1 and 6.2.
 *   [2] R. Sottek, "Progress in calculating tonality of technical sounds", Proc. Inter-Noise 2014.
 */
import { type BandBlocks, segmentBand } from './band-blocks';
import { earFilter, fadeIn } from './ear-filter';
import { BAND_CENTRES_HZ, BAND_COUNT, HMS_FS_HZ, bandBlockSize, filterBand } from './filter-bank';
import { thresholdSpecificLoudness } from './nonlinearity';
import { resampleTo48k } from './resample';
import { bandTonalLoudness, linesRead } from './tonal-loudness';
import { interpolateOnGrid, noiseReducedTonalLoudness, noiseTonalFraction } from './tonality-time';

/** Result of {@link hearingModelTonality}. */
export interface HearingModelTonality {
  /** Time of each value (s from the signal's start), 187.5 values a second (hop 256 at 48 kHz). */
  t: Float64Array;
  /** Time-dependent tonality T(l) (tu_HMS), the largest specific tonality of the bands, clause 6.2.10. */
  tu: Float64Array;
  /** Tonal frequency at each time (Hz): that of the band giving T(l); NaN where T(l) is 0. */
  tonalHz: Float64Array;
  /** Time-averaged tonality (tu_HMS), clause 6.2.11: the mean of T(l) where T(l) > 0.02 tu_HMS. */
  averageTu: number;
  /** Mean tonal frequency over the same values (Hz); NaN if none. */
  averageTonalHz: number;
  /** Time-averaged specific tonality per band (tu_HMS), clause 6.2.9. */
  specificTu: Float64Array;
  /** The 53 band centres (Hz). */
  bandCentresHz: Float64Array;
}

/** Hop of the common time basis at 48 kHz (samples): 187.5 Hz, clause 6.2.6 [1] (from memory). */
export const COMMON_HOP = 256;
/** Values at or under this tonality are left out of the time averages, clause 6.2.11 [1] (from memory). */
export const AVERAGE_THRESHOLD_TU = 0.02;
/** The averages start here (s), past the model's settling, clause 6.2.11 [1] (from memory). */
export const AVERAGE_START_S = 0.3;

/**
 * c_T, the calibration factor of clause 6.2.8 [1]: with it a 1 kHz, 40 dB SPL sine has 1 tu_HMS
 * (the unit's definition). Found by running this chain uncalibrated on that tone (2 s at 48 kHz:
 * 0.284141 → 1/0.284141); tests/unit/dsp/hearing-model-tonality.test.ts checks it at other rates and
 * durations. The standard's own factor belongs to its exact chain and is not reused.
 */
export const TONALITY_CALIBRATION = 3.5194;

function checkInput(samplesPa: Float32Array | Float64Array, sampleRateHz: number): void {
  if (!(sampleRateHz > 0) || !Number.isFinite(sampleRateHz)) {
    throw new RangeError(`sampleRateHz must be a finite number above 0 (got ${sampleRateHz}).`);
  }
  if (samplesPa.length === 0) throw new RangeError('samplesPa is empty: the tonality needs at least one sample.');
  for (let i = 0; i < samplesPa.length; i++) {
    if (!Number.isFinite(samplesPa[i])) throw new RangeError(`samplesPa[${i}] is not a finite number (got ${samplesPa[i]}).`);
  }
}

/** Time averages of clause 6.2.11: mean over values above the threshold, from AVERAGE_START_S (all times if the signal is shorter than twice that). */
function averageAbove(values: Float64Array, t: Float64Array, weights?: Float64Array): { mean: number; weighted: number } {
  const from = t.length > 0 && t[t.length - 1] >= 2 * AVERAGE_START_S ? AVERAGE_START_S : -Infinity;
  let sum = 0;
  let count = 0;
  let wsum = 0;
  for (let l = 0; l < values.length; l++) {
    if (t[l] < from || !(values[l] > AVERAGE_THRESHOLD_TU)) continue;
    sum += values[l];
    count++;
    if (weights) wsum += weights[l];
  }
  return { mean: count ? sum / count : 0, weighted: count ? wsum / count : Number.NaN };
}

/**
 * Tonality of a sound-pressure signal per the hearing model of ECMA-418-2 [1].
 *
 * @param samplesPa     sound pressure (Pa)
 * @param sampleRateHz  its sampling rate (Hz); resampled to 48 kHz (clause 5.1.2)
 * @returns time-dependent, time-averaged and specific tonality with the tonal frequency
 * @throws RangeError if the rate is not a positive finite number, or the samples are empty or not finite
 */
export function hearingModelTonality(samplesPa: Float32Array | Float64Array, sampleRateHz: number): HearingModelTonality {
  checkInput(samplesPa, sampleRateHz);
  const x = resampleTo48k(samplesPa, sampleRateHz);
  fadeIn(x);
  const ear = earFilter(x);
  const length = ear.length;
  const gridCount = Math.max(1, Math.floor((length - 1) / COMMON_HOP) + 1);
  const t = Float64Array.from({ length: gridCount }, (_, l) => (l * COMMON_HOP) / HMS_FS_HZ);

  const signals = new Map<number, Float64Array>();
  const bandSignal = (band: number): Float64Array => {
    let u = signals.get(band);
    if (!u) {
      u = new Float64Array(length);
      filterBand(ear, BAND_CENTRES_HZ[band], u);
      signals.set(band, u);
    }
    return u;
  };
  const segments = new Map<string, BandBlocks>();
  const bandBlocks = (band: number, blockSize: number): BandBlocks => {
    const key = `${band}:${blockSize}`;
    let b = segments.get(key);
    if (!b) {
      // Keep the lines that this band and its neighbours read (the union of their ranges).
      let lines: [number, number] = [blockSize, 0];
      for (const z of [band - 1, band, band + 1]) {
        if (z < 0 || z >= BAND_COUNT) continue;
        const [lo, hi] = linesRead(z, blockSize);
        lines = [Math.min(lines[0], lo), Math.max(lines[1], hi)];
      }
      b = segmentBand(bandSignal(band), blockSize, thresholdSpecificLoudness(BAND_CENTRES_HZ[band]), lines);
      segments.set(key, b);
    }
    return b;
  };

  const tu = new Float64Array(gridCount);
  const tonalHz = new Float64Array(gridCount).fill(Number.NaN);
  const specificTu = new Float64Array(BAND_COUNT);
  const specific = new Float64Array(gridCount);
  for (let band = 0; band < BAND_COUNT; band++) {
    const blockSize = bandBlockSize(band);
    const neighbours = [band, band - 1, band + 1].filter((b) => b >= 0 && b < BAND_COUNT);
    const loudness = bandTonalLoudness(
      band,
      neighbours.map((b) => bandBlocks(b, blockSize)),
    );
    // Free what no later band needs: signals below band, segmentations below band.
    for (const key of signals.keys()) if (key < band) signals.delete(key);
    for (const key of segments.keys()) if (Number(key.split(':')[0]) < band) segments.delete(key);

    // 6.2.6: to the common time basis; 6.2.7: noise reduction; 6.2.8: specific tonality.
    const tonal = interpolateOnGrid(loudness.centresS, loudness.tonal, t);
    const noise = interpolateOnGrid(loudness.centresS, loudness.noise, t);
    const freq = interpolateOnGrid(loudness.centresS, loudness.tonalHz, t);
    const r0 = noiseTonalFraction(band);
    for (let l = 0; l < gridCount; l++) {
      specific[l] = TONALITY_CALIBRATION * noiseReducedTonalLoudness(tonal[l], noise[l], r0);
      // 6.2.10: the time-dependent tonality is the largest specific tonality, at that band's frequency.
      if (specific[l] > tu[l]) {
        tu[l] = specific[l];
        tonalHz[l] = freq[l];
      }
    }
    specificTu[band] = averageAbove(specific, t).mean;
  }
  const overall = averageAbove(tu, t, tonalHz);
  return {
    t,
    tu,
    tonalHz,
    averageTu: overall.mean,
    averageTonalHz: overall.weighted,
    specificTu,
    bandCentresHz: Float64Array.from(BAND_CENTRES_HZ),
  };
}
