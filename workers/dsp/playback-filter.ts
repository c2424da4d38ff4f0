/**
 * Vold–Kalman filtering for listening: the ticked guides (orders and carrier families, following the
 * carrier's shifts) alone ("isolate") or taken out of the channel ("remove"), processed block by block
 * ahead of the play head. The filter is the second-generation Vold–Kalman filter of vold-kalman.ts [1], [2];
 * this file decides what is solved where, so that playback starts quickly and keeps up with real time.
 *
 * Blocks. A block [from, to) is solved over [from − pad, to + pad) clamped to the signal and only its
 * middle is kept. The filter is a zero-phase two-pole smoother; its kernel decays as e^{−0.88·n/τ},
 * τ = fs/(π·B) samples (B the −3 dB bandwidth [2]; the rate from the poles of 1 + r²ω⁴), so with
 * pad = PAD_SETTLES·τ the truncation changes the kept samples by about e^{−0.88·PAD_SETTLES} (−54 dB) of
 * the levels nearby: consecutive blocks join without a seam and match the whole-signal solution (checked
 * to 0.1 dB in 50 ms frames in the tests).
 *
 * Speed. The coupled solve of K lines costs O(N·K³). Lines are coupled only where it matters: within a
 * padded block, two lines whose frequencies come within COUPLE_WITHIN_B·B of each other anywhere are put
 * in one cluster (union-find, nearest pairs first), and each cluster is solved with `voldKalman`. Far
 * apart, the uncoupled solutions are the coupled one: one line's filter passes a line Δf away with
 * amplitude response H = 1/(1 + r²·(2 − 2cos Δω)²), Δω = 2πΔf/fs [2], about 1/(1 + 0.41·(2Δf/B)⁴); at
 * Δf = 5B that is 2·10⁻⁴ (−72 dB), so what the coupling would take out of each estimate is already below
 * anything audible or measurable.
 * A cluster holds at most MAX_COUPLED (4) lines, the nearest pairs joined first: a cluster of 4 costs
 * about 8× four lines solved alone (150 ms against 19 ms for a 0.5 s block at 51.2 kHz, B = 10 Hz,
 * measured) and the cost grows as K³, while more than 4 lines within a few bandwidths of one another
 * (orders near 0 Hz at standstill, a carrier's sidebands at very low speed) cannot be told apart in a
 * short block anyway. A line left out of a full cluster is solved alone and then carries a share of its
 * close neighbour. Should a coupled solve fail (lines that coincide over most of a block make it
 * ill-posed), its lines are solved one after another, each from what the previous left, so nothing is
 * counted twice.
 * Near the signal's start or end the filter sees data on one side only and its response falls only slowly
 * with distance (lines 150B apart, solved apart, moved the first 50 ms of a run by 0.15 dB against the
 * coupled solution, where inside the run they change nothing measurable), so in the blocks within a pad
 * of either end lines are coupled whatever their distance, nearest first, as long as the coupled clusters
 * stay within END_COUPLING_BUDGET (Σ K³ ≤ 64: one cluster of 4, or pairs and triples costing no more), so
 * the first and last blocks cost at most about one cluster of 4 more than the others.
 * A line alone (K = 1) has the real system (r²·DᵀD + I)·x = conj(c)·y, the same for every such line of a
 * block: it is factored once (banded Cholesky, bandwidth 2 [3]) and each line costs two substitutions
 * (the same answer as voldKalman with K = 1, checked in the tests).
 *
 * Valid range. A line contributes only where LOW_LIMIT_B·B < f ≤ MAX_FRACTION_FS·fs. Below, the
 * component's mirror image at −f lies within 2B of it and is no longer rejected (the estimate would double
 * the low-frequency content); above, the line is too close to fs/2. Outside that range the frequency is
 * clamped into it for the solve (so the system stays well posed) and the line's contribution is faded
 * to zero over FADE_S (raised cosine, by distance to the nearest sample out of range), so nothing clicks.
 * A line out of range for a whole block contributes nothing there. Lines whose frequencies stay within
 * B/10 of each other over a whole padded block are one line to the filter and are counted once.
 *
 * Frequencies per sample come from the map's frames: rpm interpolated linearly between frame centres
 * (held beyond the first and last), the carrier held at the nearest frame (it shifts in steps), unknown
 * (NaN) frames taking the nearest known value; then guide-formula.ts (families after Holmes & Lipo [4]).
 *
 * References: [1] H. Vold, J. Leuridan, "High resolution order tracking at extreme slew rates, using Kalman
 *   tracking filters", SAE 931288, 1993. [2] J. Tůma, "Setting the passband width in the Vold-Kalman order
 *   tracking filter", ICSV12, Lisbon 2005. [3] G. H. Golub, C. F. Van Loan, Matrix Computations, 4th ed.,
 *   2013, §4.3 (banded Cholesky). [4] D. G. Holmes, T. A. Lipo, Pulse Width Modulation for Power
 *   Converters, Wiley 2003, eq. 3.33.
 */
