import { describe, expect, it } from 'vitest';
import {
  electricalHz,
  rpmAt,
  rpmAtTimes,
  shaftHz,
  SpeedError,
  speedFromChannel,
  speedFromPulses,
  speedFromRamp,
  speedFromTacho,
  tachoPulseTimes,
  type SpeedCurve,
} from '../../../workers/dsp/speed';

const FS = 51_200;
const PPR = 60;

/** Seeded PRNG (mulberry32) with Box–Muller normals, so the noisy signals are the same on every run. */
function gaussian(seed: number): () => number {
  let a = seed >>> 0;
  const uniform = () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  return () => Math.sqrt(-2 * Math.log(1 - uniform())) * Math.cos(2 * Math.PI * uniform());
}

/** A linear speed ramp rpm(t) = rpm0 + rate·t and its shaft angle in revolutions, ∫rpm/60 dt in closed form. */
interface Ramp {
  rpm0: number;
  rpmPerS: number;
}
const rpmOf = (r: Ramp, t: number) => r.rpm0 + r.rpmPerS * t;
const revsOf = (r: Ramp, t: number) => (r.rpm0 * t + 0.5 * r.rpmPerS * t * t) / 60;

/** Exact time of pulse n (shaft angle n/ppr rev), the root of revsOf(t) = n/ppr that comes first. */
function exactPulseTime(r: Ramp, n: number, ppr: number): number {
  const c = (60 * n) / ppr;
  if (r.rpmPerS === 0) return c / r.rpm0;
  return (-r.rpm0 + Math.sqrt(r.rpm0 * r.rpm0 + 2 * r.rpmPerS * c)) / r.rpmPerS;
}

function exactPulses(r: Ramp, ppr: number, durationS: number): number[] {
  const out: number[] = [];
  for (let n = 1; ; n++) {
    const t = exactPulseTime(r, n, ppr);
    if (!(t < durationS)) return out;
    out.push(t);
  }
}

/** A square-ish tacho (rounded edges, rising edge at every pulse angle) with a little noise. */
function tachoSignal(r: Ramp, durationS: number, ppr: number, noise: number, seed = 1): Float32Array {
  const n = Math.round(durationS * FS);
  const x = new Float32Array(n);
  const g = gaussian(seed);
  for (let k = 0; k < n; k++) {
    const phase = 2 * Math.PI * ppr * revsOf(r, k / FS);
    x[k] = Math.tanh(3 * Math.sin(phase)) + noise * g();
  }
  return x;
}

function maxRelativeError(curve: SpeedCurve, trueRpm: (t: number) => number): number {
  let worst = 0;
  for (let i = 0; i < curve.tS.length; i++) {
    const truth = trueRpm(curve.tS[i]);
    worst = Math.max(worst, Math.abs(curve.rpm[i] - truth) / truth);
  }
  return worst;
}

describe('pulse rate', () => {
  it('60 ppr at 3000 rpm is 3000 pulses per second, 333.33 µs apart', () => {
    // Pulse rate = ppr·rpm/60 (Brandt 2011, order-tracking chapter [from memory]; references.md §9).
    const pulses = Float64Array.from({ length: 301 }, (_, i) => i / 3000);
    const curve = speedFromPulses(pulses, PPR, { smoothRevs: 0 });
    expect(pulses[1] - pulses[0]).toBeCloseTo(333.33e-6, 8);
    for (const rpm of curve.rpm) expect(rpm).toBeCloseTo(3000, 6);
    expect(shaftHz(3000)).toBe(50);
    expect(electricalHz(3000, 4)).toBe(200);
  });
});

