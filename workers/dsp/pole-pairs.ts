/**
 * Pole pairs from the sideband offsets, and which parity pattern the families follow.
 *
 * In inverter voltage and phase current of two-level sine-triangle and space-vector PWM, the families
 * m·fc + n·fe carry m + n odd (fc ± 2fe, fc ± 4fe, 2fc ± fe, 2fc ± 5fe) — Black's double Fourier series
 * [1]; in the radial force, and so in the vibration and sound it drives, the current sidebands beat with
 * the fundamental field and m + n is even (fc ± fe, fc ± 3fe, 2fc, 2fc ± 2fe) [2]. Sidebands at m·fc ± d
 * are measured in shaft orders o = d/fr; a pole-pair count p and a pattern predict o = |n|·p for the
 * allowed n. Each candidate (p, pattern) scores the strength it explains (each offset weighed by the
 * square of its strength), minus what it leaves unexplained, minus its lowest predicted sidebands that
 * are missing; the best wins, and a runner-up
 * within 10 % makes the answer ambiguous. One sideband pair often fits two answers of the two patterns
 * (fc ± 4fr: p = 4 with n = ±1, m + n even, or p = 2 with n = ±2, m + n odd); when the caller knows which
 * pattern its channel carries (a vibration or sound channel the force's, a voltage or current channel
 * the inverter's), the one answer of that pattern among the tied settles it.
 * References: [1] D. G. Holmes, T. A. Lipo, Pulse Width Modulation for Power Converters, 2003, ch. 3.
 *   [2] the force-line table of the project's domain notes (derived from the phase sequence of each
 *   harmonic; common practice in the PWM-noise literature).
 */
import type { StftLayout } from './stft';

export type FamilyPattern = 'm+n odd' | 'm+n even';

export interface PolePairEstimate {
  value: number | null;
  pattern: FamilyPattern | null;
  ambiguous: boolean;
  /** The sidebands alone fitted answers of both patterns; the channel's expected pattern chose this one */
  settledByChannel: boolean;
  /** Observed offsets in shaft orders with their strengths, at m = 1 and m = 2 */
  observed: { m: number; orders: number; strength: number }[];
}

export const allowedN = (m: number, n: number, pattern: FamilyPattern) => ((m + Math.abs(n)) % 2 === 1) === (pattern === 'm+n odd');

const ORDER_RESOLUTION = 0.25;

/**
 * Symmetric sideband pairs around m·fc in each frame, converted to shaft orders and accumulated into a
 * histogram; its peaks are the observed offsets.
 */
export function observeSidebandOffsets(
  power: Float32Array,
  layout: StftLayout,
  carrierHz: Float64Array,
  frameRpm: Float64Array,
  maxOrders = 120,
): { m: number; orders: number; strength: number }[] {
  const bins = layout.bins;
  const out: { m: number; orders: number; strength: number }[] = [];
  const db = new Float64Array(bins);
  for (const m of [1, 2]) {
    const hist = new Float64Array(Math.ceil(maxOrders / ORDER_RESOLUTION) + 2);
    for (let f = 0; f < layout.frames; f++) {
      const fc = carrierHz[f];
      const fr = frameRpm[f] / 60;
      if (!Number.isFinite(fc) || !(fr > 0)) continue;
      const row = f * bins;
      const c = (m * fc) / layout.binHz;
      const span = Math.min(Math.floor(c) - 2, bins - 3 - Math.ceil(c), Math.floor((maxOrders * fr) / layout.binHz));
      if (span < 3) continue;
      const lo = Math.max(1, Math.floor(c - span));
      const hi = Math.min(bins - 2, Math.ceil(c + span));
      for (let k = lo; k <= hi; k++) db[k] = 10 * Math.log10(power[row + k] + 1e-30);
      // local floor: median level of the span
      const sorted = Array.from(db.subarray(lo, hi + 1)).sort((a, b) => a - b);
      const floor = sorted[Math.floor(sorted.length * 0.5)];
      const isPeak = (k: number) => k > lo && k < hi && db[k] > db[k - 1] && db[k] >= db[k + 1] && db[k] - floor > 10;
      for (let d = 2; d <= span; d++) {
        const up = Math.round(c + d);
        // the mirror may sit a bin off (c is fractional): take the best of three
        let down = -1;
        for (const k of [Math.round(c - d) - 1, Math.round(c - d), Math.round(c - d) + 1]) if (isPeak(k) && (down < 0 || db[k] > db[down])) down = k;
        if (!isPeak(up) || down < 0) continue;
        const strength = Math.min(db[up], db[down]) - floor;
        const orders = ((up - down) / 2) * (layout.binHz / fr);
        const idx = Math.round(orders / ORDER_RESOLUTION);
        if (idx < hist.length) hist[idx] += strength;
      }
    }
    // peaks of the (lightly smoothed) histogram are the offsets seen
    const smooth = hist.map((_, i) => (hist[i - 1] ?? 0) * 0.5 + hist[i] + (hist[i + 1] ?? 0) * 0.5);
    const top = Math.max(...smooth);
    for (let i = 1; i < smooth.length - 1; i++) {
      if (smooth[i] > 0.08 * top && smooth[i] >= smooth[i - 1] && smooth[i] > smooth[i + 1]) {
        out.push({ m, orders: i * ORDER_RESOLUTION, strength: smooth[i] });
      }
    }
  }
  return out;
}

