/**
 * The inverter findings on synthetic run-ups whose answers are known by construction (the levels,
 * speeds and schedules below are invented for the tests). The structure they follow is published:
 * carrier families at m·fc + n·fe with the parity patterns of the double Fourier series (Holmes & Lipo
 * 2003, ch. 3) and of the radial force they drive; orders at k·fr.
 */
import { describe, expect, it } from 'vitest';
import { synthesiseDrive, type FamilyComponent } from '../../../seeds/synthetic-drive';
import { simulateTwoLevelPwm } from '../../../workers/dsp/pwm-simulation';
import { analyseSignal, type AnalysisExtras } from '../../support/analyse-signal';

const FS = 51200;
const db = (x: number) => 20 * Math.log10(x);

const analyse = (x: Float32Array, rpm: (t: number) => number, extra: AnalysisExtras = {}) => analyseSignal(x, FS, rpm, extra);

/** Every uncrossed point of a track within tol dB of the expected RMS. */
function expectTrack(t: { rms: number[]; crossing: boolean[] }, rms: number, tol = 0.5) {
  const ok = t.rms.filter((_, i) => !t.crossing[i]);
  expect(ok.length).toBeGreaterThan(t.rms.length / 2);
  for (const v of ok) expect(Math.abs(db(v) - db(rms))).toBeLessThan(tol);
}

describe('a run-up with a carrier schedule, measured by vibration (m + n even)', async () => {
  const T = 20;
  const rpm = (t: number) => 500 + (11500 * t) / T; // 500 → 12 000 rpm
  const carrier = (t: number) => (rpm(t) < 6000 ? 8000 : 12000); // steps at 6000 rpm
  const families: FamilyComponent[] = [
    { m: 1, n: 1, amplitude: 0.02 },
    { m: 1, n: -1, amplitude: 0.02 },
    { m: 1, n: 3, amplitude: 0.01 },
    { m: 1, n: -3, amplitude: 0.01 },
    { m: 2, n: 0, amplitude: 0.008 },
    { m: 2, n: 2, amplitude: 0.006 },
    { m: 2, n: -2, amplitude: 0.006 },
  ];
  const x = synthesiseDrive({
    fsHz: FS,
    durationS: T,
    rpm,
    polePairs: 4,
    carrierHz: carrier,
    orders: [
      { order: 8, amplitude: 0.05 },
      { order: 24, amplitude: 0.02 },
      { order: 48, amplitude: 0.03 },
    ],
    families,
    noiseRms: 0.002,
    seed: 3,
  });
  const { layout, report } = await analyse(x, rpm, { orders: [8, 24, 48] });

  it('follows the carrier within one bin, away from the step', () => {
    report.carrier.t.forEach((t, i) => {
      if (Math.abs(rpm(t) - 6000) < 400) return;
      expect(Math.abs(report.carrier.hz[i] - carrier(t))).toBeLessThanOrEqual(layout.binHz);
    });
  });

  it('finds the one carrier shift, 8 → 12 kHz, at 6000 rpm within 2 %', () => {
    expect(report.carrierShifts).toHaveLength(1);
    const [s] = report.carrierShifts;
    expect(Math.abs(s.rpm - 6000) / 6000).toBeLessThan(0.02);
    expect(Math.abs(s.fromHz - 8000)).toBeLessThanOrEqual(layout.binHz);
    expect(Math.abs(s.toHz - 12000)).toBeLessThanOrEqual(layout.binHz);
    expect(report.carrierSpreadHz).toBeNull();
  });

  it('infers 4 pole pairs and the force pattern m + n even from the sideband offsets', () => {
    expect(report.polePairs).toEqual({ value: 4, source: 'inferred', pattern: 'm+n even', ambiguous: false, settledByChannel: false });
  });

  it('tracks orders within 0.5 dB of A/√2, flagging where a family crosses', () => {
    expectTrack(report.orders[0], 0.05 / Math.SQRT2);
    expectTrack(report.orders[2], 0.03 / Math.SQRT2);
    expect(report.orders[2].crossing.some(Boolean)).toBe(true); // order 48 meets fc − 3fe on the way up
  });

  it('tracks the carrier families within 0.5 dB and ranks the strongest first', () => {
    for (const f of families) {
      const t = report.families.find((r) => r.m === f.m && r.n === f.n)!;
      expectTrack(t, (f.amplitude as number) / Math.SQRT2);
      expect(t.explained).toBe(true);
    }
    const top = report.strongestFamilies.slice(0, 2).map((f) => `${f.m}:${f.n}`).sort();
    expect(top).toEqual(['1:-1', '1:1']);
    // a family the pattern forbids is reported as not explained
    expect(report.families.find((r) => r.m === 1 && r.n === 2)!.explained).toBe(false);
  });
});