describe('tachoPulseTimes', () => {
  it('a sine tacho at 3000 rpm, 60 ppr, 51.2 kHz, hysteresis 0.2: interpolated crossings are within 0.01 % per pulse', () => {
    // Check value references.md §9 [C] (0.007 % per pulse); method: Schmitt trigger with linear
    // interpolation of the crossing (Brandt 2011, order-tracking chapter [from memory]).
    for (const phase0 of [0, 0.3, 1.7, 4]) {
      const n = FS / 4;
      const x = new Float32Array(n);
      for (let k = 0; k < n; k++) x[k] = Math.sin(2 * Math.PI * 3000 * (k / FS) + phase0);
      const t = tachoPulseTimes(x, FS, { triggerLevel: 0, hysteresis: 0.2 });
      expect(t.length).toBeGreaterThan(740);
      const firstN = Math.round(t[0] * 3000 + phase0 / (2 * Math.PI));
      let worstInterval = 0;
      for (let i = 0; i < t.length; i++) {
        const exact = (firstN + i - phase0 / (2 * Math.PI)) / 3000;
        // Each crossing itself is within 2e-4 of a period (about 0.002 of a sample).
        expect(Math.abs(t[i] - exact) * 3000).toBeLessThan(2e-4);
        if (i > 0) worstInterval = Math.max(worstInterval, Math.abs((t[i] - t[i - 1]) * 3000 - 1));
      }
      expect(worstInterval).toBeLessThan(1e-4);
      const raw = speedFromPulses(t, PPR, { smoothRevs: 0 });
      expect(maxRelativeError(raw, () => 3000)).toBeLessThan(1e-4);
      // One-revolution average within 1e-4 rpm (references.md §9 [C]).
      const rev = speedFromPulses(t, PPR);
      for (const rpm of rev.rpm) expect(Math.abs(rpm - 3000)).toBeLessThan(1e-4);
    }
  });

  it('fires once per pulse despite noise on the edges (hysteresis)', () => {
    // Schmitt trigger (common practice): noise around the level must not double-trigger. The edge at
    // t = 0 is not counted (the trigger has not armed yet), so 0.4 s at 25 rev/s gives 600 − 1 pulses.
    const x = tachoSignal({ rpm0: 1500, rpmPerS: 0 }, 0.4, PPR, 0.05, 7);
    expect(tachoPulseTimes(x, FS).length).toBe(0.4 * 25 * PPR - 1);
  });

  it('takes falling edges of an inverted channel at the same times as rising edges', () => {
    const x = tachoSignal({ rpm0: 900, rpmPerS: 300 }, 0.5, PPR, 0);
    const inverted = x.map((v) => 2.5 - 2.5 * v);
    const rising = tachoPulseTimes(x, FS);
    const falling = tachoPulseTimes(inverted, FS, { slope: 'falling' });
    expect(falling.length).toBe(rising.length);
    for (let i = 0; i < rising.length; i++) expect(falling[i]).toBeCloseTo(rising[i], 7);
  });

  it('finds the default level of a 0–5 V pulse train from the 1st and 99th percentile, on a long signal too', () => {
    // The strided estimate must not depend on reading every sample of a long recording.
    const n = 1_500_000;
    const x = new Float32Array(n);
    for (let k = 0; k < n; k++) x[k] = k % 40 < 10 ? 5 : 0;
    const t = tachoPulseTimes(x, FS);
    expect(t.length).toBe(n / 40 - 1);
    // The upward crossing of 2.5 V lies halfway between the 0 V and 5 V samples.
    expect(t[0] * FS).toBeCloseTo(39.5, 9);
  });
});

describe('speedFromTacho', () => {
  const runUp: Ramp = { rpm0: 600, rpmPerS: 1200 };
  const coastDown: Ramp = { rpm0: 3000, rpmPerS: -1200 };

  it('reads a 600 → 3000 rpm run-up over 2 s within 0.1 %', () => {
    // Truth: rpm(t) = 600 + 1200·t; a revolution-average on a linear ramp equals the speed at the
    // window's mid-time exactly (mean of a linear function), so no lag correction is needed.
    // Method: Brandt 2011, order-tracking chapter [from memory]; references.md §9 steps 1–3 and 5.
    const x = tachoSignal(runUp, 2, PPR, 0.01);
    const curve = speedFromTacho(x, FS, PPR);
    expect(curve.tS.length).toBeGreaterThan(3400);
    expect(maxRelativeError(curve, (t) => rpmOf(runUp, t))).toBeLessThan(1e-3);
    for (let i = 1; i < curve.tS.length; i++) expect(curve.tS[i]).toBeGreaterThan(curve.tS[i - 1]);
    expect(curve.rpm[0]).toBeLessThan(700);
    expect(curve.rpm[curve.rpm.length - 1]).toBeGreaterThan(2900);
    // Raw per-pulse rates are rougher: a straight line between two samples misplaces a crossing of this
    // rounded edge by a few hundredths of a sample, and at 3000 rpm a pulse is only 17 samples long
    // (about 0.4 % measured); the one-revolution window is 60 times longer.
    const raw = speedFromTacho(x, FS, PPR, { smoothRevs: 0 });
    expect(raw.tS.length).toBeGreaterThan(3500);
    expect(maxRelativeError(raw, (t) => rpmOf(runUp, t))).toBeLessThan(1e-2);
  });

  it('reads a 3000 → 600 rpm coast-down over 2 s within 0.1 %', () => {
    const x = tachoSignal(coastDown, 2, PPR, 0.01, 3);
    const curve = speedFromTacho(x, FS, PPR);
    expect(maxRelativeError(curve, (t) => rpmOf(coastDown, t))).toBeLessThan(1e-3);
    expect(curve.rpm[0]).toBeGreaterThan(2900);
    expect(curve.rpm[curve.rpm.length - 1]).toBeLessThan(700);
  });

  it('throws a SpeedError naming the count and the level when there are fewer than 2 pulses', () => {
    const flat = new Float32Array(1000).fill(0.5);
    expect(() => speedFromTacho(flat, FS, PPR)).toThrow(SpeedError);
    expect(() => speedFromTacho(flat, FS, PPR)).toThrow(
      'Found 0 tacho pulses at trigger level 0.5: the tacho channel needs at least 2; check the channel, the trigger level and the hysteresis.',
    );
    const one = new Float32Array(1000);
    for (let k = 500; k < 600; k++) one[k] = 5;
    try {
      speedFromTacho(one, FS, PPR, { triggerLevel: 2.5, hysteresis: 0.5 });
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(SpeedError);
      expect((e as SpeedError).code).toBe('TOO_FEW_PULSES');
      expect((e as SpeedError).message).toBe(
        'Found 1 tacho pulse at trigger level 2.5: the tacho channel needs at least 2; check the channel, the trigger level and the hysteresis.',
      );
    }
    expect(() => speedFromPulses(new Float64Array([0.1]), PPR)).toThrow(/^Found 1 tacho pulse: the tacho channel needs at least 2/);
  });
});

