/**
 * The tonality of the carrier tones at one moment: the strongest family lines there, each with its
 * tone-to-noise ratio and prominence ratio per ECMA-418-1 (tonality.ts) on the averaged spectrum of
 * ±0.5 s of frames where that standard defines them (89.1 Hz–11.2 kHz), and — for a sound-pressure
 * channel in Pa — its level against the ISO 389-7 threshold of hearing and its audibility over the
 * masking noise per ISO/TS 20065 (tone-audibility.ts), which also judges the tones above 11.2 kHz.
 */
import { toDb, REF_SOUND_PRESSURE_PA } from './levels';
import { hearingThresholdDb } from './hearing-threshold';
import { averageFrameList, frameTimeS, type StftLayout } from './stft';
import { TONALITY_MAX_HZ, criticalBandEdges, inTonalityScope, prominenceRatio, tnrLimitDb, toneToNoiseRatio } from './tonality';
import { toneAudibilityTs20065 } from './tone-audibility';
import { guideHz, type GuideContext } from './tracks';

export interface ToneFinding {
  m: number;
  n: number;
  hz: number;
  /** False above 11.2 kHz (or below 89.1 Hz), where ECMA-418-1 defines no TNR or PR: they are null there */
  inTnrPrRange: boolean;
  tnrDb: number | null;
  prDb: number | null;
  /** Prominent by ECMA-418-1 (TNR or PR over its limit); false where the ratios are not defined */
  prominent: boolean;
  /** The limits the tone is judged against (ECMA-418-1 eq. 12 and 16) */
  tnrLimitDb: number | null;
  prLimitDb: number | null;
  /** dB re 20 µPa, for sound pressure only */
  levelDb: number | null;
  /** Level minus the ISO 389-7 threshold, dB (positive: audible), for sound pressure only */
  aboveThresholdDb: number | null;
  /** ISO/TS 20065 audibility ΔL = L_T − L_G − a_v, dB (positive: heard through the noise), for sound pressure only */
  audibilityDb: number | null;
}

/** The top of human hearing, Hz (common practice): tones above it are not judged. */
const HEARING_TOP_HZ = 20000;

/** The families whose lines are candidate carrier tones unless others are asked for: m 1–2, n −5…5. */
export const TONE_FAMILIES: readonly { m: number; n: number }[] = [1, 2].flatMap((m) => Array.from({ length: 11 }, (_, i) => ({ m, n: i - 5 })));

/**
 * The strongest carrier tones on the spectrum averaged over the frames within ±0.5 s of atS, with their
 * tonality: `count` of them inside ECMA-418-1's range, and, for sound pressure, up to `count` more above
 * it (up to 20 kHz, the top of hearing, common practice), judged by their audibility alone. The CLI
 * (analyse inverter) and the Bench's findings call this.
 */
export function carrierTonality(
  power: Float32Array,
  layout: StftLayout,
  enbwBins: number,
  ctx: GuideContext,
  atS: number,
  families: { m: number; n: number }[],
  soundPressure: boolean,
  count = 3,
): { atS: number; tones: ToneFinding[] } {
  const frames: number[] = [];
  for (let f = 0; f < layout.frames; f++) if (Math.abs(frameTimeS(layout, f) - atS) <= 0.5) frames.push(f);
  if (!frames.length) return { atS, tones: [] };
  const centre = frames[frames.length >> 1];
  const avg = averageFrameList(power, layout.bins, frames);
  const all = families
    .map((fam) => {
      const hz = guideHz({ kind: 'family', m: fam.m, n: fam.n, per: 'electrical' }, ctx, centre);
      const k = Math.round(hz / layout.binHz);
      return { ...fam, hz, level: k > 0 && k < layout.bins - 1 ? avg[k] : 0 };
    })
    .filter((c) => Number.isFinite(c.hz) && c.level > 0)
    .sort((a, b) => b.level - a.level);
  const candidates = all.filter((c) => inTonalityScope(c.hz)).slice(0, count);
  const spectrum = soundPressure ? Float64Array.from(avg) : null;
  const audibility = (hz: number): number | null => {
    if (!spectrum) return null;
    const a = toneAudibilityTs20065(spectrum, layout.binHz, hz, enbwBins).audibilityDb;
    return Number.isFinite(a) ? a : null;
  };
  const results = candidates.map((c) => ({ c, tnr: toneToNoiseRatio(avg, layout.binHz, enbwBins, c.hz) }));
  const tones: ToneFinding[] = [];
  for (const { c, tnr } of results) {
    const pr = prominenceRatio(avg, layout.binHz, enbwBins, c.hz);
    if (!tnr || !pr) continue;
    // Proximate tones (ECMA-418-1 11.6: above 1 kHz, every other tone in the critical band) count as one
    // tone: their powers join Wt and leave the noise, Wn' = Wn + Wt − ΣWt (full band coverage).
    const [lo, hi] = criticalBandEdges(c.hz);
    let joint = 0;
    for (const other of results) if (other.tnr && other.c.hz >= lo && other.c.hz <= hi) joint += other.tnr.toneMeanSquare;
    joint = Math.max(joint, tnr.toneMeanSquare);
    const noise = tnr.noiseMeanSquare + tnr.toneMeanSquare - joint;
    const tnrDb = noise > 0 ? 10 * Math.log10(joint / noise) : tnr.deltaLtDb;
    const levelDb = soundPressure ? toDb(tnr.toneMeanSquare, REF_SOUND_PRESSURE_PA) : null;
    tones.push({
      m: c.m,
      n: c.n,
      hz: c.hz,
      inTnrPrRange: true,
      tnrDb,
      prDb: pr.deltaLpDb,
      prominent: tnrDb >= tnrLimitDb(c.hz) || pr.prominent,
      tnrLimitDb: tnrLimitDb(c.hz),
      prLimitDb: pr.limitDb,
      levelDb,
      aboveThresholdDb: levelDb === null ? null : levelDb - hearingThresholdDb(c.hz),
      audibilityDb: audibility(c.hz),
    });
  }
  // Above ECMA-418-1's range, where most carrier whines sit: the level, the hearing threshold and the
  // audibility of ISO/TS 20065 (sound pressure only; other quantities have no ear to judge by).
  if (spectrum) {
    const high = all.filter((c) => c.hz > TONALITY_MAX_HZ && c.hz <= HEARING_TOP_HZ && c.hz < layout.binHz * (layout.bins - 6)).slice(0, count);
    for (const c of high) {
      const a = toneAudibilityTs20065(spectrum, layout.binHz, c.hz, enbwBins);
      // a family line 10 dB or more under its masked threshold is the noise floor, not a tone (Fanlight's choice)
      if (!Number.isFinite(a.levelDb) || !(a.audibilityDb > -10)) continue;
      tones.push({
        m: c.m,
        n: c.n,
        hz: c.hz,
        inTnrPrRange: false,
        tnrDb: null,
        prDb: null,
        prominent: false,
        tnrLimitDb: null,
        prLimitDb: null,
        levelDb: a.levelDb,
        aboveThresholdDb: a.aboveHearingThresholdDb,
        audibilityDb: Number.isFinite(a.audibilityDb) ? a.audibilityDb : null,
      });
    }
  }
  return { atS, tones };
}
