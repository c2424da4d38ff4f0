/**
 * Tracks: the level of one guide against speed or time, taken from short-time spectra as the RMS sum
 * of the power in a band around the guide, corrected by the window's equivalent noise bandwidth so a
 * pure component of amplitude A reads A/√2 RMS (Σ_k P[k] over a tone's lobe = ENBW·A²/2; Harris [1]).
 * This is the spectral ("FFT-based") order tracking of Brandt [2]. Where another guide falls inside the
 * band the point is flagged rather than reported as one component.
 *
 * The guides' frequencies come from guide-formula.ts.
 * References: [1] F. J. Harris, Proc. IEEE 66(1) (1978) 51–83. [2] A. Brandt, Noise and Vibration
 *   Analysis, Wiley 2011, ch. 12 (order tracking) [from memory].
 */
import { guideFrequencyHz, type Guide } from './guide-formula';
import type { StftLayout } from './stft';

export type { Guide };

export interface GuideContext {
  /** Shaft speed per frame, rpm */
  rpm: Float64Array;
  /** Carrier per frame, Hz (NaN where unknown) */
  carrierHz?: Float64Array;
  polePairs?: number;
}

/** A guide's frequency at one frame of a run. */
export function guideHz(g: Guide, ctx: GuideContext, frame: number): number {
  return guideFrequencyHz(g, { rpm: ctx.rpm[frame], carrierHz: ctx.carrierHz?.[frame] ?? NaN, polePairs: ctx.polePairs ?? NaN });
}

export interface TrackOptions {
  /** Band width around the guide, in Hz or in orders (then × fr); at least the window's main lobe. */
  bandwidth: { hz: number } | { orders: number };
  /** The window's ENBW in bins, and its main-lobe half width in bins (Hann 2, flat-top 5) */
  enbwBins: number;
  mainLobeBins: number;
  /** Other guides: a point is flagged when one of them falls inside this guide's band. */
  others?: Guide[];
}

export interface Track {
  /** Per frame: guide frequency (Hz), RMS level in channel units (NaN outside the spectrum) */
  hz: Float64Array;
  rms: Float64Array;
  /** Per frame: another guide lies inside the band, so the level is a sum of components */
  crossing: Uint8Array;
}

export function trackGuide(power: Float32Array, layout: StftLayout, guide: Guide, ctx: GuideContext, opts: TrackOptions): Track {
  const frames = layout.frames;
  const bins = layout.bins;
  const hz = new Float64Array(frames);
  const rms = new Float64Array(frames);
  const crossing = new Uint8Array(frames);
  const minHalf = opts.mainLobeBins * layout.binHz;
  const hopsPerBlock = layout.blockSize / layout.hop;
  for (let f = 0; f < frames; f++) {
    const fg = guideHz(guide, ctx, f);
    hz[f] = fg;
    const fr = ctx.rpm[f] / 60;
    // During one block a guide on a run-up sweeps; its power spreads over the bins it crossed, so the
    // band grows by that sweep (Parseval: the sum over the band still holds all of it).
    const before = guideHz(guide, ctx, Math.max(0, f - 1));
    const after = guideHz(guide, ctx, Math.min(frames - 1, f + 1));
    const sweep = Number.isFinite(before) && Number.isFinite(after) ? Math.abs(after - before) / Math.max(1, Math.min(f + 1, frames - 1) - Math.max(0, f - 1)) * hopsPerBlock : 0;
    const half = Math.max(minHalf + sweep / 2, ('hz' in opts.bandwidth ? opts.bandwidth.hz : opts.bandwidth.orders * fr) / 2);
    const lo = Math.ceil((fg - half) / layout.binHz);
    const hi = Math.floor((fg + half) / layout.binHz);
    if (!Number.isFinite(fg) || lo < 1 || hi >= bins - 1) {
      rms[f] = NaN;
      continue;
    }
    let sum = 0;
    const row = f * bins;
    for (let k = lo; k <= hi; k++) sum += power[row + k];
    rms[f] = Math.sqrt(sum / opts.enbwBins);
    for (const other of opts.others ?? []) {
      const fo = guideHz(other, ctx, f);
      // inside the band, counting the other component's own lobe
      if (Math.abs(fo - fg) < half + minHalf && other !== guide) crossing[f] = 1;
    }
  }
  return { hz, rms, crossing };
}

export interface SpeedTrack {
  rpm: number[];
  hz: number[];
  rms: number[];
  crossing: boolean[];
  /** Where a frame's level came from the Vold–Kalman filter (crossing-tracks.ts), when `served` was given */
  filtered: boolean[];
}

/**
 * A per-frame track on an ascending rpm grid: the frames in each rpm bin are averaged in power
 * (RMS of the mean square), at the bin's mean rpm. Empty bins are left out.
 */
export function trackAgainstSpeed(track: Track, frameRpm: Float64Array, rpmStep: number, served?: Uint8Array): SpeedTrack {
  const bins = new Map<number, { rpm: number; hz: number; power: number; n: number; crossing: boolean; filtered: boolean }>();
  for (let f = 0; f < track.rms.length; f++) {
    const r = frameRpm[f];
    const v = track.rms[f];
    if (!Number.isFinite(r) || !Number.isFinite(v)) continue;
    const key = Math.floor(r / rpmStep);
    const b = bins.get(key) ?? { rpm: 0, hz: 0, power: 0, n: 0, crossing: false, filtered: false };
    b.rpm += r;
    b.hz += track.hz[f];
    b.power += v * v;
    b.n++;
    b.crossing ||= track.crossing[f] === 1;
    b.filtered ||= served?.[f] === 1;
    bins.set(key, b);
  }
  const keys = [...bins.keys()].sort((a, b) => a - b);
  const out: SpeedTrack = { rpm: [], hz: [], rms: [], crossing: [], filtered: [] };
  for (const k of keys) {
    const b = bins.get(k)!;
    out.rpm.push(b.rpm / b.n);
    out.hz.push(b.hz / b.n);
    out.rms.push(Math.sqrt(b.power / b.n));
    out.crossing.push(b.crossing);
    out.filtered.push(b.filtered);
  }
  return out;
}
