import { createRequire } from 'node:module';
import { beforeAll, describe, expect, it } from 'vitest';
import { createRealFft } from '../../../workers/dsp/fft';
import { decimationFilter, doubleFourierAmplitude, simulateTwoLevelPwm } from '../../../workers/dsp/pwm-simulation';
import { scaleSpectrum } from '../../../workers/dsp/spectrum-scaling';
import { computeFrames, stftLayout } from '../../../workers/dsp/stft';
import { makeWindow } from '../../../workers/dsp/window';

// The reference Bessel functions come from the npm package `bessel` (1.0.2), not from our code. It ships no
// types, so it is loaded through require with the one signature we use. Its argument order is x first.
const bessel = createRequire(import.meta.url)('bessel') as { besselj(x: number, n: number): number };
const besselJ = (n: number, x: number) => bessel.besselj(x, n);

const db = (x: number) => 20 * Math.log10(x);

// Naturally sampled sine-triangle PWM, two-level, three-phase: H. S. Black, Modulation Theory (1953);
// D. G. Holmes & T. A. Lipo, Pulse Width Modulation for Power Converters (2003), ch. 3. The numbers
// below are the project's worked example for M = 0.8, Vdc = 1 [computed by the project's reference work
// with scipy.special.jv, and there checked against an exact Fourier integral over root-found edges].
const M = 0.8;
const VDC = 1;
const FC_HZ = 10_000;
const F0_HZ = 200;

describe('Bessel reference values (the bessel package, checked before use)', () => {
  it.each([
    [0, 0.4 * Math.PI, 0.642512],
    [1, 0.4 * Math.PI, 0.512191],
    [2, 0.4 * Math.PI, 0.172665],
    [1, 0.8 * Math.PI, 0.493784],
    [2, 0.8 * Math.PI, 0.447902],
  ])('J_%i(%f) = %f to 1e-6', (n, x, want) => {
    expect(Math.abs(besselJ(n, x) - want)).toBeLessThan(1e-6);
  });
});

describe('doubleFourierAmplitude (Black 1953; Holmes & Lipo 2003, ch. 3)', () => {
  // [m, n, leg A_mn (V), line-to-line (V)] for M = 0.8, Vdc = 1 [computed, see above]
  const table: [number, number, number, number][] = [
    [0, 1, 0.4, 0.69282],
    [1, 0, 0.409036, 0],
    [1, 2, 0.109922, 0.19039],
    [1, -2, 0.109922, 0.19039],
    [1, 4, 0.003818, 0.006613],
    [2, 1, 0.157176, 0.272238],
    [2, -1, 0.157176, 0.272238],
    [2, 3, 0.069733, 0],
    [2, 5, 0.006356, 0.011009],
    [3, 0, 0.085304, 0],
    [3, 2, 0.088127, 0.152641],
    [3, -4, 0.052223, 0.090453],
    [4, 1, 0.05259, 0.091089],
  ];
  it.each(table)('(m, n) = (%i, %i): leg %f V, line-to-line %f V, to 1e-6', (m, n, leg, ll) => {
    expect(Math.abs(doubleFourierAmplitude(m, n, M, VDC, besselJ, false) - leg)).toBeLessThan(1e-6);
    expect(Math.abs(doubleFourierAmplitude(m, n, M, VDC, besselJ, true) - ll)).toBeLessThan(1e-6);
  });

  it('is zero when m + n is even and in the baseband beyond the fundamental', () => {
    for (const [m, n] of [
      [1, 1],
      [1, -3],
      [2, 0],
      [2, 2],
      [0, 0],
      [0, 2],
      [0, 3],
    ]) {
      expect(doubleFourierAmplitude(m, n, M, VDC, besselJ, false)).toBe(0);
    }
  });
});

