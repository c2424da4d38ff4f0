/**
 * Block-wise Vold–Kalman filtering for listening (workers/dsp/playback-filter.ts) on analytic signals whose
 * answers are known from their formulas: a run-up carrying two machine orders (f = k·rpm/60) and two
 * carrier families (f = m·fc + n·p·rpm/60, Holmes & Lipo 2003, eq. 3.33) of known amplitudes, each a tone
 * whose phase integrates its frequency, plus Gaussian noise. The filter is the second-generation
 * Vold–Kalman filter (Vold & Leuridan, SAE 931288, 1993; bandwidth after Tůma, ICSV12 2005); the checks
 * are its published properties (a component inside the passband comes back whole, one outside it is
 * rejected) and the identity of the block-wise answer with the whole-signal one.
 *
 * Levels are read by a tracking measurement: the output demodulated by e^{−jΘ(t)} (Θ the running phase of
 * the component's known frequency law) and averaged over 50 ms Hann frames, which gives the complex
 * envelope A/2·e^{jφ} of a component following that law (common practice: synchronous demodulation).
 */
import { describe, expect, it } from 'vitest';
import { filterBlock, filterRange, lineFrequencies, PLAYBACK_BLOCK_S, type PlaybackLine } from '../../../workers/dsp/playback-filter';
import { frameTimeS, stftLayout } from '../../../workers/dsp/stft';
import { voldKalman } from '../../../workers/dsp/vold-kalman';
import { tone } from '../../support/tones';

const FS = 25_600;
const T = 4;
const N = FS * T;
const P = 4; // pole pairs
const B = 10; // Hz
const rpmOf = (t: number) => 1000 + 750 * t; // a run-up, 1000 → 4000 rpm
const FRAME = Math.round(0.05 * FS);

/** Deterministic Gaussian noise (Box–Muller over a fixed LCG, Numerical Recipes constants). */
function noise(n: number, rms: number, seed = 1): Float32Array {
  let s = seed >>> 0;
  const u = () => ((s = (Math.imul(s, 1664525) + 1013904223) >>> 0) + 0.5) / 2 ** 32;
  const out = new Float32Array(n);
  for (let i = 0; i < n; i++) out[i] = rms * Math.sqrt(-2 * Math.log(u())) * Math.cos(2 * Math.PI * u());
  return out;
}

const order = (k: number) => (t: number) => (k * rpmOf(t)) / 60;
const family = (m: number, n: number, fc: (t: number) => number) => (t: number) => m * fc(t) + (n * P * rpmOf(t)) / 60;
const fc6k = () => 6000;

// the map's framing: 512-sample Hann blocks, half overlap (frame centres every 10 ms from 10 ms)
const layout = stftLayout(N, FS, { blockSize: 512, overlap: 0.5, window: 'hann' });
const frameRpm = Float64Array.from({ length: layout.frames }, (_, f) => rpmOf(frameTimeS(layout, f)));
const ctx = { rpm: frameRpm, carrierHz: new Float64Array(layout.frames).fill(6000), polePairs: P };
const L = {
  o8: { guide: { kind: 'order', order: 8 }, ctx },
  o96: { guide: { kind: 'order', order: 96 }, ctx },
  fm: { guide: { kind: 'family', m: 1, n: -2, per: 'electrical' }, ctx },
  fp: { guide: { kind: 'family', m: 1, n: 2, per: 'electrical' }, ctx },
} satisfies Record<string, PlaybackLine>;

// The run: order 8 (133 → 533 Hz), order 96 (1.6 → 6.4 kHz, crossing fc − 2fe at 3461 rpm, t = 3.28 s),
// fc ∓ 2fe around a 6 kHz carrier. Amplitudes in channel units.
const A = { o8: 0.05, o96: 0.03, fm: 0.02, fp: 0.015 };
const laws = { o8: order(8), o96: order(96), fm: family(1, -2, fc6k), fp: family(1, 2, fc6k) };
const parts = {
  o8: tone(N, FS, laws.o8, () => A.o8, 0.3),
  o96: tone(N, FS, laws.o96, () => A.o96, 1.1),
  fm: tone(N, FS, laws.fm, () => A.fm, -0.7),
  fp: tone(N, FS, laws.fp, () => A.fp, 2.0),
};
const floor = noise(N, 0.001, 5);
const y = Float32Array.from(floor, (v, i) => v + parts.o8[i] + parts.o96[i] + parts.fm[i] + parts.fp[i]);