import { guideFrequencyHz, type Guide, type GuideMoment } from './guide-formula';
import type { StftLayout } from './stft';
import type { GuideContext } from './tracks';
import { phaseOf, voldKalman, voldKalmanWeight } from './vold-kalman';

export type PlaybackProcessing = 'isolate' | 'remove';

/** A ticked guide, with its frequency context per frame of the map (as the Bench resolves its lines). */
export interface PlaybackLine {
  guide: Guide;
  ctx: GuideContext;
}

export interface PlaybackFilterOptions {
  /** −3 dB bandwidth B of each line's filter, Hz (0 < B < fs/2) */
  bandwidthHz: number;
  processing: PlaybackProcessing;
}

/** Suggested block length for playback, s (tests/bench/playback-bench.ts: a first block of 3–4 lines at 51.2 kHz in 14–255 ms on 2 cores). */
export const PLAYBACK_BLOCK_S = 0.5;

/** Solved margin each side of a block, in time constants fs/(π·B) of the filter. */
export const PAD_SETTLES = 7;
/** Lines closer than this many bandwidths somewhere in a padded block are solved together. */
export const COUPLE_WITHIN_B = 5;
/** Near the signal's ends, lines farther apart are coupled while Σ K³ over the coupled clusters stays within this (one cluster of 4). */
export const END_COUPLING_BUDGET = 64;
/** At most this many lines are solved together (cost ∝ K³). */
export const MAX_COUPLED = 4;
/** A line contributes above LOW_LIMIT_B·B … */
export const LOW_LIMIT_B = 1;
/** … and up to this fraction of fs. */
export const MAX_FRACTION_FS = 0.48;
/** Fade of a line's contribution where it enters or leaves the valid range, s. */
export const FADE_S = 0.01;

/** NaN frames take the value of the nearest known frame (the earlier on a tie); null when none is known. */
function filled(v: Float64Array | undefined): Float64Array | null {
  if (!v || v.length === 0) return null;
  const n = v.length;
  const out = new Float64Array(n);
  const prev = new Int32Array(n);
  let last = -1;
  for (let i = 0; i < n; i++) {
    if (Number.isFinite(v[i])) last = i;
    prev[i] = last;
  }
  if (last < 0) return null;
  let next = -1;
  for (let i = n - 1; i >= 0; i--) {
    if (Number.isFinite(v[i])) next = i;
    const p = prev[i];
    const use = p < 0 ? next : next < 0 ? p : i - p <= next - i ? p : next;
    out[i] = v[use];
  }
  return out;
}

/**
 * Each line's instantaneous frequency per sample over [from, to), Hz (NaN where it cannot be known: no
 * speed, or a family without a carrier or pole pairs).
 * @param layout the map's framing (frame centres at t0S + f·hopS); ctx arrays hold one value per frame
 */