describe('decimationFilter (Kaiser-windowed sinc)', () => {
  it.each([2, 4, 16])('oversample %i: flat within 0.001 dB to 0.4·fs, at least 94 dB down from 0.6·fs to the internal Nyquist', (os) => {
    const h = decimationFilter(os);
    const half = (h.length - 1) / 2;
    // zero-phase response of the symmetric taps, f in cycles per internal sample
    const gain = (f: number) => {
      let s = 0;
      for (let j = 0; j < h.length; j++) s += h[j] * Math.cos(2 * Math.PI * f * (j - half));
      return Math.abs(s);
    };
    let pass = 0;
    for (let i = 0; i <= 400; i++) pass = Math.max(pass, Math.abs(db(gain(((0.4 / os) * i) / 400))));
    let stop = -Infinity;
    for (let i = 0; i <= 4000; i++) stop = Math.max(stop, db(gain(0.6 / os + ((0.5 - 0.6 / os) * i) / 4000)));
    expect(pass).toBeLessThan(0.001);
    expect(stop).toBeLessThan(-94);
  });
});

describe('simulateTwoLevelPwm against the double Fourier series', () => {
  // fs = 102.4 kHz and N = 16384 give 6.25 Hz bins: 200 Hz = 32 bins, 10 kHz = 1600 bins, and the record is
  // 32 whole fundamental periods (1600 carrier periods), so with the rectangular window every PWM line
  // sits on a bin without leakage. fs = 10·fc + 12·f0 also folds any alias of an (m, n) line onto an
  // (m', n') line of the same parity of m + n, right on the lines checked here, so the levels test the
  // anti-alias decimation as well.
  const FS_HZ = 102_400;
  const N = 16_384;
  const BIN_HZ = FS_HZ / N;
  let lineToLine: Float64Array;
  let leg: Float64Array;

  const peakSpectrum = async (x: Float32Array) => {
    const layout = stftLayout(x.length, FS_HZ, { blockSize: N, overlap: 0, window: 'rect' });
    const win = makeWindow('rect', N);
    const power = new Float32Array(layout.bins);
    computeFrames(x, 0, layout, win, await createRealFft(N), 0, 1, power);
    return scaleSpectrum(power, 'peak', win.enbwBins, layout.binHz);
  };
  const at = (spectrum: Float64Array, m: number, n: number) => {
    const bin = (m * FC_HZ + n * F0_HZ) / BIN_HZ;
    expect(Number.isInteger(bin)).toBe(true);
    return spectrum[bin];
  };

  beforeAll(async () => {
    const { vab, vaz } = simulateTwoLevelPwm({
      fsHz: FS_HZ,
      durationS: N / FS_HZ,
      carrierHz: FC_HZ,
      fundamentalHz: F0_HZ,
      modulationIndex: M,
      vdc: VDC,
    });
    expect(vab.length).toBe(N);
    lineToLine = await peakSpectrum(vab);
    leg = await peakSpectrum(vaz);
  });

  // line-to-line values of the worked table [computed]; each is also re-derived from the series here
  it.each([
    [0, 1, 0.69282],
    [1, 2, 0.19039],
    [1, -2, 0.19039],
    [1, 4, 0.006613],
    [1, -4, 0.006613],
    [2, 1, 0.272238],
    [2, -1, 0.272238],
    [2, 5, 0.011009],
    [2, -5, 0.011009],
  ])('v_ab line (%i, %i) is %f V within 0.3 dB', (m, n, want) => {
    expect(Math.abs(doubleFourierAmplitude(m, n, M, VDC, besselJ, true) - want)).toBeLessThan(1e-6);
    expect(Math.abs(db(at(lineToLine, m, n) / want))).toBeLessThan(0.3);
  });

  it.each([
    [1, 0],
    [2, 3],
    [2, -3],
  ])('v_ab line (%i, %i), common-mode in the series, is at least 30 dB below (1, ±2)', (m, n) => {
    const reference = Math.min(at(lineToLine, 1, 2), at(lineToLine, 1, -2));
    expect(db(at(lineToLine, m, n) / reference)).toBeLessThan(-30);
  });

  it('leg voltage v_az: the carrier line (1, 0) is 0.409036 V within 0.3 dB, the fundamental 0.4 V', () => {
    expect(Math.abs(db(at(leg, 1, 0) / 0.409036))).toBeLessThan(0.3);
    expect(Math.abs(db(at(leg, 0, 1) / 0.4))).toBeLessThan(0.3);
    // and v_az keeps the (2, ±3) family that v_ab loses: 0.069733 V
    expect(Math.abs(db(at(leg, 2, 3) / 0.069733))).toBeLessThan(0.3);
  });
});

