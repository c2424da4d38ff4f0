/**
 * What the inverter is doing, from a map of one channel and the speed: the carrier over time, its
 * shifts, a spread carrier, the pole pairs and the family pattern, the order and family tracks against
 * speed, and the strongest families. Shared by the Bench's workers and the batch CLI.
 */
import { detectCarrier, runSpreadHz } from './carrier';
import { carrierShifts } from './carrier-shifts';
import { carrierTonality, TONE_FAMILIES, type ToneFinding } from './carrier-tonality';
import { polePairsFromFundamental } from './electrical-fundamental';
import { allowedN, inferPolePairs, observeSidebandOffsets, withFundamental, type FamilyPattern } from './pole-pairs';
import { frameTimeS, type StftLayout } from './stft';
import { resolveCrossings } from './crossing-tracks';
import { trackAgainstSpeed, trackGuide, type Guide } from './tracks';
import type { WindowName } from './window';
import { overallPower } from './levels';

/** Half width of each window's main lobe, in bins (Harris 1978, Table 1: first zeros at ±1…±5 bins). */
export const MAIN_LOBE_HALF_BINS: Record<WindowName, number> = { rect: 1, hann: 2, hamming: 2, 'blackman-harris': 4, flattop: 5 };

export interface InverterAnalysisInput {
  power: Float32Array;
  layout: StftLayout;
  window: WindowName;
  enbwBins: number;
  frameRpm: Float64Array;
  polePairs?: number;
  orders?: number[];
  families?: { m: number; n: number }[];
  /** The map's own samples: with them, track points where guides cross come from the Vold–Kalman filter */
  samples?: Float32Array;
  rpmStep?: number;
  carrierMinHz?: number;
  /** Where to judge the tonality of the carrier tones, s; default where the strongest family peaks */
  tonalityAtS?: number;
  /** The channel is sound pressure in Pa: give the tones' levels against the threshold of hearing */
  soundPressure?: boolean;
  /**
   * The family pattern the channel's quantity carries, when known: 'm+n even' for vibration and sound
   * (the force), 'm+n odd' for inverter voltage and phase current. Settles pole pairs that one
   * sideband pair leaves between two answers (pole-pairs.ts).
   */
  expectedPattern?: FamilyPattern;
}

/** The pattern a channel of this quantity carries (see expectedPattern), or null when it does not say. */
export function patternOfQuantity(quantity: string): FamilyPattern | null {
  if (quantity === 'acceleration' || quantity === 'velocity' || quantity === 'sound-pressure') return 'm+n even';
  if (quantity === 'voltage') return 'm+n odd';
  return null;
}

export interface FamilyTrackReport {
  m: number;
  n: number;
  rpm: number[];
  hz: number[];
  rms: number[];
  crossing: boolean[];
  /** Points whose level came from the Vold–Kalman filter because guides cross there */
  filtered: boolean[];
  /** The detected pattern predicts this family */
  explained: boolean | null;
  peakRms: number;
  peakRpm: number;
}

export interface InverterReport {
  carrier: { t: number[]; hz: number[] };
  carrierShifts: { t: number; rpm: number; fromHz: number; toHz: number }[];
  carrierSpreadHz: number | null;
  polePairs: {
    value: number | null;
    source: 'given' | 'inferred';
    pattern: FamilyPattern | null;
    ambiguous: boolean;
    /** The sidebands fitted two answers; the channel's quantity (expectedPattern) chose this one */
    settledByChannel: boolean;
  };
  orders: { order: number; rpm: number[]; rms: number[]; crossing: boolean[]; filtered: boolean[] }[];
  families: FamilyTrackReport[];
  /** Families ranked by their peak level */
  strongestFamilies: { m: number; n: number; peakRms: number; peakRpm: number; explained: boolean | null }[];
  /** ECMA-418-1 tonality of the strongest carrier tones at one moment */
  tonality: { atS: number; tones: ToneFinding[] };
  /** The channel's RMS over the whole map, in its units, and as a level in dB re 1 unit */
  overallRms: number;
  overallDb: number | null;
}

/**
 * The RMS of the whole map: each frame's mean square is the sum of its bins' mean squares over the
 * window's equivalent noise bandwidth in bins (Parseval for a windowed DFT, Harris, Proc. IEEE 66
 * (1978) §IV), averaged over the frames.
 */
