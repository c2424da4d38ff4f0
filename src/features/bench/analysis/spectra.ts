/**
 * What the dock reads from the kept mean squares: the spectrum of one frame, averaged spectra over a
 * time or speed range, third-octave bands and the overall level, and the tracks on one grid for the
 * plot. All from workers/dsp; no DOM here.
 */
import { bandPowersFromSpectrum, overallPower } from '../../../../workers/dsp/levels';
import { framesInSpeedRange } from '../../../../workers/dsp/speed-map';
import { averageFrameList, averageFrames, frameTimeS, type StftLayout } from '../../../../workers/dsp/stft';
import { thirdOctaveBands } from '../../../../workers/dsp/third-octave';
import type { GuideTrack } from '../../../../workers/dsp/guide-tracks';
import { weightingGainsPower, type Weighting } from '../../../../workers/dsp/weighting';

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

/** Tracks on one x grid for a plot and a table: time frames as they are, rpm bins merged by bin. */
export interface AlignedTracks {
  x: number[];
  rows: (number | null)[][];
  /** Another line inside the band there */
  crossing: boolean[][];
  /** The level came from the Vold–Kalman filter there */
  filtered: boolean[][];
}

export function alignTracks(series: GuideTrack[], against: 'time' | 'speed', rpmStep: number): AlignedTracks {
  if (series.length === 0) return { x: [], rows: [], crossing: [], filtered: [] };
  if (against === 'time') {
    return {
      x: Array.from(series[0].x),
      rows: series.map((s) => Array.from(s.db, (v) => (Number.isFinite(v) ? v : null))),
      crossing: series.map((s) => Array.from(s.crossing, (c) => c === 1)),
      filtered: series.map((s) => Array.from(s.filtered, (c) => c === 1)),
    };
  }
  const keys = new Map<number, number>();
  for (const s of series) for (const r of s.x) if (!keys.has(Math.floor(r / rpmStep))) keys.set(Math.floor(r / rpmStep), r);
  const order = [...keys.keys()].sort((a, b) => a - b);
  const at = new Map(order.map((k, i) => [k, i]));
  const x = order.map((k) => keys.get(k)!);
  const rows = series.map(() => new Array<number | null>(order.length).fill(null));
  const crossing = series.map(() => new Array<boolean>(order.length).fill(false));
  const filtered = series.map(() => new Array<boolean>(order.length).fill(false));
  series.forEach((s, j) =>
    s.x.forEach((r, i) => {
      const idx = at.get(Math.floor(r / rpmStep))!;
      rows[j][idx] = Number.isFinite(s.db[i]) ? s.db[i] : null;
      crossing[j][idx] = s.crossing[i] === 1;
      filtered[j][idx] = s.filtered[i] === 1;
    }),
  );
  return { x, rows, crossing, filtered };
}