describe('simulateTwoLevelPwm schedules and inputs', () => {
  const base = { fsHz: 51_200, durationS: 0.02, modulationIndex: 0.9, vdc: 400 };

  it('a constant frequency given as a schedule (trapezoidal phase) matches the closed form', () => {
    const closed = simulateTwoLevelPwm({ ...base, carrierHz: 8000, fundamentalHz: 150, phaseRad: 0.3 });
    const scheduled = simulateTwoLevelPwm({ ...base, carrierHz: () => 8000, fundamentalHz: () => 150, phaseRad: 0.3 });
    let worst = 0;
    for (let i = 0; i < closed.vab.length; i++) worst = Math.max(worst, Math.abs(closed.vab[i] - scheduled.vab[i]));
    expect(worst).toBeLessThan(1e-3); // V, on a 400 V link
  });

  it('follows a step of both schedules: the lines sit at the new fc and f0 with the series levels', async () => {
    // fc 6 → 12 kHz and f0 100 → 200 Hz at t = 50 ms; M = 0.8, Vdc = 1, so the leg levels are the worked
    // table's [computed]. Two 40 ms records (25 Hz bins, whole periods of f0 and fc) either side of the step.
    const fsHz = 51_200;
    const n = 2048;
    const { vaz } = simulateTwoLevelPwm({
      fsHz,
      durationS: 0.1,
      carrierHz: (t) => (t < 0.05 ? 6000 : 12_000),
      fundamentalHz: (t) => (t < 0.05 ? 100 : 200),
      modulationIndex: M,
      vdc: VDC,
    });
    const layout = stftLayout(n, fsHz, { blockSize: n, overlap: 0, window: 'rect' });
    const win = makeWindow('rect', n);
    const fft = await createRealFft(n);
    const records: [number, number, number][] = [
      [0, 6000, 100],
      [3072, 12_000, 200], // from t = 60 ms
    ];
    for (const [start, fcHz, f0Hz] of records) {
      const power = new Float32Array(layout.bins);
      computeFrames(vaz.subarray(start, start + n), 0, layout, win, fft, 0, 1, power);
      const peak = scaleSpectrum(power, 'peak', win.enbwBins, layout.binHz);
      const line = (m: number, k: number) => peak[(m * fcHz + k * f0Hz) / layout.binHz];
      expect(Math.abs(db(line(0, 1) / 0.4))).toBeLessThan(0.3);
      expect(Math.abs(db(line(1, 0) / 0.409036))).toBeLessThan(0.3);
      expect(Math.abs(db(line(1, 2) / 0.109922))).toBeLessThan(0.3);
      expect(Math.abs(db(line(1, -2) / 0.109922))).toBeLessThan(0.3);
    }
  });

  it('rejects a carrier at or above half the internal rate and a non-integer oversampling factor', () => {
    expect(() => simulateTwoLevelPwm({ ...base, carrierHz: 51_200 * 8, fundamentalHz: 50, oversample: 16 })).toThrow(RangeError);
    expect(() => simulateTwoLevelPwm({ ...base, carrierHz: 8000, fundamentalHz: 50, oversample: 2.5 })).toThrow(RangeError);
    expect(() => simulateTwoLevelPwm({ ...base, carrierHz: (t) => (t > 0.01 ? -1 : 8000), fundamentalHz: 50 })).toThrow(RangeError);
  });
});
