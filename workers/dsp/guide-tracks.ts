/**
 * The Bench's tracks of the guides it shows: each line's level per frame by spectral order tracking
 * (trackGuide, tracks.ts), flagged where another shown line falls inside its band, in dB re a reference
 * and weighted, against time or binned against speed (trackAgainstSpeed). Given the channel's samples,
 * the points where lines cross take each line's own level from the coupled Vold–Kalman filter
 * (crossing-tracks.ts), as the batch CLI's do (inverter-analysis.ts); this is the Bench's view of the
 * same routines, run in its worker.
 */
import { resolveCrossings } from './crossing-tracks';
import { MAIN_LOBE_HALF_BINS } from './inverter-analysis';
import { frameTimeS, type StftLayout } from './stft';
import { guideHz, trackAgainstSpeed, trackGuide, type Guide, type GuideContext } from './tracks';
import { weightingDb, type Weighting } from './weighting';
import type { WindowName } from './window';

export interface TrackedLine {
  id: string;
  guide: Guide;
  ctx: GuideContext;
}

export interface GuideTracksRequest {
  power: Float32Array;
  layout: StftLayout;
  /** The lines to track */
  lines: TrackedLine[];
  /** Every line shown: a point is flagged where one of them falls inside the band */
  shown: TrackedLine[];
  window: WindowName;
  enbwBins: number;
  against: 'time' | 'speed';
  /** Speed per frame, rpm (needed against speed) */
  frameRpm: Float64Array | null;
  rpmStep: number;
  weighting: Weighting;
  refRms: number;
  /** The map channel's calibrated samples: crossing points are then filtered (Vold–Kalman) */
  samples?: Float32Array;
}

export interface GuideTrack {
  id: string;
  /** Time (s) or speed (rpm), ascending */
  x: Float64Array;
  hz: Float64Array;
  /** dB re refRms, weighted; NaN where the guide leaves the spectrum */
  db: Float64Array;
  /** 1 where another shown line lies inside the band: the level is a sum there, unless filtered */
  crossing: Uint8Array;
  /** 1 where the level came from the Vold–Kalman filter (crossings, with the samples given) */
  filtered: Uint8Array;
}

/**
 * Each line's track: the band sum around the guide, ENBW-corrected (trackGuide), its band as trackGuide
 * takes it (the main lobe plus the sweep during one block).
 */
export function guideTracks(req: GuideTracksRequest): GuideTrack[] {
  const { layout, weighting, refRms } = req;
  const lobe = MAIN_LOBE_HALF_BINS[req.window];
  const minHalf = lobe * layout.binHz;
  const hopsPerBlock = layout.blockSize / layout.hop;
  const frames = layout.frames;
  const toDb = (rms: number, hz: number) => {
    // IEC 61672-1 weighting at the guide's frequency
    const v = rms * rms * (weighting === 'Z' ? 1 : 10 ** (weightingDb(weighting, hz) / 10));
    return v > 0 && Number.isFinite(v) ? 10 * Math.log10(v / (refRms * refRms)) : NaN;
  };
  // every shown line is tracked and flagged: the filter couples a tracked line with whatever crosses it
  const frameTracks = req.shown.map((line) => {
    const t = trackGuide(req.power, layout, line.guide, line.ctx, { bandwidth: { hz: 0 }, enbwBins: req.enbwBins, mainLobeBins: lobe });
    for (let f = 0; f < frames; f++) {
      const fg = t.hz[f];
      if (!Number.isFinite(fg)) continue;
      const a = Math.max(0, f - 1);
      const b = Math.min(frames - 1, f + 1);
      const sweep = Number.isFinite(t.hz[a]) && Number.isFinite(t.hz[b]) ? (Math.abs(t.hz[b] - t.hz[a]) / Math.max(1, b - a)) * hopsPerBlock : 0;
      const half = minHalf + sweep / 2;
      for (const other of req.shown) {
        if (other.id === line.id) continue;
        if (Math.abs(guideHz(other.guide, other.ctx, f) - fg) < half + minHalf) {
          t.crossing[f] = 1;
          break;
        }
      }
    }
    return t;
  });
  const served = req.samples ? resolveCrossings(req.samples, layout, req.shown, frameTracks) : null;
  const index = new Map(req.shown.map((l, i) => [l.id, i]));
  return req.lines.map((line) => {
    const i = index.get(line.id);
    const t = i === undefined ? trackGuide(req.power, layout, line.guide, line.ctx, { bandwidth: { hz: 0 }, enbwBins: req.enbwBins, mainLobeBins: lobe }) : frameTracks[i];
    const filtered = (i !== undefined && served?.[i]) || new Uint8Array(frames);
    if (req.against === 'time' || !req.frameRpm) {
      const db = new Float64Array(frames);
      for (let f = 0; f < frames; f++) db[f] = toDb(t.rms[f], t.hz[f]);
      return { id: line.id, x: Float64Array.from({ length: frames }, (_, f) => frameTimeS(layout, f)), hz: t.hz, db, crossing: t.crossing, filtered };
    }
    const s = trackAgainstSpeed(t, req.frameRpm, req.rpmStep, filtered);
    return {
      id: line.id,
      x: Float64Array.from(s.rpm),
      hz: Float64Array.from(s.hz),
      db: Float64Array.from(s.rms, (v, i) => toDb(v, s.hz[i])),
      crossing: Uint8Array.from(s.crossing, (c) => (c ? 1 : 0)),
      filtered: Uint8Array.from(s.filtered, (c) => (c ? 1 : 0)),
    };
  });
}
