/**
 * Quadratic interpolation of a spectral peak (Smith & Serra 1987; Smith, Spectral Audio Signal
 * Processing, 2011 [from memory]): a Hann-windowed sine between bins is located far closer than the
 * nearest bin. The bound below is our own measurement's margin, not a published figure: the parabola
 * through the dB values of a Hann main lobe is off by a few hundredths of a bin at most.
 */
import { describe, expect, it } from 'vitest';
import { createRealFft } from '../../../workers/dsp/fft';
import { interpolatePeak, peakNear } from '../../../workers/dsp/peak';
import { makeWindow } from '../../../workers/dsp/window';

const N = 4096;

async function hannPower(binOfSine: number, amplitude = 1) {
  const win = makeWindow('hann', N);
  const x = Float32Array.from({ length: N }, (_, n) => amplitude * Math.cos((2 * Math.PI * binOfSine * n) / N) * win.w[n]);
  const power = new Float64Array(N / 2 + 1);
  (await createRealFft(N, 'fft.js')).power(x, power);
  return power;
}

describe('spectral peak interpolation', () => {
  for (const offset of [0, 0.13, 0.25, 0.5, 0.71, 0.9]) {
    it(`finds a Hann-windowed sine at bin 300 + ${offset} within 0.05 bins`, async () => {
      const power = await hannPower(300 + offset);
      const peak = peakNear(power, 296, 8)!; // a lone sine: the window's median is its sidelobes
      expect(Math.abs(peak.bin - (300 + offset))).toBeLessThan(0.05);
    });
  }

  it('reads the level at the vertex within 0.4 dB of the true peak (the scalloping loss of Hann at half a bin is 1.42 dB: Harris 1978, Table 1)', async () => {
    const atBin = await hannPower(300);
    const between = await hannPower(300.5);
    const truePeak = interpolatePeak(atBin, 300).db;
    expect(10 * Math.log10(between[300])).toBeLessThan(truePeak - 1.3); // what the nearest bin would say
    expect(Math.abs(peakNear(between, 300, 4)!.db - truePeak)).toBeLessThan(0.4);
  });

  it('takes the line nearest the click, not the strongest, and none where no line stands out', async () => {
    const strong = await hannPower(300.2, 1);
    const weak = await hannPower(340.6, 0.05);
    const noise = Float64Array.from({ length: N / 2 + 1 }, (_, k) => 1e-6 * (1 + 0.5 * Math.sin(k * 1.7)));
    const both = strong.map((v, k) => v + weak[k] + noise[k]);
    expect(Math.abs(peakNear(both, 335, 60)!.bin - 340.6)).toBeLessThan(0.05);
    expect(Math.abs(peakNear(both, 310, 60)!.bin - 300.2)).toBeLessThan(0.05);
    expect(peakNear(both, 100, 20)).toBeNull(); // only the noise floor there
    expect(peakNear(new Float64Array(10), 5, 3)).toBeNull();
    expect(interpolatePeak(both, 0).bin).toBe(0);
  });
});
