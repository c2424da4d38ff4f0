/**
 * Tracks where guides cross: there the band sum of the spectrum holds two (or more) components, so the
 * level of each is taken from the coupled Vold–Kalman filter instead (vold-kalman.ts), run on the time
 * samples around each stretch of crossing frames with exactly the guides that meet there. Elsewhere the
 * spectral track stays. The frames the filter served are marked.
 * Method: spectral tracks (Brandt, Noise and Vibration Analysis, 2011, ch. 12 [from memory]) with
 * Vold–Kalman extraction at crossings (Vold & Leuridan, SAE 931288, 1993), common practice to combine.
 */
import type { StftLayout } from './stft';
import { guideHz, type Guide, type GuideContext, type Track } from './tracks';
import { voldKalman } from './vold-kalman';

/** Time on each side of a stretch of crossing frames given to the filter, s (it settles within it). */
const PAD_S = 0.3;
/** At most this many guides are coupled in one stretch (the nearest ones in frequency). */
const MAX_COUPLED = 3;

export interface CrossingOptions {
  /** −3 dB bandwidth of the filter, Hz (default: one bin of the map) */
  bandwidthHz?: number;
}

/** A guide with the context its frequency is taken in (each carrier guide may have its own carrier). */
export interface CrossingGuide {
  guide: Guide;
  ctx: GuideContext;
}

/**
 * Replaces the level of every crossing frame of every track with the filter's, in place.
 * @param x      the channel's samples (the map's own), unit U
 * @param guides one per track
 * @param tracks one per guide, as trackGuide made them on `layout`
 * @returns per track, 1 where the level came from the filter
 */
export function resolveCrossings(
  x: Float32Array,
  layout: StftLayout,
  guides: CrossingGuide[],
  tracks: Track[],
  opts: CrossingOptions = {},
): Uint8Array[] {
  const frames = layout.frames;
  const served = tracks.map(() => new Uint8Array(frames));
  const any = new Uint8Array(frames);
  for (const t of tracks) for (let f = 0; f < frames; f++) if (t.crossing[f] && Number.isFinite(t.rms[f])) any[f] = 1;
  const bandwidthHz = opts.bandwidthHz ?? layout.binHz;
  const padFrames = Math.ceil(PAD_S / layout.hopS);
  for (let f = 0; f < frames; f++) {
    if (!any[f]) continue;
    let g = f;
    while (g + 1 < frames && any[g + 1]) g++;
    resolveStretch(x, layout, guides, tracks, served, f, g, padFrames, bandwidthHz);
    f = g;
  }
  return served;
}

function resolveStretch(
  x: Float32Array,
  layout: StftLayout,
  guides: CrossingGuide[],
  tracks: Track[],
  served: Uint8Array[],
  f0: number,
  f1: number,
  padFrames: number,
  bandwidthHz: number,
): void {
  // the guides that cross in this stretch
  let involved = tracks.map((_, i) => i).filter((i) => {
    for (let f = f0; f <= f1; f++) if (tracks[i].crossing[f] && Number.isFinite(tracks[i].rms[f])) return true;
    return false;
  });
  const mid = (f0 + f1) >> 1;
  if (involved.length > MAX_COUPLED) {
    // keep the ones nearest in frequency to the others at the middle of the stretch
    const hzAt = (i: number) => tracks[i].hz[mid];
    involved = involved
      .map((i) => ({ i, d: Math.min(...involved.filter((j) => j !== i).map((j) => Math.abs(hzAt(i) - hzAt(j)))) }))
      .sort((a, b) => a.d - b.d)
      .slice(0, MAX_COUPLED)
      .map((o) => o.i);
  }
  if (involved.length < 2) return;
  const a = Math.max(0, f0 - padFrames);
  const b = Math.min(layout.frames - 1, f1 + padFrames);
  const s0 = a * layout.hop;
  const s1 = Math.min(x.length, b * layout.hop + layout.blockSize);
  const n = s1 - s0;
  const fsHz = layout.fsHz;
  // each guide's frequency per sample, interpolated between frame centres
  const freqs = involved.map((i) => {
    const out = new Float64Array(n);
    for (let s = 0; s < n; s++) {
      const pos = Math.max(0, Math.min(layout.frames - 1, ((s0 + s) / fsHz - layout.t0S) / layout.hopS));
      const fa = Math.floor(pos);
      const fb = Math.min(layout.frames - 1, fa + 1);
      const ha = guideHz(guides[i].guide, guides[i].ctx, fa);
      const hb = guideHz(guides[i].guide, guides[i].ctx, fb);
      const v = ha + (hb - ha) * (pos - fa);
      out[s] = Number.isFinite(v) && v > 0 ? v : 0;
    }
    return out;
  });
  const vk = voldKalman(x.subarray(s0, s1), fsHz, freqs, { bandwidthHz });
  for (let k = 0; k < involved.length; k++) {
    const t = tracks[involved[k]];
    for (let f = f0; f <= f1; f++) {
      if (!t.crossing[f] || !Number.isFinite(t.rms[f])) continue;
      // the RMS over the frame's block: √2·|x|, x the envelope (A/2)
      const from = f * layout.hop - s0;
      const to = Math.min(n, from + layout.blockSize);
      let sum = 0;
      for (let s = from; s < to; s++) sum += vk.re[k][s] ** 2 + vk.im[k][s] ** 2;
      t.rms[f] = Math.sqrt((2 * sum) / Math.max(1, to - from));
      served[involved[k]][f] = 1;
    }
  }
}