describe('one sideband pair only, fc ± 4fr: p = 4 with n = ±1 (force) or p = 2 with n = ±2 (voltage)', async () => {
  // Both readings are allowed by the patterns (m + n even for the force, m + n odd for the voltage:
  // Holmes & Lipo 2003, ch. 3, and the force table it leads to); the sidebands cannot tell them apart.
  const T = 12;
  const rpm = (t: number) => 1000 + (8000 * t) / T;
  const pair: FamilyComponent[] = [
    { m: 1, n: 1, amplitude: 0.02 },
    { m: 1, n: -1, amplitude: 0.02 },
  ];
  const drive = (families: FamilyComponent[], seed: number) =>
    synthesiseDrive({ fsHz: FS, durationS: T, rpm, polePairs: 4, carrierHz: () => 10000, families, orders: [], noiseRms: 0.002, seed });
  const x = drive(pair, 9);
  const alone = (await analyse(x, rpm)).report.polePairs;
  const vibration = (await analyse(x, rpm, { expectedPattern: 'm+n even' })).report.polePairs;
  const voltage = (await analyse(x, rpm, { expectedPattern: 'm+n odd' })).report.polePairs;

  it('says so when nothing else is known', () => {
    expect(alone.ambiguous).toBe(true);
    expect(alone.settledByChannel).toBe(false);
    expect([2, 4]).toContain(alone.value);
  });

  it('takes 4 on a vibration or sound channel (the force pattern), and says the channel chose it', () => {
    expect(vibration).toEqual({ value: 4, source: 'inferred', pattern: 'm+n even', ambiguous: false, settledByChannel: true });
  });

  it('takes 2 on a voltage channel (the inverter pattern)', () => {
    expect(voltage).toEqual({ value: 2, source: 'inferred', pattern: 'm+n odd', ambiguous: false, settledByChannel: true });
  });

  it('does not let the channel override sidebands that settle it on their own', async () => {
    const clear = drive(
      [
        ...pair,
        { m: 1, n: 3, amplitude: 0.01 },
        { m: 1, n: -3, amplitude: 0.01 },
        { m: 2, n: 2, amplitude: 0.01 },
        { m: 2, n: -2, amplitude: 0.01 },
      ],
      11,
    );
    const p = (await analyse(clear, rpm, { expectedPattern: 'm+n odd' })).report.polePairs;
    expect(p).toMatchObject({ value: 4, pattern: 'm+n even', ambiguous: false, settledByChannel: false });
  });
});

describe('a run-up measured on the phase current (m + n odd)', async () => {
  const T = 12;
  const rpm = (t: number) => 1000 + (8000 * t) / T;
  const families: FamilyComponent[] = [
    { m: 1, n: 2, amplitude: 0.02 },
    { m: 1, n: -2, amplitude: 0.02 },
    { m: 1, n: 4, amplitude: 0.006 },
    { m: 1, n: -4, amplitude: 0.006 },
    { m: 2, n: 1, amplitude: 0.015 },
    { m: 2, n: -1, amplitude: 0.015 },
  ];
  const x = synthesiseDrive({ fsHz: FS, durationS: T, rpm, polePairs: 3, carrierHz: () => 10000, families, orders: [{ order: 6, amplitude: 0.04 }], noiseRms: 0.002, seed: 5 });
  const { report } = await analyse(x, rpm);

  it('infers 3 pole pairs and the pattern m + n odd; no shift; the families within 0.5 dB', () => {
    expect(report.polePairs).toMatchObject({ value: 3, pattern: 'm+n odd', ambiguous: false });
    expect(report.carrierShifts).toEqual([]);
    for (const f of families) expectTrack(report.families.find((r) => r.m === f.m && r.n === f.n)!, (f.amplitude as number) / Math.SQRT2);
  });

  it('uses given pole pairs as given', async () => {
    const given = await analyse(x, rpm, { polePairs: 3 });
    expect(given.report.polePairs).toMatchObject({ value: 3, source: 'given', pattern: 'm+n odd' });
  });

  it('on a channel declared electrical, does not take the order-6 line (2fe) for the fundamental: the sidebands contradict p = 6', async () => {
    const declared = await analyse(x, rpm, { expectedPattern: 'm+n odd' });
    expect(declared.report.polePairs).toMatchObject({ value: 3, pattern: 'm+n odd', ambiguous: false });
  });
});

