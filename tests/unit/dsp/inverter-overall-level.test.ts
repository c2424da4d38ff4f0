/**
 * The overall level the inverter report gives (and a campaign's results table shows): the RMS of the
 * channel over the run, from the map by Parseval's theorem for a windowed DFT (Harris, Proc. IEEE 66
 * (1978) §IV). Checked against the signal's own RMS: a sine of peak A in white noise of RMS σ has
 * RMS √(A²/2 + σ²); the level is 20·lg(RMS / 1 unit) (ISO 80000-3, level of a root-power quantity).
 */
import { describe, expect, it } from 'vitest';
import { analyseSignal } from '../../support/analyse-signal';

const FS = 51200;

function sineInNoise(a: number, sigma: number, seconds: number): Float32Array {
  let seed = 7;
  const uniform = () => ((seed = (seed * 1664525 + 1013904223) >>> 0) + 0.5) / 2 ** 32;
  const x = new Float32Array(seconds * FS);
  for (let i = 0; i < x.length; i++) {
    // Box–Muller normal deviates (Box & Muller 1958)
    const g = Math.sqrt(-2 * Math.log(uniform())) * Math.cos(2 * Math.PI * uniform());
    x[i] = a * Math.sin((2 * Math.PI * 1234.5 * i) / FS) + sigma * g;
  }
  return x;
}

describe('the overall level of the inverter report', () => {
  it('is the RMS of a sine in noise, √(A²/2 + σ²), within 0.1 dB', async () => {
    const x = sineInNoise(0.5, 0.1, 4);
    const { report } = await analyseSignal(x, FS, () => 3000);
    const expected = Math.sqrt(0.5 ** 2 / 2 + 0.1 ** 2);
    expect(Math.abs(20 * Math.log10(report.overallRms / expected))).toBeLessThan(0.1);
    expect(report.overallDb).toBeCloseTo(20 * Math.log10(report.overallRms), 3);
  });

  it('is null in dB for silence', async () => {
    const { report } = await analyseSignal(new Float32Array(2 * FS), FS, () => 3000);
    expect(report.overallRms).toBe(0);
    expect(report.overallDb).toBeNull();
  });
});
