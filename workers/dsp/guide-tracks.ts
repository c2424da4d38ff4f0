/**
 * The Bench's tracks of the guides it shows: each line's level per frame by spectral order tracking
 * (trackGuide, tracks.ts), flagged where another shown line falls inside its band, in dB re a reference
 * and weighted, against time or binned against speed (trackAgainstSpeed). The same routines give the
 * batch CLI its tracks (inverter-analysis.ts); this is the Bench's view of them, run in its worker.
 */
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
}

export interface GuideTrack {
  id: string;
  /** Time (s) or speed (rpm), ascending */
  x: Float64Array;
  hz: Float64Array;
  /** dB re refRms, weighted; NaN where the guide leaves the spectrum */
  db: Float64Array;
  /** 1 where another shown line lies inside the band: the level is a sum there */
  crossing: Uint8Array;
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
  return req.lines.map((line) => {
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
    if (req.against === 'time' || !req.frameRpm) {
      const db = new Float64Array(frames);
      for (let f = 0; f < frames; f++) db[f] = toDb(t.rms[f], t.hz[f]);
      return { id: line.id, x: Float64Array.from({ length: frames }, (_, f) => frameTimeS(layout, f)), hz: t.hz, db, crossing: t.crossing };
    }
    const s = trackAgainstSpeed(t, req.frameRpm, req.rpmStep);
    return {
      id: line.id,
      x: Float64Array.from(s.rpm),
      hz: Float64Array.from(s.hz),
      db: Float64Array.from(s.rms, (v, i) => toDb(v, s.hz[i])),
      crossing: Uint8Array.from(s.crossing, (c) => (c ? 1 : 0)),
    };
  });
}