describe('a line-to-line voltage at one steady speed: the fundamental tells p from its divisors', async () => {
  // Three-phase two-level naturally sampled sine-triangle PWM (Holmes & Lipo 2003, ch. 3): carrier 4 kHz,
  // fundamental 60 Hz, modulation index 0.9, sampled at 102.4 kHz; 1800 rpm and 2 pole pairs. At one speed
  // the sideband offsets 2fe, 4fe, fe, 5fe are whole orders for p = 1 too; the line at fe = 2·fr is not.
  const fsHz = 102400;
  const { vab } = simulateTwoLevelPwm({ fsHz, durationS: 2, carrierHz: 4000, fundamentalHz: 60, modulationIndex: 0.9, vdc: 400, oversample: 4 });
  const rpm = () => 1800;
  const { report } = await analyseSignal(vab, fsHz, rpm, { expectedPattern: 'm+n odd' });

  it('finds the 4 kHz carrier, no shift and no spread', () => {
    for (const hz of report.carrier.hz) expect(Math.abs(hz - 4000)).toBeLessThanOrEqual(fsHz / 8192);
    expect(report.carrierShifts).toEqual([]);
    expect(report.carrierSpreadHz).toBeNull();
  });

  it('infers 2 pole pairs with the inverter pattern, unambiguously', () => {
    expect(report.polePairs).toEqual({ value: 2, source: 'inferred', pattern: 'm+n odd', ambiguous: false, settledByChannel: false });
  });

  it('at 5 pole pairs too, where the sidebands alone read 1; also with no quantity given, since the sidebands follow m + n odd', async () => {
    const five = simulateTwoLevelPwm({ fsHz: 51200, durationS: 2, carrierHz: 12000, fundamentalHz: 150, modulationIndex: 0.8, vdc: 400, oversample: 4 }).vab;
    for (const extra of [{ expectedPattern: 'm+n odd' as const }, {}]) {
      const p = (await analyseSignal(five, 51200, rpm, extra)).report.polePairs;
      expect(p).toMatchObject({ value: 5, pattern: 'm+n odd', ambiguous: false });
    }
  });

  it('marks the families of the inverter pattern as explained', () => {
    expect(report.families.find((f) => f.m === 1 && f.n === 2)!.explained).toBe(true);
    expect(report.families.find((f) => f.m === 2 && f.n === 1)!.explained).toBe(true);
    expect(report.families.find((f) => f.m === 1 && f.n === 1)!.explained).toBe(false);
  });
});