describe('speedFromPulses', () => {
  const runUp: Ramp = { rpm0: 600, rpmPerS: 1200 };

  it('drops a missed pulse and a spurious pulse: the curve stays within 0.1 %', () => {
    // Median-based interval rejection (common practice; Brandt 2011, order-tracking chapter [from memory]).
    const exact = exactPulses(runUp, PPR, 2);
    const missedAt = 1000;
    const spuriousAfter = 2500;
    const spurious = exact[spuriousAfter] + 0.3 * (exact[spuriousAfter + 1] - exact[spuriousAfter]);
    const damaged = [...exact.slice(0, missedAt), ...exact.slice(missedAt + 1)];
    damaged.splice(spuriousAfter, 0, spurious);
    damaged.sort((a, b) => a - b);
    const pulses = Float64Array.from(damaged);
    const truth = (t: number) => rpmOf(runUp, t);

    for (const smoothRevs of [0, 1, 2]) {
      const curve = speedFromPulses(pulses, PPR, { smoothRevs });
      expect(maxRelativeError(curve, truth)).toBeLessThan(1e-3);
      // No point is missing except the two windows that start or end on the missed pulse.
      const span = Math.max(1, smoothRevs * PPR);
      expect(curve.tS.length).toBe(exact.length - span - 2);
    }
    // Without rejection the damage shows (a halved and a split interval), so the check above has teeth.
    expect(maxRelativeError(speedFromPulses(pulses, PPR, { smoothRevs: 0, rejectOutliers: false }), truth)).toBeGreaterThan(0.4);
    expect(maxRelativeError(speedFromPulses(pulses, PPR, { rejectOutliers: false }), truth)).toBeGreaterThan(0.01);
  });

  it('judges a one-pulse-per-revolution tacho against ±5 neighbours', () => {
    // With ppr = 1 the neighbour window is widened to ±5 intervals so the median stays robust.
    const ramp: Ramp = { rpm0: 1200, rpmPerS: 60 };
    const exact = exactPulses(ramp, 1, 30);
    const damaged = exact.filter((_, i) => i !== 200);
    damaged.push(exact[400] + 0.2 * (exact[401] - exact[400]));
    damaged.sort((a, b) => a - b);
    const curve = speedFromPulses(Float64Array.from(damaged), 1);
    expect(curve.tS.length).toBe(exact.length - 3);
    expect(maxRelativeError(curve, (t) => rpmOf(ramp, t))).toBeLessThan(1e-9);
  });

  it('rejects outliers in pulses read from a signal with a missed tooth and a glitch', () => {
    const x = tachoSignal(runUp, 2, PPR, 0.01, 11);
    const exact = exactPulses(runUp, PPR, 2);
    // Hold the signal low from the falling edge before pulse 1800 to the one after it (a missed tooth),
    // and add a two-sample spike (a spurious pulse) 0.6 of the way between two others.
    const k0 = Math.floor((exact[1799] + 0.5 * (exact[1800] - exact[1799])) * FS);
    const k1 = Math.ceil((exact[1800] + 0.5 * (exact[1801] - exact[1800])) * FS);
    for (let k = k0; k <= k1; k++) x[k] = -1;
    const spike = Math.round((exact[3000] + 0.6 * (exact[3001] - exact[3000])) * FS);
    x[spike] = 1;
    x[spike + 1] = 1;
    const curve = speedFromTacho(x, FS, PPR);
    expect(maxRelativeError(curve, (t) => rpmOf(runUp, t))).toBeLessThan(1e-3);
    // Per-pulse rates keep the edge-interpolation roughness of the clean run-up (see there), no more.
    const raw = speedFromTacho(x, FS, PPR, { smoothRevs: 0 });
    expect(maxRelativeError(raw, (t) => rpmOf(runUp, t))).toBeLessThan(1e-2);
    expect(maxRelativeError(speedFromTacho(x, FS, PPR, { rejectOutliers: false }), (t) => rpmOf(runUp, t))).toBeGreaterThan(1e-2);
  });

  it('the one-revolution average cancels encoder spacing errors that per-pulse rates show', () => {
    // Teeth displaced by up to ±0.5 % of a pitch, the same on every revolution, at a steady 1800 rpm:
    // the pitch angles of a revolution still add up to 360° (Brandt 2011, order-tracking chapter [from memory]).
    const g = gaussian(5);
    const offset = Array.from({ length: PPR }, () => 0.005 * Math.max(-1, Math.min(1, g())));
    const revPerS = 30;
    const pulses = Float64Array.from({ length: 40 * PPR }, (_, n) => (n + offset[n % PPR]) / PPR / revPerS);
    const raw = speedFromPulses(pulses, PPR, { smoothRevs: 0 });
    const rev = speedFromPulses(pulses, PPR);
    expect(maxRelativeError(raw, () => 1800)).toBeGreaterThan(2e-3);
    expect(maxRelativeError(rev, () => 1800)).toBeLessThan(1e-12);
  });

  it('falls back to per-pulse rates when the record is shorter than the averaging window', () => {
    const pulses = Float64Array.from({ length: 20 }, (_, i) => i / 3000);
    const curve = speedFromPulses(pulses, PPR);
    expect(curve.tS.length).toBe(19);
    expect(curve.rpm[0]).toBeCloseTo(3000, 6);
  });
});