export function lineFrequencies(lines: PlaybackLine[], layout: StftLayout, fsHz: number, from: number, to: number): Float64Array[] {
  const n = Math.max(0, to - from);
  const cache = new Map<GuideContext, { rpm: Float64Array | null; carrier: Float64Array | null }>();
  const moment: GuideMoment = { rpm: NaN, carrierHz: NaN, polePairs: NaN };
  return lines.map(({ guide, ctx }) => {
    let c = cache.get(ctx);
    if (!c) {
      c = { rpm: filled(ctx.rpm), carrier: filled(ctx.carrierHz) };
      cache.set(ctx, c);
    }
    const out = new Float64Array(n);
    const { rpm, carrier } = c;
    moment.polePairs = ctx.polePairs ?? NaN;
    if (!rpm || !(layout.hopS > 0)) return out.fill(NaN);
    const last = rpm.length - 1;
    const lastCarrier = carrier ? carrier.length - 1 : -1;
    for (let i = 0; i < n; i++) {
      // position in frames: frame f's centre is at t0S + f·hopS
      const u = ((from + i) / fsHz - layout.t0S) / layout.hopS;
      if (!(u > 0)) moment.rpm = rpm[0];
      else if (u >= last) moment.rpm = rpm[last];
      else {
        const f = Math.floor(u);
        moment.rpm = rpm[f] + (u - f) * (rpm[f + 1] - rpm[f]);
      }
      moment.carrierHz = carrier ? carrier[Math.min(lastCarrier, Math.max(0, Math.round(u)))] : NaN;
      out[i] = guideFrequencyHz(guide, moment);
    }
    return out;
  });
}

/** The factor L (L·Lᵀ = r²·DᵀD + I, D the second difference) of a single line's system: bands l0, l1, l2. */
function singleLineFactor(n: number, r2: number): { l0: Float64Array; l1: Float64Array; l2: Float64Array } {
  // the matrix: diagonal, first and second sub-diagonals (a1[i] = A[i][i−1], a2[i] = A[i][i−2])
  const a0 = new Float64Array(n).fill(1);
  const a1 = new Float64Array(n);
  const a2 = new Float64Array(n);
  for (let i = 0; i + 2 < n; i++) {
    // row i of D is [1, −2, 1] at i, i+1, i+2: DᵀD gains its outer product
    a0[i] += r2;
    a0[i + 1] += 4 * r2;
    a0[i + 2] += r2;
    a1[i + 1] -= 2 * r2;
    a1[i + 2] -= 2 * r2;
    a2[i + 2] += r2;
  }
  const l0 = new Float64Array(n);
  const l1 = new Float64Array(n);
  const l2 = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    l2[i] = i >= 2 ? a2[i] / l0[i - 2] : 0;
    l1[i] = i >= 1 ? (a1[i] - (i >= 2 ? l2[i] * l1[i - 1] : 0)) / l0[i - 1] : 0;
    l0[i] = Math.sqrt(a0[i] - l1[i] * l1[i] - l2[i] * l2[i]);
  }
  return { l0, l1, l2 };
}

/** Solves L·Lᵀ·x = b in place (b real). */
function substitute(L: { l0: Float64Array; l1: Float64Array; l2: Float64Array }, b: Float64Array) {
  const { l0, l1, l2 } = L;
  const n = b.length;
  for (let i = 0; i < n; i++) {
    let s = b[i];
    if (i >= 1) s -= l1[i] * b[i - 1];
    if (i >= 2) s -= l2[i] * b[i - 2];
    b[i] = s / l0[i];
  }
  for (let i = n - 1; i >= 0; i--) {
    let s = b[i];
    if (i + 1 < n) s -= l1[i + 1] * b[i + 1];
    if (i + 2 < n) s -= l2[i + 2] * b[i + 2];
    b[i] = s / l0[i];
  }
}

/** One line alone over y[a, a + n): its time signal 2·Re(x·e^{jΘ}), the same as voldKalman with K = 1. */
function singleLine(y: Float32Array | Float64Array, a: number, freq: Float64Array, fsHz: number, L: ReturnType<typeof singleLineFactor>): Float64Array {
  const n = freq.length;
  const th = phaseOf(freq, fsHz);
  const cos = new Float64Array(n);
  const sin = new Float64Array(n);
  const re = new Float64Array(n);
  const im = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    cos[i] = Math.cos(th[i]);
    sin[i] = Math.sin(th[i]);
    re[i] = cos[i] * y[a + i];
    im[i] = -sin[i] * y[a + i];
  }
  substitute(L, re);
  substitute(L, im);
  for (let i = 0; i < n; i++) re[i] = 2 * (re[i] * cos[i] - im[i] * sin[i]);
  return re;
}