/** Amplitude of the component following `law` per 50 ms Hann frame (synchronous demodulation), with frame centres in s. */
function tracked(x: Float32Array, law: (t: number) => number): { t: number[]; amp: number[] } {
  const th = new Float64Array(x.length);
  for (let i = 1; i < x.length; i++) th[i] = th[i - 1] + (Math.PI * (law((i - 1) / FS) + law(i / FS))) / FS;
  const w = Float64Array.from({ length: FRAME }, (_, i) => 0.5 - 0.5 * Math.cos((2 * Math.PI * (i + 0.5)) / FRAME));
  const sw = w.reduce((s, v) => s + v, 0);
  const t: number[] = [];
  const amp: number[] = [];
  for (let a = 0; a + FRAME <= x.length; a += FRAME) {
    let re = 0;
    let im = 0;
    for (let i = 0; i < FRAME; i++) {
      re += w[i] * x[a + i] * Math.cos(th[a + i]);
      im -= w[i] * x[a + i] * Math.sin(th[a + i]);
    }
    t.push((a + FRAME / 2) / FS);
    amp.push((2 * Math.hypot(re, im)) / sw);
  }
  return { t, amp };
}

/** RMS level (dB re 1) of a tracked amplitude over the frames whose centres pass `keep`. */
function levelDb(x: Float32Array, law: (t: number) => number, keep: (t: number) => boolean): number {
  const { t, amp } = tracked(x, law);
  let s = 0;
  let n = 0;
  t.forEach((tt, k) => {
    if (keep(tt)) {
      s += amp[k] ** 2;
      n++;
    }
  });
  return 10 * Math.log10(s / n);
}

const dB = (a: number) => 20 * Math.log10(a);
const inside = (t: number) => t > 0.25 && t < T - 0.25;

/** Short-time RMS per 50 ms frame, dB. */
function frameRmsDb(x: Float32Array | Float64Array): number[] {
  const out: number[] = [];
  for (let a = 0; a + FRAME <= x.length; a += FRAME) {
    let s = 0;
    for (let i = a; i < a + FRAME; i++) s += x[i] ** 2;
    out.push(10 * Math.log10(s / FRAME));
  }
  return out;
}

describe('lineFrequencies', () => {
  it('interpolates rpm between frame centres, holds the carrier at the nearest frame and fills unknown frames', () => {
    // a hand-made framing: centres at 0.1 s + k·0.1 s, fs 1 kHz
    const lay = { fsHz: 1000, blockSize: 200, hop: 100, frames: 4, bins: 101, binHz: 5, hopS: 0.1, t0S: 0.1 };
    const c = { rpm: Float64Array.from([600, NaN, 1800, 2400]), carrierHz: Float64Array.from([NaN, 5000, 7000, NaN]), polePairs: 2 };
    const [o2, f1] = lineFrequencies([{ guide: { kind: 'order', order: 2 }, ctx: c }, { guide: { kind: 'family', m: 1, n: 1, per: 'electrical' }, ctx: c }], lay, 1000, 0, 500);
    // rpm frames become 600, 600 (nearest known, earlier on a tie), 1800, 2400; held before 0.1 s and after 0.4 s
    expect(o2[50]).toBeCloseTo((2 * 600) / 60, 9);
    expect(o2[250]).toBeCloseTo((2 * 1200) / 60, 9); // halfway between 600 and 1800
    expect(o2[350]).toBeCloseTo((2 * 2100) / 60, 9);
    expect(o2[480]).toBeCloseTo((2 * 2400) / 60, 9);
    // carrier frames become 5000, 5000, 7000, 7000, held at the nearest frame: f = fc + p·rpm/60
    expect(f1[240]).toBeCloseTo(5000 + (2 * (600 + 0.4 * 1200)) / 60, 6);
    expect(f1[260]).toBeCloseTo(7000 + (2 * (600 + 0.6 * 1200)) / 60, 6);
  });

  it('gives NaN for a line whose context knows nothing', () => {
    const lay = { fsHz: 1000, blockSize: 200, hop: 100, frames: 2, bins: 101, binHz: 5, hopS: 0.1, t0S: 0.1 };
    const [f] = lineFrequencies([{ guide: { kind: 'family', m: 1, n: 0, per: 'electrical' }, ctx: { rpm: Float64Array.from([1000, 1000]) } }], lay, 1000, 0, 10);
    expect(f.every(Number.isNaN)).toBe(true);
  });
});