describe('the tonality of the carrier tones on a microphone (ECMA-418-1, ISO 389-7)', async () => {
  const T = 6;
  const rpm = (t: number) => 3000 + 200 * t;
  // sound pressure in Pa: the fc ± fe pair at 0.02 Pa peak (57.0 dB re 20 µPa each), white noise 2 mPa RMS
  const x = synthesiseDrive({
    fsHz: FS,
    durationS: T,
    rpm,
    polePairs: 4,
    carrierHz: () => 6000,
    families: [
      { m: 1, n: 1, amplitude: 0.02 },
      { m: 1, n: -1, amplitude: 0.02 },
    ],
    noiseRms: 0.002,
    seed: 13,
  });
  // one pair of sidebands alone cannot tell p = 4 (n = ±1) from p = 2 (n = ±2): the pole pairs are given
  const { report } = await analyse(x, rpm, { polePairs: 4 });

  it('judges the strongest tones at the given moment: level, prominence and audibility', async () => {
    expect(report.tonality.tones.length).toBeGreaterThan(0);
    const top = report.tonality.tones[0];
    expect(Math.abs(top.n)).toBe(1);
    expect(top.levelDb).toBeNull(); // not declared sound pressure
    expect(top.prominent).toBe(true);
    expect(top.tnrDb).toBeGreaterThan(8);
  });

  it('with the channel declared sound pressure, gives the level and its height above the threshold', async () => {
    const { report: sp } = await analyse(x, rpm, { polePairs: 4, soundPressure: true, tonalityAtS: 3 });
    const top = sp.tonality.tones[0];
    expect(sp.tonality.atS).toBe(3);
    // toDb(A²/2, 20 µPa) = 10·lg(0.0002 / 4e-10) = 56.99 dB (ISO 1683 reference)
    expect(Math.abs(top.levelDb! - 56.99)).toBeLessThan(0.5);
    // ISO 389-7 at 6 kHz: 4.3 dB
    const thresholdNear = 4.3;
    expect(Math.abs(top.aboveThresholdDb! - (top.levelDb! - thresholdNear))).toBeLessThan(1.5);
  });
});

describe('a spread carrier', async () => {
  const T = 8;
  const rpm = (t: number) => 2000 + 500 * t;
  const x = synthesiseDrive({
    fsHz: FS,
    durationS: T,
    rpm,
    polePairs: 4,
    carrierHz: () => 10000,
    spread: { widthHz: 1500 },
    families: [{ m: 1, n: 0, amplitude: 0.05 }],
    orders: [{ order: 8, amplitude: 0.04 }],
    noiseRms: 0.001,
    seed: 7,
  });
  const { report } = await analyse(x, rpm);

  it('is a hump, not a line: its width within 25 % (a triangle sweep over ±750 Hz)', () => {
    expect(report.carrierSpreadHz).not.toBeNull();
    expect(Math.abs(report.carrierSpreadHz! - 1500) / 1500).toBeLessThan(0.25);
    const hz = report.carrier.hz.filter(Number.isFinite);
    for (const h of hz) expect(Math.abs(h - 10000)).toBeLessThan(100);
  });

  it('says the pole pairs cannot be told from smeared sidebands, rather than guessing', () => {
    expect(report.polePairs).toMatchObject({ value: null, pattern: null });
  });

  it('does not guess them either when the channel names its pattern (a force-driven vibration)', async () => {
    const { report: vibration } = await analyse(x, rpm, { expectedPattern: 'm+n even' });
    expect(vibration.polePairs).toMatchObject({ value: null, pattern: null });
  });
});

describe('the usual carriers (common practice: 2.5, 5, 8, 10 and 16 kHz), with sidebands spreading as speed rises', () => {
  // up to 3600 rpm with 4 pole pairs: fe ≤ 240 Hz, so even 2.5 kHz keeps the usual pulse ratio fc/fe ≥ 10
  it.each([2500, 5000, 8000, 10000, 16000])('finds a %i Hz carrier', async (fc) => {
    const rpm = (t: number) => 600 + 750 * t;
    const x = synthesiseDrive({
      fsHz: FS,
      durationS: 4,
      rpm,
      polePairs: 4,
      carrierHz: () => fc,
      families: [
        { m: 1, n: 2, amplitude: 0.02 },
        { m: 1, n: -2, amplitude: 0.02 },
        { m: 2, n: 1, amplitude: 0.01 },
        { m: 2, n: -1, amplitude: 0.01 },
      ],
      orders: [{ order: 8, amplitude: 0.03 }, { order: 16, amplitude: 0.02 }],
      noiseRms: 0.002,
      seed: fc,
    });
    const { layout, report } = await analyse(x, rpm);
    const hz = report.carrier.hz.filter(Number.isFinite);
    expect(hz.length).toBeGreaterThan(report.carrier.hz.length * 0.8);
    for (const h of hz) expect(Math.abs(h - fc)).toBeLessThanOrEqual(layout.binHz);
  });
});
