import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { PROJECT_ROOT } from '../../../server/config';
import { createRealFft } from '../../../workers/dsp/fft';
import { scaleSpectrum } from '../../../workers/dsp/spectrum-scaling';
import { averageFrames, computeFrames, frameTimeS, stftLayout } from '../../../workers/dsp/stft';
import { makeWindow, type WindowName } from '../../../workers/dsp/window';

interface Fixture {
  generator: string;
  fsHz: number;
  signal: string;
  cases: {
    window: WindowName;
    blockSize: number;
    overlap: number;
    frames: number;
    bins: number;
    timesS: number[];
    spectrogram: string;
    welchDensity: string;
    welchSpectrum: string;
  }[];
}

const f32 = (b64: string) => {
  const bytes = Buffer.from(b64, 'base64');
  return new Float32Array(bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength));
};
// Made by tests/fixtures/spectral/make_scipy_fixtures.py with Debian's python3-scipy (see the file's generator field).
const fixture = JSON.parse(readFileSync(path.join(PROJECT_ROOT, 'tests/fixtures/spectral/scipy-spectra.json'), 'utf8')) as Fixture;
const db = (x: number) => 10 * Math.log10(x);

async function map(x: Float32Array, fsHz: number, window: WindowName, blockSize: number, overlap: number) {
  const layout = stftLayout(x.length, fsHz, { window, blockSize, overlap });
  const win = makeWindow(window, blockSize);
  const out = new Float32Array(layout.frames * layout.bins);
  computeFrames(x, 0, layout, win, await createRealFft(blockSize), 0, layout.frames, out);
  return { layout, win, out };
}

describe('short-time spectra against scipy.signal', () => {
  const x = f32(fixture.signal);

  it.each(fixture.cases.map((c) => [c.window, c.blockSize, c.overlap, c] as const))(
    '%s window, N = %i, overlap %s: spectrogram(scaling="spectrum") and welch within 0.01 dB',
    async (_w, _n, _o, c) => {
      const { layout, win, out } = await map(x, fixture.fsHz, c.window, c.blockSize, c.overlap);
      expect(layout.frames).toBe(c.frames);
      expect(layout.bins).toBe(c.bins);
      for (let i = 0; i < c.frames; i += 7) expect(frameTimeS(layout, i)).toBeCloseTo(c.timesS[i], 9);
      const ref = f32(c.spectrogram);
      let worst = 0;
      for (let i = 0; i < ref.length; i++) worst = Math.max(worst, Math.abs(db(out[i]) - db(ref[i])));
      expect(worst).toBeLessThan(0.01);
      const avg = averageFrames(out, layout.bins, 0, layout.frames);
      const density = scaleSpectrum(avg, 'psd', win.enbwBins, layout.binHz);
      const welchD = f32(c.welchDensity);
      const welchS = f32(c.welchSpectrum);
      for (let k = 0; k < layout.bins; k++) {
        expect(Math.abs(db(density[k]) - db(welchD[k]))).toBeLessThan(0.01);
        expect(Math.abs(db(avg[k]) - db(welchS[k]))).toBeLessThan(0.01);
      }
    },
  );
});

describe('amplitude scaling (Harris 1978: coherent gain and noise bandwidth applied)', () => {
  const fs = 51200;

  it('a sine anywhere between two bins reads its amplitude within 0.05 dB with the flat-top window', async () => {
    const n = 8192;
    const binHz = fs / n;
    for (const offset of [0, 0.13, 0.25, 0.37, 0.5]) {
      const f = (1000 + offset) * binHz;
      const x = Float32Array.from({ length: n }, (_, i) => 2.5 * Math.sin((2 * Math.PI * f * i) / fs + 0.3));
      const { win, out } = await map(x, fs, 'flattop', n, 0);
      const peak = scaleSpectrum(out.subarray(0, n / 2 + 1), 'peak', win.enbwBins, binHz);
      let best = 0;
      for (let k = 990; k < 1010; k++) best = Math.max(best, peak[k]);
      expect(Math.abs(20 * Math.log10(best / 2.5))).toBeLessThan(0.05);
    }
  });

  it('a bin-centred sine reads A peak and A/√2 RMS with every window', async () => {
    const n = 4096;
    const x = Float32Array.from({ length: n }, (_, i) => 0.8 * Math.cos((2 * Math.PI * 100 * i) / n));
    for (const w of ['rect', 'hann', 'hamming', 'blackman-harris', 'flattop'] as const) {
      const { win, out } = await map(x, fs, w, n, 0);
      expect(scaleSpectrum(out, 'peak', win.enbwBins, fs / n)[100]).toBeCloseTo(0.8, 5);
      expect(scaleSpectrum(out, 'rms', win.enbwBins, fs / n)[100]).toBeCloseTo(0.8 / Math.SQRT2, 5);
    }
  });

  it('white noise of known variance reads its one-sided PSD 2σ²/fs within 0.2 dB, and Parseval holds', async () => {
    // Box–Muller with a fixed LCG seed: Gaussian noise, σ = 0.5
    let s = 99;
    const u = () => ((s = (s * 1664525 + 1013904223) >>> 0) + 0.5) / 2 ** 32;
    const n = 1 << 20;
    const sigma = 0.5;
    const x = new Float32Array(n);
    for (let i = 0; i < n; i += 2) {
      const r = Math.sqrt(-2 * Math.log(u())) * sigma;
      const a = 2 * Math.PI * u();
      x[i] = r * Math.cos(a);
      x[i + 1] = r * Math.sin(a);
    }
    let meanSquare = 0;
    for (let i = 0; i < n; i++) meanSquare += x[i] * x[i];
    meanSquare /= n;
    for (const w of ['hann', 'blackman-harris', 'flattop'] as const) {
      const { layout, win, out } = await map(x, fs, w, 4096, 0.5);
      const avg = averageFrames(out, layout.bins, 0, layout.frames);
      const psd = scaleSpectrum(avg, 'psd', win.enbwBins, layout.binHz);
      let mean = 0;
      for (let k = 10; k < layout.bins - 10; k++) mean += psd[k];
      mean /= layout.bins - 20;
      expect(Math.abs(db(mean) - db((2 * sigma * sigma) / fs))).toBeLessThan(0.2);
      // Parseval: Σ PSD·Δf equals the mean square of the signal (to the statistics of the estimate)
      let total = 0;
      for (let k = 0; k < layout.bins; k++) total += psd[k] * layout.binHz;
      expect(Math.abs(db(total) - db(meanSquare))).toBeLessThan(0.05);
    }
  });
});

describe('two routes to the same map', () => {
  it('windowing in time (fft.js) and by spectral convolution (PFFFT, Harris 1978 §V) agree within 0.01 dB', async () => {
    const x = f32(fixture.signal);
    for (const window of ['hann', 'blackman-harris', 'flattop'] as const) {
      const layout = stftLayout(x.length, fixture.fsHz, { window, blockSize: 1024, overlap: 0.5 });
      const win = makeWindow(window, 1024);
      const a = new Float32Array(layout.frames * layout.bins);
      const b = new Float32Array(layout.frames * layout.bins);
      computeFrames(x, 0, layout, win, await createRealFft(1024), 0, layout.frames, a);
      computeFrames(x, 0, layout, win, await createRealFft(1024, 'fft.js'), 0, layout.frames, b);
      for (let i = 0; i < a.length; i++) expect(Math.abs(db(a[i]) - db(b[i]))).toBeLessThan(0.01);
    }
  });
});
