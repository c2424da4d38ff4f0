/**
 * Maps as levels: the WASM kernel's decibels() (kernels/frame-power.wat, ln by the series of Abramowitz &
 * Stegun 4.1.27) and computeFrames(…, decibels) against 10·lg(P) computed with Math.log10 (the definition
 * of a power level, IEC 60027-3), and the 1e−30 floor.
 */
import { describe, expect, it } from 'vitest';
import { createRealFft } from '../../../workers/dsp/fft';
import { POWER_FLOOR, powerToDecibels } from '../../../workers/dsp/decibels';
import { computeFrames, stftLayout } from '../../../workers/dsp/stft';
import { makeWindow } from '../../../workers/dsp/window';

function noisyTone(n: number): Float32Array {
  const x = new Float32Array(n);
  let s = 7;
  for (let i = 0; i < n; i++) {
    s = (s * 1664525 + 1013904223) >>> 0;
    x[i] = 0.5 * Math.sin((2 * Math.PI * 1000 * i) / 51200) + 1e-3 * (s / 2 ** 32 - 0.5);
  }
  return x;
}

describe('power to decibels', () => {
  it('powerToDecibels is 10·lg(P), floored at 1e−30 (−300 dB)', () => {
    const p = Float32Array.from([1, 10, 0.5, 2e-5 ** 2, 0, -1]);
    powerToDecibels(p);
    expect(Array.from(p.subarray(0, 4))).toEqual([0, 10, 10 * Math.log10(0.5), 10 * Math.log10(2e-5 ** 2)].map((v) => Math.fround(v)));
    expect(p[4]).toBeCloseTo(10 * Math.log10(POWER_FLOOR), 4);
    expect(p[5]).toBeCloseTo(-300, 4);
  });

  it('the kernel route of a Hann map in dB agrees with 10·lg of the power map within 1e−4 dB, every bin', async () => {
    const fft = await createRealFft(4096);
    expect(fft.readout).toBe('wasm-kernel');
    const x = noisyTone(51200 * 2);
    const layout = stftLayout(x.length, 51200, { window: 'hann', blockSize: 4096, overlap: 0.75 });
    const win = makeWindow('hann', 4096);
    const power = new Float32Array(layout.frames * layout.bins);
    const levels = new Float32Array(layout.frames * layout.bins);
    computeFrames(x, 0, layout, win, fft, 0, layout.frames, power);
    computeFrames(x, 0, layout, win, fft, 0, layout.frames, levels, true);
    let worst = 0;
    for (let i = 0; i < power.length; i++) worst = Math.max(worst, Math.abs(levels[i] - 10 * Math.log10(Math.max(power[i], POWER_FLOOR))));
    expect(worst).toBeLessThan(1e-4);
  });

  it('the kernel floors zero power (digital silence) at −300 dB', async () => {
    const fft = await createRealFft(1024);
    const x = new Float32Array(4096);
    const layout = stftLayout(x.length, 51200, { window: 'hann', blockSize: 1024, overlap: 0.5 });
    const levels = new Float32Array(layout.frames * layout.bins);
    computeFrames(x, 0, layout, makeWindow('hann', 1024), fft, 0, layout.frames, levels, true);
    for (const v of levels) expect(v).toBeCloseTo(-300, 3);
  });
});
