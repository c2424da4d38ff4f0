/**
 * What the dock and the findings read from the kept mean squares: the spectrum of one frame, averaged
 * spectra over a time or speed range, third-octave bands and the overall level, the tracks of guide
 * lines, and the tonality of the strongest carrier tone. All from workers/dsp; no DOM here.
 */
import { bandPowersFromSpectrum, overallPower } from '../../../../workers/dsp/levels';
import { framesInSpeedRange } from '../../../../workers/dsp/speed-map';
import { averageFrameList, averageFrames, frameTimeS, type StftLayout } from '../../../../workers/dsp/stft';
import { thirdOctaveBands } from '../../../../workers/dsp/third-octave';
import { aboveThreshold, hearingThresholdDb } from '../../../../workers/dsp/hearing-threshold';
import { inTonalityScope, prominenceRatio, toneToNoiseRatio, type ProminenceRatioResult, type ToneToNoiseResult } from '../../../../workers/dsp/tonality';
import { trackAgainstSpeed, trackGuide } from '../../../../workers/dsp/tracks';
import { weightingDb, weightingGainsPower, type Weighting } from '../../../../workers/dsp/weighting';
import { MAIN_LOBE_HALF_BINS } from '../../../../workers/dsp/inverter-analysis';
import type { WindowName } from '../../../../workers/dsp/window';
import { lineHz, type GuideLine } from '../map/guides';

export const frameTimes = (layout: StftLayout) => Float64Array.from({ length: layout.frames }, (_, f) => frameTimeS(layout, f));

const gainCache = new WeakMap<StftLayout, Map<Weighting, Float64Array>>();

/** Power gains of a weighting at the bins of a layout (IEC 61672-1). */
export function binGains(layout: StftLayout, weighting: Weighting): Float64Array {
  let byW = gainCache.get(layout);
  if (!byW) gainCache.set(layout, (byW = new Map()));
  let g = byW.get(weighting);
  if (!g) {
    const f = Float64Array.from({ length: layout.bins }, (_, k) => k * layout.binHz);
    g = weightingGainsPower(weighting, f);
    byW.set(weighting, g);
  }
  return g;
}

/** Levels in dB re refRms of one spectrum of mean squares, weighted. */
export function spectrumDb(power: Float32Array | Float64Array, gains: Float64Array, refRms: number): Float64Array {
  const out = new Float64Array(power.length);
  const inv = 1 / (refRms * refRms);
  for (let k = 0; k < power.length; k++) {
    const v = power[k] * gains[k] * inv;
    out[k] = v > 0 ? 10 * Math.log10(v) : NaN;
  }
  return out;
}

/** The frame whose centre is nearest a time. */
export function frameAt(layout: StftLayout, tS: number): number {
  return Math.max(0, Math.min(layout.frames - 1, Math.round((tS - layout.t0S) / layout.hopS)));
}

/** The first frame whose speed is nearest an rpm. */
export function frameAtRpm(frameRpm: Float64Array, rpm: number): number {
  let best = 0;
  let d = Infinity;
  for (let f = 0; f < frameRpm.length; f++) {
    const e = Math.abs(frameRpm[f] - rpm);
    if (e < d) {
      d = e;
      best = f;
    }
  }
  return best;
}

/** The power-averaged spectrum of the frames in a time range (s) or a speed range (rpm). */
export function averagedOver(power: Float32Array, layout: StftLayout, framesDone: number, against: 'time' | 'speed', range: [number, number], frameRpm: Float64Array | null): { avg: Float64Array; frames: number } | null {
  if (against === 'time') {
    const from = Math.max(0, Math.ceil((range[0] - layout.t0S) / layout.hopS));
    const to = Math.min(framesDone, Math.floor((range[1] - layout.t0S) / layout.hopS) + 1);
    if (to <= from) {
      const f = Math.min(framesDone - 1, frameAt(layout, (range[0] + range[1]) / 2));
      return f >= 0 ? { avg: averageFrames(power, layout.bins, f, f + 1), frames: 1 } : null;
    }
    return { avg: averageFrames(power, layout.bins, from, to), frames: to - from };
  }
  if (!frameRpm) return null;
  const list = framesInSpeedRange(frameRpm, range[0], range[1]).filter((f) => f < framesDone);
  return list.length ? { avg: averageFrameList(power, layout.bins, list), frames: list.length } : null;
}