describe('speedFromChannel', () => {
  it('reads a 0.001 V/rpm speed channel with noise back within 0.5 %', () => {
    // rpm = K·u with K = 1000 rpm/V (transducer scaling, common practice); truth from the linear ramp.
    const ramp: Ramp = { rpm0: 600, rpmPerS: 1200 };
    const n = 2 * FS;
    const g = gaussian(9);
    const u = new Float32Array(n);
    for (let k = 0; k < n; k++) u[k] = 0.001 * rpmOf(ramp, k / FS) + 0.02 * g();
    const curve = speedFromChannel(u, FS, 1000);
    expect(curve.tS.length).toBe(200);
    expect(curve.tS[0]).toBeCloseTo(255.5 / FS, 12);
    expect(maxRelativeError(curve, (t) => rpmOf(ramp, t))).toBeLessThan(5e-3);
    expect(speedFromChannel(u, FS, 1000, { decimateTo: 10 }).tS.length).toBe(20);
  });
});

describe('speedFromRamp and rpmAt', () => {
  const points = [
    { tS: 1.5, rpm: 3000 },
    { tS: 0.5, rpm: 1000 },
  ];

  it('is piecewise linear between the points and flat outside them', () => {
    const curve = speedFromRamp(points, 2);
    expect(curve.tS.length).toBe(201);
    expect(curve.tS[200]).toBeCloseTo(2, 12);
    expect(curve.rpm[0]).toBe(1000);
    expect(curve.rpm[30]).toBe(1000);
    expect(curve.rpm[100]).toBeCloseTo(2000, 9);
    expect(curve.rpm[125]).toBeCloseTo(2500, 9);
    expect(curve.rpm[200]).toBe(3000);
    const odd = speedFromRamp(points, 1.005, 0.1);
    expect(odd.tS[odd.tS.length - 1]).toBe(1.005);
    expect(odd.tS.length).toBe(12);
    expect(() => speedFromRamp([], 1)).toThrow(SpeedError);
  });

  it('interpolates a curve at one time and at many, held at the ends', () => {
    const curve: SpeedCurve = { tS: new Float64Array([0, 1, 2, 4]), rpm: new Float64Array([100, 200, 400, 0]) };
    expect(rpmAt(curve, -1)).toBe(100);
    expect(rpmAt(curve, 0.25)).toBeCloseTo(125, 12);
    expect(rpmAt(curve, 1)).toBe(200);
    expect(rpmAt(curve, 3)).toBeCloseTo(200, 12);
    expect(rpmAt(curve, 9)).toBe(0);
    const times = new Float64Array([-1, 0, 0.5, 1, 1.5, 2, 3.5, 4, 5]);
    const expected = [100, 100, 150, 200, 300, 400, 100, 0, 0];
    const got = rpmAtTimes(curve, times);
    expected.forEach((v, i) => expect(got[i]).toBeCloseTo(v, 12));
    // Times that go backwards still get the right values.
    const back = rpmAtTimes(curve, new Float64Array([3.5, 0.5, 1.5]));
    expect(Array.from(back)).toEqual([100, 150, 300]);
    expect(rpmAt({ tS: new Float64Array(0), rpm: new Float64Array(0) }, 1)).toBeNaN();
  });
});