/** The line's weight per sample: 1 in range, faded (raised cosine over `fade` samples) to 0 out of it. */
function weightOf(valid: Uint8Array, fade: number): Float64Array | null {
  const n = valid.length;
  if (valid.every((v) => v === 1)) return null;
  // distance to the nearest sample out of range, both ways, capped at `fade`
  const d = new Float64Array(n);
  let since = fade;
  for (let i = 0; i < n; i++) {
    since = valid[i] ? Math.min(fade, since + 1) : 0;
    d[i] = since;
  }
  since = fade;
  for (let i = n - 1; i >= 0; i--) {
    since = valid[i] ? Math.min(fade, since + 1) : 0;
    d[i] = Math.min(d[i], since);
  }
  for (let i = 0; i < n; i++) d[i] = 0.5 - 0.5 * Math.cos((Math.PI * d[i]) / fade);
  return d;
}

/** Smallest and largest |f_a − f_b| over the block (sampled every `stride`, a sign change counting as 0). */
function gap(fa: Float64Array, fb: Float64Array, stride: number): { min: number; max: number } {
  let min = Infinity;
  let max = 0;
  let prev = NaN;
  const n = fa.length;
  for (let k = 0; k < n + stride - 1; k += stride) {
    const i = Math.min(k, n - 1); // the last sample is always looked at
    const d = fa[i] - fb[i];
    const ad = Math.abs(d);
    if (ad < min) min = ad;
    if (ad > max) max = ad;
    if (prev * d < 0) min = 0;
    prev = d;
  }
  return { min, max };
}

/**
 * The processed samples [from, to) of y: the sum of the lines' components (isolate) or y less them
 * (remove). from and to are rounded to whole samples; samples of [from, to) outside the signal are 0
 * (none for a non-finite bound). Never throws for a block at the signal's
 * start or end, nor for lines whose frequency cannot be known (they contribute nothing).
 * @throws RangeError for a bandwidth not in (0, fs/2)
 */