export function inferPolePairs(
  observed: { m: number; orders: number; strength: number }[],
  maxPolePairs = 12,
  expected: FamilyPattern | null = null,
): PolePairEstimate {
  if (observed.length === 0) return { value: null, pattern: null, ambiguous: false, settledByChannel: false, observed };
  // weighted by the square of their strength, so the many weak offsets that noise and the other
  // families' lines leave at whole orders do not outvote the strong sidebands
  const weight = (o: { strength: number }) => o.strength * o.strength;
  const total = observed.reduce((s, o) => s + weight(o), 0);
  const meanStrength = total / observed.length;
  const candidates: { p: number; pattern: FamilyPattern; score: number }[] = [];
  for (let p = 1; p <= maxPolePairs; p++) {
    for (const pattern of ['m+n odd', 'm+n even'] as const) {
      let explained = 0;
      for (const o of observed) {
        const n = o.orders / p;
        const rounded = Math.round(n);
        if (rounded >= 1 && Math.abs(n - rounded) * p <= 0.35 && allowedN(o.m, rounded, pattern)) explained += weight(o);
      }
      // the lowest allowed sideband of each group should be there
      let missing = 0;
      for (const m of [1, 2]) {
        const n = [1, 2, 3].find((k) => allowedN(m, k, pattern))!;
        const seen = observed.some((o) => o.m === m && Math.abs(o.orders - n * p) <= 0.35);
        const groupSeen = observed.some((o) => o.m === m);
        if (groupSeen && !seen) missing += meanStrength;
      }
      candidates.push({ p, pattern, score: explained - (total - explained) - missing });
    }
  }
  candidates.sort((a, b) => b.score - a.score);
  const [best, second] = candidates;
  if (!(best.score > 0)) return { value: null, pattern: null, ambiguous: true, settledByChannel: false, observed };
  const ambiguous = second !== undefined && second.score > 0.9 * best.score;
  if (ambiguous && expected) {
    const tied = candidates.filter((c) => c.score > 0.9 * best.score);
    const ofPattern = tied.filter((c) => c.pattern === expected);
    const other = tied.filter((c) => c.pattern !== expected);
    // settled only when the expected pattern has one answer among the tied, and the other pattern
    // is what made it a tie
    if (ofPattern.length === 1 && other.length > 0) {
      return { value: ofPattern[0].p, pattern: expected, ambiguous: false, settledByChannel: true, observed };
    }
  }
  return { value: best.p, pattern: best.pattern, ambiguous, settledByChannel: false, observed };
}

const MAX_N = 8;

/** The offset o (shaft orders) at m·fc is a sideband n·p of the pattern, for a whole n ≥ 1 */
const explains = (o: { m: number; orders: number }, p: number, pattern: FamilyPattern, tolerance: number) => {
  const n = Math.round(o.orders / p);
  return n >= 1 && Math.abs(o.orders - n * p) <= tolerance && allowedN(o.m, n, pattern);
};

/**
 * The pole pairs an electrical channel's fundamental gives (electrical-fundamental.ts: fe/fr), held
 * against the sidebands. The fundamental breaks the tie the sidebands cannot: at one speed every divisor
 * of p explains the offsets n·p·fr, and the many weak offsets at whole orders then favour p = 1. It is
 * taken when the sidebands do not contradict it: in each group m that shows sidebands, the strongest
 * offset up to 8p must be a sideband n·p of the inverter pattern (m + n odd; Holmes & Lipo 2003, ch. 3),
 * and the offsets it explains must be as strong on average (mean square) as those it leaves. Not a share
 * of the total: where the spectrum is a dense comb (folded groups at a low sampling rate) the pair search
 * finds an offset at nearly every order, and a share would reject the right p for the noise it cannot
 * explain. A line at 2fe or 3fe mistaken for the fundamental fails this (its p puts the strongest
 * sideband pair, fc ± 2fe, at n = 1 or a fraction). Without resolved sidebands the fundamental answers
 * alone and the pattern stays unknown.
 * `orderTolerance`: how far an offset may sit from n·p, in orders; at least 0.35, and half a bin in
 * orders (binHz / 2fr) where the bins are coarse, since an offset is read from whole bins either side.
 */
export function withFundamental(est: PolePairEstimate, fundamentalPolePairs: number | null, orderTolerance = 0.35): PolePairEstimate {
  if (fundamentalPolePairs === null) return est;
  const p = fundamentalPolePairs;
  // the sidebands of the families themselves: |n| ≤ 8 (the Bessel terms J_n(m·M·π/2) of the series are
  // small beyond that in the linear range; common practice). Offsets further out are pairs the search
  // made of lines of other groups and the baseband.
  const observed = est.observed.filter((o) => o.orders <= MAX_N * p + orderTolerance);
  if (observed.length === 0) return { value: p, pattern: null, ambiguous: false, settledByChannel: false, observed: est.observed };
  for (const m of [1, 2]) {
    const group = observed.filter((o) => o.m === m);
    if (!group.length) continue;
    const strongest = group.reduce((a, b) => (b.strength > a.strength ? b : a));
    if (!explains(strongest, p, 'm+n odd', orderTolerance)) return est;
  }
  const yes = observed.filter((o) => explains(o, p, 'm+n odd', orderTolerance));
  const no = observed.filter((o) => !explains(o, p, 'm+n odd', orderTolerance));
  const meanSquare = (xs: { strength: number }[]) => xs.reduce((s, o) => s + o.strength * o.strength, 0) / Math.max(1, xs.length);
  if (meanSquare(yes) < meanSquare(no)) return est;
  return { value: p, pattern: 'm+n odd', ambiguous: false, settledByChannel: false, observed: est.observed };
}