export interface BandLevel {
  nominalHz: number;
  centerHz: number;
  db: number | null;
}

/** Third-octave bands (IEC 61260-1, 20 Hz–20 kHz within the spectrum) and the overall level, weighted, dB re refRms. */
export function bandLevels(avg: Float64Array, layout: StftLayout, gains: Float64Array, enbwBins: number, refRms: number): { bands: BandLevel[]; overallDb: number | null } {
  const weighted = new Float64Array(avg.length);
  for (let k = 0; k < avg.length; k++) weighted[k] = avg[k] * gains[k];
  const topHz = (layout.bins - 1) * layout.binHz;
  const bands = thirdOctaveBands(20, 20000).filter((b) => b.upperHz <= topHz && b.lowerHz >= layout.binHz / 2);
  const ms = bandPowersFromSpectrum(weighted, layout.binHz, bands, enbwBins);
  const db = (v: number) => (v > 0 && Number.isFinite(v) ? 10 * Math.log10(v / (refRms * refRms)) : null);
  return {
    bands: bands.map((b, i) => ({ nominalHz: b.nominalHz, centerHz: b.centerHz, db: db(ms[i]) })),
    overallDb: db(overallPower(weighted, enbwBins)),
  };
}

export interface TrackSeries {
  line: GuideLine;
  /** Time (s) or speed (rpm), ascending */
  x: number[];
  hz: number[];
  /** dB re refRms, weighted; NaN where the guide leaves the spectrum */
  db: number[];
  crossing: boolean[];
}

/**
 * Each line's track (trackGuide: the band sum around the guide, ENBW-corrected), flagged where
 * another visible line falls inside its band (the band as trackGuide takes it: the main lobe plus
 * the sweep during one block), against time or binned against speed (trackAgainstSpeed).
 */
export function computeTracks(
  lines: GuideLine[],
  all: GuideLine[],
  power: Float32Array,
  layout: StftLayout,
  window: WindowName,
  enbwBins: number,
  against: 'time' | 'speed',
  frameRpm: Float64Array | null,
  rpmStep: number,
  weighting: Weighting,
  refRms: number,
): TrackSeries[] {
  const lobe = MAIN_LOBE_HALF_BINS[window];
  const minHalf = lobe * layout.binHz;
  const hopsPerBlock = layout.blockSize / layout.hop;
  const times = frameTimes(layout);
  const frames = layout.frames;
  const toDb = (rms: number, hz: number) => {
    const v = rms * rms * (weighting === 'Z' ? 1 : 10 ** (weightingDb(weighting, hz) / 10));
    return v > 0 && Number.isFinite(v) ? 10 * Math.log10(v / (refRms * refRms)) : NaN;
  };
  return lines.map((line) => {
    const t = trackGuide(power, layout, line.guide, line.ctx, { bandwidth: { hz: 0 }, enbwBins, mainLobeBins: lobe });
    for (let f = 0; f < frames; f++) {
      const fg = t.hz[f];
      if (!Number.isFinite(fg)) continue;
      const a = Math.max(0, f - 1);
      const b = Math.min(frames - 1, f + 1);
      const sweep = Number.isFinite(t.hz[a]) && Number.isFinite(t.hz[b]) ? (Math.abs(t.hz[b] - t.hz[a]) / Math.max(1, b - a)) * hopsPerBlock : 0;
      const half = minHalf + sweep / 2;
      for (const other of all) {
        if (other.id === line.id) continue;
        const fo = lineHz(other, f);
        if (Math.abs(fo - fg) < half + minHalf) {
          t.crossing[f] = 1;
          break;
        }
      }
    }
    if (against === 'time' || !frameRpm) {
      const x: number[] = [];
      const hz: number[] = [];
      const db: number[] = [];
      const crossing: boolean[] = [];
      for (let f = 0; f < frames; f++) {
        x.push(times[f]);
        hz.push(t.hz[f]);
        db.push(toDb(t.rms[f], t.hz[f]));
        crossing.push(t.crossing[f] === 1);
      }
      return { line, x, hz, db, crossing };
    }
    const s = trackAgainstSpeed(t, frameRpm, rpmStep);
    return { line, x: s.rpm, hz: s.hz, db: s.rms.map((v, i) => toDb(v, s.hz[i])), crossing: s.crossing };
  });
}