export function overallRms(power: Float32Array, layout: StftLayout, enbwBins: number): number {
  if (layout.frames === 0) return 0;
  // every bin of every frame, DC included, as one spectrum: the frames' mean squares summed
  return Math.sqrt(overallPower(power.subarray(0, layout.frames * layout.bins), enbwBins, 0) / layout.frames);
}

const round = (x: number, digits = 6) => (Number.isFinite(x) ? Number(x.toPrecision(digits)) : x);
const roundOrNull = (x: number | null) => (x === null ? null : round(x, 4));

export function analyseInverter(input: InverterAnalysisInput): InverterReport {
  const { power, layout, frameRpm } = input;
  const carrier = detectCarrier(power, layout, { minHz: input.carrierMinHz });
  const times = Array.from({ length: layout.frames }, (_, f) => frameTimeS(layout, f));
  const shifts = carrierShifts(carrier.hz, (f) => frameTimeS(layout, f), frameRpm, layout.binHz);

  // Spread: measured frame by frame (every second frame where the carrier is known); lines on a comb of
  // the shaft frequency around fc are sidebands, not spread
  const withCarrier = times.map((_, f) => f).filter((f) => f % 2 === 0 && Number.isFinite(carrier.hz[f]));
  const frHz = Float64Array.from(frameRpm, (r) => r / 60);
  const spread = runSpreadHz(power, layout.bins, layout.binHz, carrier.hz, withCarrier, frHz);

  let pole: InverterReport['polePairs'];
  if (input.polePairs) pole = { value: input.polePairs, source: 'given', pattern: null, ambiguous: false, settledByChannel: false };
  else {
    const fromSidebands = inferPolePairs(observeSidebandOffsets(power, layout, carrier.hz, frameRpm), 12, input.expectedPattern ?? null);
    // on a voltage or current channel the fundamental fe is a line of its own, and fe/fr tells the
    // divisors of p apart where the sideband offsets cannot (electrical-fundamental.ts). Electrical: the
    // channel says so, or it says nothing and its sidebands follow the inverter's pattern m + n odd (the
    // force's is even; pole-pairs.ts)
    const electrical = input.expectedPattern === 'm+n odd' || (!input.expectedPattern && fromSidebands.pattern === 'm+n odd');
    const fundamental = electrical ? polePairsFromFundamental(power, layout, carrier.hz, frameRpm, 12) : null;
    const rpms = Array.from(frameRpm).filter((r) => r > 0).sort((a, b) => a - b);
    const medianFrHz = (rpms[rpms.length >> 1] ?? NaN) / 60;
    const est = withFundamental(fromSidebands, fundamental?.polePairs ?? null, Math.max(0.35, layout.binHz / (2 * medianFrHz)));
    pole = { value: est.value, source: 'inferred', pattern: est.pattern, ambiguous: est.ambiguous, settledByChannel: est.settledByChannel };
    // A spread carrier smears every sideband over its sweep, so their offsets read as whatever comb fits
    // the smear best: without the fundamental's own line, the pole pairs are not told (common practice:
    // the sideband spacing is read on a steady carrier)
    if (spread !== null && !fundamental?.polePairs) pole = { value: null, source: 'inferred', pattern: null, ambiguous: false, settledByChannel: false };
  }
  // With the pole pairs given, the pattern still comes from the offsets when they show one
  if (input.polePairs) {
    const est = inferPolePairs(observeSidebandOffsets(power, layout, carrier.hz, frameRpm));
    if (est.value === input.polePairs) pole.pattern = est.pattern;
  }


  const ctx = { rpm: frameRpm, carrierHz: carrier.hz, polePairs: pole.value ?? NaN };
  const familyList = input.families ?? [...TONE_FAMILIES];
  const orderGuides: Guide[] = (input.orders ?? []).map((order) => ({ kind: 'order', order }));
  const familyGuides: Guide[] = familyList.map((f) => ({ kind: 'family', m: f.m, n: f.n, per: 'electrical' }));
  const all = [...orderGuides, ...familyGuides];
  const trackOpts = { bandwidth: { hz: 0 }, enbwBins: input.enbwBins, mainLobeBins: MAIN_LOBE_HALF_BINS[input.window], others: all };
  const rpmStep = input.rpmStep ?? 50;

  // per-frame tracks of every guide; where guides cross and the samples are at hand, the coupled
  // Vold–Kalman filter gives each its own level there (crossing-tracks.ts)
  const frameTracks = all.map((g) => trackGuide(power, layout, g, ctx, trackOpts));
  const served = input.samples ? resolveCrossings(input.samples, layout, all.map((guide) => ({ guide, ctx })), frameTracks) : undefined;
  const speedTrack = (i: number) => trackAgainstSpeed(frameTracks[i], frameRpm, rpmStep, served?.[i]);
  const orders = orderGuides.map((_, i) => {
    const t = speedTrack(i);
    return { order: input.orders![i], rpm: t.rpm.map((r) => round(r)), rms: t.rms.map((v) => round(v)), crossing: t.crossing, filtered: t.filtered };
  });
  const families: FamilyTrackReport[] = familyGuides.map((_, i) => {
    const t = speedTrack(orderGuides.length + i);
    const { m, n } = familyList[i];
    // The peak of the track after a 5-point running median: a line of something else (an order that
    // is not a guide) crossing the band lasts a bin or two and must not make a family look strong.
    const smoothed = t.rms.map((_, j) => {
      const usable = (idx: number) => !t.crossing[idx] || t.filtered[idx];
      const w = t.rms.slice(Math.max(0, j - 2), j + 3).filter((v, k) => usable(Math.max(0, j - 2) + k) && Number.isFinite(v));
      return w.length ? w.sort((a, b) => a - b)[w.length >> 1] : NaN;
    });
    let peakRms = 0;
    let peakRpm = NaN;
    smoothed.forEach((v, j) => {
      if ((!t.crossing[j] || t.filtered[j]) && v > peakRms) {
        peakRms = v;
        peakRpm = t.rpm[j];
      }
    });
    return {
      m,
      n,
      rpm: t.rpm.map((r) => round(r)),
      hz: t.hz.map((h) => round(h)),
      rms: t.rms.map((v) => round(v)),
      crossing: t.crossing,
      filtered: t.filtered,
      explained: pole.pattern ? allowedN(m, n, pole.pattern) : null,
      peakRms: round(peakRms),
      peakRpm: round(peakRpm),
    };
  });
  const strongestFamilies = [...families]
    .sort((a, b) => b.peakRms - a.peakRms)
    .map(({ m, n, peakRms, peakRpm, explained }) => ({ m, n, peakRms, peakRpm, explained }));

  let atS = input.tonalityAtS;
  if (atS === undefined) {
    const top = strongestFamilies[0];
    let best = 0;
    if (top && Number.isFinite(top.peakRpm)) for (let f = 1; f < frameRpm.length; f++) if (Math.abs(frameRpm[f] - top.peakRpm) < Math.abs(frameRpm[best] - top.peakRpm)) best = f;
    atS = times[best] ?? 0;
  }
  const tonality = carrierTonality(power, layout, input.enbwBins, ctx, atS, familyList, input.soundPressure ?? false);
  const rms = overallRms(power, layout, input.enbwBins);

  return {
    tonality: {
      atS: round(tonality.atS),
      tones: tonality.tones.map((t) => ({
        ...t,
        hz: round(t.hz),
        tnrDb: roundOrNull(t.tnrDb),
        prDb: roundOrNull(t.prDb),
        tnrLimitDb: roundOrNull(t.tnrLimitDb),
        prLimitDb: roundOrNull(t.prLimitDb),
        levelDb: roundOrNull(t.levelDb),
        aboveThresholdDb: roundOrNull(t.aboveThresholdDb),
        audibilityDb: roundOrNull(t.audibilityDb),
      })),
    },
    carrier: { t: times.map((t) => round(t)), hz: Array.from(carrier.hz, (h) => round(h)) },
    overallRms: round(rms),
    overallDb: rms > 0 ? round(20 * Math.log10(rms), 5) : null,
    carrierShifts: shifts.map((s) => ({ t: round(s.t), rpm: round(s.rpm), fromHz: round(s.fromHz), toHz: round(s.toHz) })),
    carrierSpreadHz: spread === null ? null : round(spread),
    polePairs: pole,
    orders,
    families,
    strongestFamilies,
  };
}
