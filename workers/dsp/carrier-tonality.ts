/**
 * The tonality of the carrier tones at one moment: the strongest family lines there, each with its
 * tone-to-noise ratio and prominence ratio per ECMA-418-1 (tonality.ts) on the averaged spectrum of
 * ±0.5 s of frames, and — for a sound-pressure channel in Pa — its level against the ISO 389-7
 * threshold of hearing.
 */
import { toDb, REF_SOUND_PRESSURE_PA } from './levels';
import { hearingThresholdDb } from './hearing-threshold';
import { averageFrameList, frameTimeS, type StftLayout } from './stft';
import { criticalBandEdges, inTonalityScope, prominenceRatio, tnrLimitDb, toneToNoiseRatio } from './tonality';
import { guideHz, type GuideContext } from './tracks';

export interface ToneFinding {
  m: number;
  n: number;
  hz: number;
  tnrDb: number;
  prDb: number;
  prominent: boolean;
  /** The limits the tone is judged against (ECMA-418-1 eq. 12 and 16) */
  tnrLimitDb: number;
  prLimitDb: number;
  /** dB re 20 µPa, for sound pressure only */
  levelDb: number | null;
  /** Level minus the ISO 389-7 threshold, dB (positive: audible), for sound pressure only */
  aboveThresholdDb: number | null;
}

/** The families whose lines are candidate carrier tones unless others are asked for: m 1–2, n −5…5. */
export const TONE_FAMILIES: readonly { m: number; n: number }[] = [1, 2].flatMap((m) => Array.from({ length: 11 }, (_, i) => ({ m, n: i - 5 })));

/**
 * The strongest carrier tones (count of them) on the spectrum averaged over the frames within ±0.5 s
 * of atS, with their tonality. The CLI (analyse inverter) and the Bench's findings call this.
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
  const candidates = families
    .map((fam) => {
      const hz = guideHz({ kind: 'family', m: fam.m, n: fam.n, per: 'electrical' }, ctx, centre);
      const k = Math.round(hz / layout.binHz);
      return { ...fam, hz, level: k > 0 && k < layout.bins ? avg[k] : 0 };
    })
    .filter((c) => Number.isFinite(c.hz) && inTonalityScope(c.hz) && c.level > 0)
    .sort((a, b) => b.level - a.level)
    .slice(0, count);
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
      tnrDb,
      prDb: pr.deltaLpDb,
      prominent: tnrDb >= tnrLimitDb(c.hz) || pr.prominent,
      tnrLimitDb: tnrLimitDb(c.hz),
      prLimitDb: pr.limitDb,
      levelDb,
      aboveThresholdDb: levelDb === null ? null : levelDb - hearingThresholdDb(c.hz),
    });
  }
  return { atS, tones };
}