/** Tracks on one x grid for a plot and a table: time frames as they are, rpm bins merged by bin. */
export function alignTracks(series: TrackSeries[], against: 'time' | 'speed', rpmStep: number): { x: number[]; rows: (number | null)[][]; crossing: boolean[][] } {
  if (series.length === 0) return { x: [], rows: [], crossing: [] };
  if (against === 'time') {
    return {
      x: series[0].x,
      rows: series.map((s) => s.db.map((v) => (Number.isFinite(v) ? v : null))),
      crossing: series.map((s) => s.crossing),
    };
  }
  const keys = new Map<number, number>();
  for (const s of series) for (const r of s.x) if (!keys.has(Math.floor(r / rpmStep))) keys.set(Math.floor(r / rpmStep), r);
  const order = [...keys.keys()].sort((a, b) => a - b);
  const at = new Map(order.map((k, i) => [k, i]));
  const x = order.map((k) => keys.get(k)!);
  const rows = series.map(() => new Array<number | null>(order.length).fill(null));
  const crossing = series.map(() => new Array<boolean>(order.length).fill(false));
  series.forEach((s, j) =>
    s.x.forEach((r, i) => {
      const idx = at.get(Math.floor(r / rpmStep))!;
      rows[j][idx] = Number.isFinite(s.db[i]) ? s.db[i] : null;
      crossing[j][idx] = s.crossing[i];
    }),
  );
  return { x, rows, crossing };
}

export interface Tonality {
  timeS: number;
  /** The tone's guide ("fc+fe") and frequency, Hz */
  label: string;
  toneHz: number;
  tnr: ToneToNoiseResult | null;
  pr: ProminenceRatioResult | null;
  /** Sound pressure only: the tone's level, dB re 20 µPa, its threshold and whether it lies above */
  spl: { levelDb: number; thresholdDb: number; audible: boolean } | null;
  /** The frames averaged */
  frames: number;
}

const TONALITY_HALF_S = 0.5;

/**
 * TNR and PR (ECMA-418-1) of the strongest carrier tone on the spectrum averaged over ±0.5 s of frames
 * around a time: the candidate frequencies are given (carrier family lines at that time); each is
 * taken at its highest bin within ±2 bins, and the strongest in scope (89.1–11 220 Hz) is judged.
 */
export function carrierTonality(
  power: Float32Array,
  layout: StftLayout,
  framesDone: number,
  timeS: number,
  candidates: { label: string; hz: number }[],
  enbwBins: number,
  soundPressureRef: number | null,
): Tonality | { timeS: number; none: string } {
  const from = Math.max(0, frameAt(layout, timeS - TONALITY_HALF_S));
  const to = Math.min(framesDone, frameAt(layout, timeS + TONALITY_HALF_S) + 1);
  if (to <= from) return { timeS, none: 'The map has not reached that time yet.' };
  const avg = averageFrames(power, layout.bins, from, to);
  let best: { label: string; hz: number; p: number } | null = null;
  let outOfScope = 0;
  for (const c of candidates) {
    if (!Number.isFinite(c.hz)) continue;
    const k0 = Math.round(c.hz / layout.binHz);
    let k = k0;
    for (let j = k0 - 2; j <= k0 + 2; j++) if (j > 0 && j < layout.bins - 1 && avg[j] > avg[k]) k = j;
    if (!(k > 0 && k < layout.bins - 1)) continue;
    const hz = k * layout.binHz;
    if (!inTonalityScope(hz)) {
      outOfScope++;
      continue;
    }
    if (!best || avg[k] > best.p) best = { label: c.label, hz, p: avg[k] };
  }
  if (!best) {
    return { timeS, none: outOfScope ? 'The carrier tones lie outside 89.1–11 220 Hz, the scope of the tonality methods.' : 'No carrier tone to judge.' };
  }
  const tnr = toneToNoiseRatio(avg, layout.binHz, enbwBins, best.hz);
  const pr = prominenceRatio(avg, layout.binHz, enbwBins, best.hz);
  let spl: Tonality['spl'] = null;
  if (soundPressureRef !== null && tnr && tnr.toneMeanSquare > 0) {
    const levelDb = 10 * Math.log10(tnr.toneMeanSquare / (soundPressureRef * soundPressureRef));
    spl = { levelDb, thresholdDb: hearingThresholdDb(best.hz), audible: aboveThreshold(levelDb, best.hz) };
  }
  return { timeS, label: best.label, toneHz: best.hz, tnr, pr, spl, frames: to - from };
}