export function filterBlock(y: Float32Array, fsHz: number, lines: PlaybackLine[], layout: StftLayout, fromSample: number, toSample: number, opts: PlaybackFilterOptions): Float32Array {
  if (!(Number.isFinite(fromSample) && Number.isFinite(toSample))) return new Float32Array(0);
  const from = Math.round(fromSample);
  const to = Math.round(toSample);
  const out = new Float32Array(Math.max(0, to - from));
  const r = voldKalmanWeight(opts.bandwidthHz, fsHz);
  const B = opts.bandwidthHz;
  const N = y.length;
  const lo = Math.max(0, from);
  const hi = Math.min(N, to);
  if (hi <= lo) return out;
  const isolate = opts.processing === 'isolate';
  if (!isolate) for (let i = lo; i < hi; i++) out[i - from] = y[i];
  if (!lines.length) return out;

  const tau = fsHz / (Math.PI * B);
  const fade = Math.max(1, Math.round(FADE_S * fsHz));
  const pad = Math.max(Math.ceil(PAD_SETTLES * tau), 2 * fade);
  const a = Math.max(0, lo - pad);
  const b = Math.min(N, hi + pad);
  const n = b - a;
  if (n < 3) return out;
  const fLow = LOW_LIMIT_B * B;
  const fHigh = MAX_FRACTION_FS * fsHz;

  // frequencies clamped into the valid range for the solve; each line's weight where it is in range
  type Solved = { freq: Float64Array; weight: Float64Array | null };
  const live: Solved[] = [];
  for (const freq of lineFrequencies(lines, layout, fsHz, a, b)) {
    const valid = new Uint8Array(n);
    let any = false;
    for (let i = 0; i < n; i++) {
      const f = freq[i];
      const ok = f > fLow && f <= fHigh;
      valid[i] = ok ? 1 : 0;
      if (ok && i >= lo - a && i < hi - a) any = true;
      freq[i] = ok ? f : f > fHigh ? fHigh : fLow;
    }
    if (!any) continue; // out of range over the whole block: nothing to hear from it here
    live.push({ freq, weight: weightOf(valid, fade) });
  }
  if (!live.length) return out;

  // duplicates (within B/10 throughout) count once; close pairs are coupled, nearest first, in clusters of at most MAX_COUPLED
  const stride = Math.max(1, Math.min(64, Math.floor(tau / 8)));
  const near = COUPLE_WITHIN_B * B;
  const atEnd = lo < pad || N - hi < pad;
  const couple = atEnd ? Infinity : near;
  const pairs: { i: number; j: number; min: number }[] = [];
  const dropped = new Uint8Array(live.length);
  for (let i = 0; i < live.length; i++) {
    if (dropped[i]) continue;
    for (let j = i + 1; j < live.length; j++) {
      if (dropped[j]) continue;
      const g = gap(live[i].freq, live[j].freq, stride);
      if (g.max < B / 10) dropped[j] = 1;
      else if (g.min < couple) pairs.push({ i, j, min: g.min });
    }
  }
  const parent = live.map((_, i) => i);
  const size = live.map(() => 1);
  const root = (i: number): number => (parent[i] === i ? i : (parent[i] = root(parent[i])));
  pairs.sort((p, q) => p.min - q.min);
  const cube = (k: number) => (k > 1 ? k ** 3 : 0);
  let spent = 0;
  for (const p of pairs) {
    if (dropped[p.i] || dropped[p.j]) continue;
    const ri = root(p.i);
    const rj = root(p.j);
    if (ri === rj || size[ri] + size[rj] > MAX_COUPLED) continue;
    // near an end, far pairs are coupled only within the budget (Σ K³ over the coupled clusters)
    const after = spent - cube(size[ri]) - cube(size[rj]) + cube(size[ri] + size[rj]);
    if (p.min >= near && after > END_COUPLING_BUDGET) continue;
    spent = after;
    parent[rj] = ri;
    size[ri] += size[rj];
  }
  const clusters = new Map<number, number[]>();
  live.forEach((_, i) => {
    if (dropped[i]) return;
    const c = root(i);
    clusters.set(c, [...(clusters.get(c) ?? []), i]);
  });

  // the components' sum over the kept samples, weighted
  const sum = new Float64Array(hi - lo);
  const add = (line: Solved, s: Float32Array | Float64Array) => {
    for (let i = lo; i < hi; i++) sum[i - lo] += (line.weight ? line.weight[i - a] : 1) * s[i - a];
  };
  let factor: ReturnType<typeof singleLineFactor> | null = null;
  const single = () => (factor ??= singleLineFactor(n, r * r));
  const ySub = y.subarray(a, b);
  for (const members of clusters.values()) {
    if (members.length === 1) {
      add(live[members[0]], singleLine(y, a, live[members[0]].freq, fsHz, single()));
      continue;
    }
    try {
      const vk = voldKalman(ySub, fsHz, members.map((k) => live[k].freq), { bandwidthHz: B, blockSamples: n });
      const parts = members.map((_, k) => vk.signal(k));
      for (const p of parts) for (const v of p) if (!Number.isFinite(v)) throw new Error('The coupled solve did not converge.');
      members.forEach((k, m) => add(live[k], parts[m]));
    } catch {
      // an ill-posed coupled system (lines that coincide over most of the block): solve the lines one
      // after another, each from what the previous ones left, so no component is counted twice
      const rest = Float64Array.from(ySub);
      for (const k of members) {
        const s = singleLine(rest, 0, live[k].freq, fsHz, single());
        for (let i = 0; i < n; i++) rest[i] -= s[i];
        add(live[k], s);
      }
    }
  }
  if (isolate) for (let i = lo; i < hi; i++) out[i - from] = sum[i - lo];
  else for (let i = lo; i < hi; i++) out[i - from] = y[i] - sum[i - lo];
  return out;
}

/**
 * The processed samples of [from, to), block after block (for a WAV export of what was heard: the same
 * blocks as playback by default).
 */
export function filterRange(
  y: Float32Array,
  fsHz: number,
  lines: PlaybackLine[],
  layout: StftLayout,
  from: number,
  to: number,
  opts: PlaybackFilterOptions,
  blockSamples = Math.round(PLAYBACK_BLOCK_S * fsHz),
): Float32Array {
  if (!(Number.isFinite(from) && Number.isFinite(to))) return new Float32Array(0);
  from = Math.round(from);
  to = Math.round(to);
  const out = new Float32Array(Math.max(0, to - from));
  const step = Math.max(1, Math.round(Number.isFinite(blockSamples) ? blockSamples : PLAYBACK_BLOCK_S * fsHz));
  for (let s = from; s < to; s += step) {
    const e = Math.min(to, s + step);
    out.set(filterBlock(y, fsHz, lines, layout, s, e, opts), s - from);
  }
  return out;
}
