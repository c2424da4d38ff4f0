/**
 * The Vold–Kalman filter (workers/dsp/vold-kalman.ts) on analytic cases whose answers are known exactly:
 * a component alone comes back with its amplitude and phase; two components whose frequencies cross come
 * back separated; the −3 dB points of one component's response sit at ±B/2 (the bandwidth relation of
 * Tůma, ICSV12 2005, for the two-pole filter); removing components leaves the rest. Signals are invented
 * for the tests; the checks are the filter's published properties (Vold & Leuridan, SAE 931288, 1993;
 * Vold, Mains & Blough, SAE 972007, 1997).
 */
import { describe, expect, it } from 'vitest';
import { phaseOf, voldKalman, voldKalmanWeight } from '../../../workers/dsp/vold-kalman';
import { snrDb } from '../../support/tones';

const FS = 25600;

/** Deterministic Gaussian noise (Box–Muller over a fixed LCG, Numerical Recipes constants). */
function noise(n: number, rms: number, seed = 1): Float32Array {
  let s = seed >>> 0;
  const u = () => ((s = (Math.imul(s, 1664525) + 1013904223) >>> 0) + 0.5) / 2 ** 32;
  const out = new Float32Array(n);
  for (let i = 0; i < n; i++) out[i] = rms * Math.sqrt(-2 * Math.log(u())) * Math.cos(2 * Math.PI * u());
  return out;
}

function component(freq: Float64Array, amplitude: (i: number) => number, phaseRad: number): Float32Array {
  const th = phaseOf(freq, FS);
  return Float32Array.from(th, (t, i) => amplitude(i) * Math.cos(t + phaseRad));
}

describe('voldKalmanWeight', () => {
  it('gives r = √(√2 − 1)/(2 − 2cos(πB/fs)) (Tůma 2005, two-pole filter)', () => {
    expect(voldKalmanWeight(10, FS)).toBeCloseTo(Math.sqrt(Math.SQRT2 - 1) / (2 - 2 * Math.cos((Math.PI * 10) / FS)), 9);
    expect(() => voldKalmanWeight(0, FS)).toThrow(RangeError);
  });
});

describe('voldKalman', () => {
  it('returns a component alone with its amplitude and phase, SNR ≥ 30 dB', () => {
    const n = FS * 2;
    const f = new Float64Array(n).fill(1234.5);
    const truth = component(f, () => 0.7, 0.9);
    const nz = noise(n, 0.05);
    const y = Float32Array.from(truth, (v, i) => v + nz[i]);
    const out = voldKalman(y, FS, [f], { bandwidthHz: 5 });
    const est = out.signal(0);
    const mid = n >> 1;
    expect(2 * Math.hypot(out.re[0][mid], out.im[0][mid])).toBeCloseTo(0.7, 2);
    expect(Math.atan2(out.im[0][mid], out.re[0][mid])).toBeCloseTo(0.9, 2);
    expect(snrDb(est, truth, FS / 4, n - FS / 4)).toBeGreaterThan(30);
  });

  it('separates two components whose frequencies cross: ≥ 12 dB within ±0.3 s of the crossing, ≥ 20 dB overall', () => {
    const T = 4;
    const n = FS * T;
    // an order sweeping 500 → 1500 Hz crosses a steady 1000 Hz line at t = 2 s
    const sweep = Float64Array.from({ length: n }, (_, i) => 500 + (1000 * i) / n);
    const steady = new Float64Array(n).fill(1000);
    const a = component(sweep, (i) => 0.5 + 0.2 * Math.sin((2 * Math.PI * i) / n), 0.3);
    const b = component(steady, () => 0.4, -1.1);
    const nz = noise(n, 0.02, 7);
    const y = Float32Array.from(a, (v, i) => v + b[i] + nz[i]);
    const out = voldKalman(y, FS, [sweep, steady], { bandwidthHz: 4 });
    const edge = Math.round(0.25 * FS);
    const cross = Math.round(2 * FS);
    const near = Math.round(0.3 * FS);
    for (const [k, truth] of [[0, a], [1, b]] as const) {
      const est = out.signal(k);
      expect(snrDb(est, truth, edge, n - edge)).toBeGreaterThan(20);
      expect(snrDb(est, truth, cross - near, cross + near)).toBeGreaterThan(12);
    }
  });

  it('puts the −3 dB points of one component at ±B/2 within 5 %', () => {
    const B = 8;
    const n = FS * 3;
    const f0 = 2000;
    const track = new Float64Array(n).fill(f0);
    const gain = (df: number) => {
      const y = component(new Float64Array(n).fill(f0 + df), () => 1, 0);
      const out = voldKalman(y, FS, [track], { bandwidthHz: B });
      // the steady-state envelope magnitude over the middle second, against the input's 1/2
      let s = 0;
      const from = FS;
      for (let i = from; i < 2 * FS; i++) s += Math.hypot(out.re[0][i], out.im[0][i]);
      return s / FS / 0.5;
    };
    // bisection for the offset where the gain is 1/√2
    let lo = 0;
    let hi = 2 * B;
    for (let it = 0; it < 30; it++) {
      const mid = (lo + hi) / 2;
      if (gain(mid) > Math.SQRT1_2) lo = mid;
      else hi = mid;
    }
    expect(Math.abs((lo + hi) / 2 - B / 2) / (B / 2)).toBeLessThan(0.05);
    expect(gain(0)).toBeCloseTo(1, 3);
  }, 60_000);

  it('removing two components leaves the rest', () => {
    const n = FS * 2;
    const f1 = new Float64Array(n).fill(800);
    const f2 = Float64Array.from({ length: n }, (_, i) => 3000 + (400 * i) / n);
    const rest = component(new Float64Array(n).fill(1900), () => 0.3, 0.2);
    const c1 = component(f1, () => 1, 0);
    const c2 = component(f2, () => 0.8, 1);
    const y = Float32Array.from(rest, (v, i) => v + c1[i] + c2[i]);
    const out = voldKalman(y, FS, [f1, f2], { bandwidthHz: 5 });
    const s1 = out.signal(0);
    const s2 = out.signal(1);
    const residual = Float32Array.from(y, (v, i) => v - s1[i] - s2[i]);
    expect(snrDb(residual, rest, FS / 4, n - FS / 4)).toBeGreaterThan(20);
  });

  it('solves long signals in blocks without seams (the same answer as one block, within 40 dB)', () => {
    const n = 150_000;
    const f = Float64Array.from({ length: n }, (_, i) => 700 + (300 * i) / n);
    const y = component(f, () => 0.5, 0.4);
    const whole = voldKalman(y, FS, [f], { bandwidthHz: 10, blockSamples: n }).signal(0);
    const blocks = voldKalman(y, FS, [f], { bandwidthHz: 10 }).signal(0);
    expect(snrDb(blocks, whole, 2000, n - 2000)).toBeGreaterThan(40);
  });
});