describe('filterBlock / filterRange', () => {
  it('block by block equals the whole-signal coupled solution within 0.1 dB (50 ms frames), isolate and remove', () => {
    // the reference: voldKalman over the whole signal, all four lines coupled, one solve (Vold & Leuridan 1993)
    const lines = [L.o8, L.o96, L.fm, L.fp];
    const freqs = lineFrequencies(lines, layout, FS, 0, N);
    const vk = voldKalman(y, FS, freqs, { bandwidthHz: B, blockSamples: N });
    const whole = new Float64Array(N);
    for (let k = 0; k < lines.length; k++) vk.signal(k).forEach((v, i) => (whole[i] += v));
    const rest = Float64Array.from(y, (v, i) => v - whole[i]);
    // consecutive playback blocks, concatenated
    const step = Math.round(PLAYBACK_BLOCK_S * FS);
    const iso = new Float32Array(N);
    const rem = new Float32Array(N);
    for (let s = 0; s < N; s += step) {
      const e = Math.min(N, s + step);
      iso.set(filterBlock(y, FS, lines, layout, s, e, { bandwidthHz: B, processing: 'isolate' }), s);
      rem.set(filterBlock(y, FS, lines, layout, s, e, { bandwidthHz: B, processing: 'remove' }), s);
    }
    for (const [got, want] of [[iso, whole], [rem, rest]] as const) {
      const g = frameRmsDb(got);
      const w = frameRmsDb(want);
      const worst = Math.max(...g.map((v, k) => Math.abs(v - w[k])));
      expect(worst).toBeLessThan(0.1);
    }
    // and sample by sample, the seams leave no mark: the difference stays 40 dB under the isolated signal
    let e = 0;
    let s = 0;
    for (let i = 0; i < N; i++) {
      e += (iso[i] - whole[i]) ** 2;
      s += whole[i] ** 2;
    }
    expect(10 * Math.log10(e / s)).toBeLessThan(-40);
    // filterRange is the same blocks
    expect(Array.from(filterRange(y, FS, lines, layout, 0, N, { bandwidthHz: B, processing: 'isolate' }).subarray(0, 2000))).toEqual(Array.from(iso.subarray(0, 2000)));
  }, 20_000);

  it('removing a family lowers its band ≥ 30 dB and leaves the orders, the other family and the noise floor within 0.5 dB', () => {
    const out = filterRange(y, FS, [L.fp], layout, 0, N, { bandwidthHz: B, processing: 'remove' });
    // the family's band: down from its known amplitude (Vold & Leuridan 1993: the component inside the passband is extracted whole)
    expect(levelDb(out, laws.fp, inside) - dB(A.fp)).toBeLessThan(-30);
    // the rest, measured on the same footing before and after (outside the passband: rejected, Tůma 2005)
    for (const k of ['o8', 'o96', 'fm'] as const) {
      expect(Math.abs(levelDb(out, laws[k], inside) - levelDb(y, laws[k], inside))).toBeLessThan(0.5);
    }
    const quiet = () => 11_000; // a band holding only the noise floor
    expect(Math.abs(levelDb(out, quiet, inside) - levelDb(y, quiet, inside))).toBeLessThan(0.5);
  }, 20_000);

  it('isolating a family keeps it at its amplitude within 0.5 dB with the orders ≥ 30 dB down', () => {
    const out = filterRange(y, FS, [L.fm], layout, 0, N, { bandwidthHz: B, processing: 'isolate' });
    // away from order 96 crossing the family (t = 3.28 s): where both share the passband no filter of one line parts them
    const away = (t: number) => inside(t) && Math.abs(t - 3.28) > 0.3;
    expect(Math.abs(levelDb(out, laws.fm, away) - dB(A.fm))).toBeLessThan(0.5);
    expect(levelDb(out, laws.o8, away) - dB(A.o8)).toBeLessThan(-30);
    expect(levelDb(out, laws.o96, away) - dB(A.o96)).toBeLessThan(-30);
  }, 20_000);

  it('follows a carrier step (8 → 12 kHz at mid-run): the family is removed ≥ 25 dB away from ±0.1 s of the step', () => {
    const fcStep = (t: number) => (t < T / 2 ? 8000 : 12_000); // Hz
    // 2fc − fe would pass 0.48·fs after the step; fc − fe stays in range (8 kHz − fe → 12 kHz − fe)
    const law = family(1, -1, fcStep);
    const fam = tone(N, FS, law, () => 0.02, 0.4);
    const x = Float32Array.from(fam, (v, i) => v + parts.o8[i] + floor[i]);
    const stepCtx = { rpm: frameRpm, carrierHz: Float64Array.from({ length: layout.frames }, (_, f) => fcStep(frameTimeS(layout, f))), polePairs: P };
    const out = filterRange(x, FS, [{ guide: { kind: 'family', m: 1, n: -1, per: 'electrical' }, ctx: stepCtx }], layout, 0, N, { bandwidthHz: B, processing: 'remove' });
    const { t, amp } = tracked(out, law);
    const worst = Math.max(...amp.filter((_, k) => inside(t[k]) && Math.abs(t[k] - T / 2) > 0.1));
    expect(dB(worst) - dB(0.02)).toBeLessThan(-25);
    // the order under it is left alone (within 0.5 dB)
    expect(Math.abs(levelDb(out, laws.o8, inside) - dB(A.o8))).toBeLessThan(0.5);
  }, 20_000);

  it('solves a line alone as voldKalman does with K = 1 (the shared real factorisation)', () => {
    const n = FS; // one second, one block with no padding beyond the signal
    const x = y.subarray(0, n);
    const [f] = lineFrequencies([L.o96], layout, FS, 0, n);
    const want = voldKalman(x, FS, [f], { bandwidthHz: B, blockSamples: n }).signal(0);
    const got = filterBlock(x, FS, [L.o96], layout, 0, n, { bandwidthHz: B, processing: 'isolate' });
    let e = 0;
    let s = 0;
    for (let i = 0; i < n; i++) {
      e += (got[i] - want[i]) ** 2;
      s += want[i] ** 2;
    }
    expect(10 * Math.log10(e / s)).toBeLessThan(-80);
  });

  it('leaves out a line above 0.48·fs for a whole block, and fades it out where it leaves the range', () => {
    // order 200 runs 3.3 → 13.3 kHz and passes 0.48·fs = 12 288 Hz at 3686.4 rpm, t = 3.582 s
    const high = { guide: { kind: 'order' as const, order: 200 }, ctx };
    const tc = (3686.4 - 1000) / 750;
    const from = Math.round(3.7 * FS);
    const iso = filterBlock(y, FS, [high], layout, from, N, { bandwidthHz: B, processing: 'isolate' });
    expect(iso.every((v) => v === 0)).toBe(true);
    const rem = filterBlock(y, FS, [high], layout, from, N, { bandwidthHz: B, processing: 'remove' });
    expect(Array.from(rem)).toEqual(Array.from(y.subarray(from)));
    // a tone on that order: isolated whole well before the edge, faded to nothing at it, nothing after
    const x = tone(N, FS, order(200), () => 0.02, 0);
    const a = Math.round((tc - 0.2) * FS);
    const out = filterBlock(x, FS, [high], layout, a, Math.round((tc + 0.1) * FS), { bandwidthHz: B, processing: 'isolate' });
    const at = (t: number) => Math.round((t - (tc - 0.2)) * FS);
    const peak = (t0: number, t1: number) => Math.max(...Array.from(out.subarray(at(t0), at(t1))).map(Math.abs));
    expect(Math.abs(dB(peak(tc - 0.15, tc - 0.1)) - dB(0.02))).toBeLessThan(0.5);
    expect(peak(tc - 0.0005, tc)).toBeLessThan(0.001);
    expect(peak(tc + 0.0005, tc + 0.1)).toBe(0);
  });

  it('does not throw at the signal ends, outside it, or for lines it cannot follow, and returns to − from samples', () => {
    const opts = { bandwidthHz: B, processing: 'remove' as const };
    const blind = { guide: { kind: 'family' as const, m: 1, n: 0, per: 'electrical' as const }, ctx: { rpm: frameRpm } }; // no carrier known
    const high = { guide: { kind: 'order' as const, order: 400 }, ctx }; // 6.7 → 27 kHz: above 0.48·fs from t = 1.12 s
    const lines = [L.o8, L.o8, blind, high, L.fm];
    for (const [from, to] of [[0, N], [0, 100], [N - 100, N], [-50, 30], [N - 30, N + 70], [N + 5, N + 9], [10, 10], [100.4, 200.6]]) {
      const out = filterBlock(y, FS, lines, layout, from, to, opts);
      expect(out.length).toBe(Math.round(to) - Math.round(from));
      expect(out.every(Number.isFinite)).toBe(true);
    }
    // samples outside the signal are silent
    const before = filterBlock(y, FS, [L.o8], layout, -50, 30, { bandwidthHz: B, processing: 'isolate' });
    expect(Array.from(before.subarray(0, 50)).every((v) => v === 0)).toBe(true);
    // a duplicated line counts once
    const once = filterBlock(y, FS, [L.o8], layout, 40_000, 41_000, { bandwidthHz: B, processing: 'isolate' });
    const twice = filterBlock(y, FS, [L.o8, L.o8], layout, 40_000, 41_000, { bandwidthHz: B, processing: 'isolate' });
    expect(Array.from(twice)).toEqual(Array.from(once));
  }, 20_000);
});
