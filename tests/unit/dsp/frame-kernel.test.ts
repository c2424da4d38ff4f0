/**
 * The WASM SIMD readout kernel (workers/dsp/kernels/frame-power.wat) against two independent routes:
 * fft.js with the window applied in time (the textbook definition, Harris 1978 eq. (1)), and PFFFT with
 * the readout in JavaScript; and against scipy.signal.spectrogram through the fixture of stft.test.ts
 * (tests/fixtures/spectral/scipy-spectra.json, Debian's python3-scipy).
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it, vi } from 'vitest';
import { PROJECT_ROOT } from '../../../server/config';
import { createRealFft } from '../../../workers/dsp/fft';
import { base64 } from '../../../workers/dsp/kernels/frame-power.wasm';
import { assemble } from '../../../workers/dsp/kernels/build';
import { computeFrames, stftLayout } from '../../../workers/dsp/stft';
import { makeWindow, windowNames, type WindowName } from '../../../workers/dsp/window';

const db = (x: number) => 10 * Math.log10(x);

/** A tone sweeping 500 → 1700 Hz in noise, as the map benchmark's signal, fs = 51.2 kHz. */
function signal(n: number, fs = 51200): Float32Array {
  const x = new Float32Array(n);
  let s = 1;
  for (let i = 0; i < n; i++) {
    s = (s * 1664525 + 1013904223) >>> 0;
    x[i] = 0.5 * Math.sin((2 * Math.PI * (500 + 20 * (i / fs)) * i) / fs) + 0.1 * (s / 2 ** 32 - 0.5);
  }
  return x;
}

async function map(x: Float32Array, x0: number, window: WindowName, blockSize: number, overlap: number, fft: Awaited<ReturnType<typeof createRealFft>>) {
  const layout = stftLayout(x0 + x.length, 51200, { window, blockSize, overlap });
  const from = Math.ceil(x0 / layout.hop);
  const out = new Float32Array((layout.frames - from) * layout.bins);
  computeFrames(x, x0, layout, makeWindow(window, blockSize), fft, from, layout.frames, out);
  return out;
}

/** Largest level difference in dB over the bins within 90 dB of the map's peak (below, float32 noise rules). */
function worstDb(a: Float32Array, b: Float32Array): number {
  let peak = 0;
  for (const v of b) peak = Math.max(peak, v);
  let worst = 0;
  for (let i = 0; i < a.length; i++) if (b[i] > peak * 1e-9) worst = Math.max(worst, Math.abs(db(a[i]) - db(b[i])));
  return worst;
}

describe('frame-power kernel (WASM SIMD)', () => {
  it('the committed bytes are the assembled source', async () => {
    const committed = Buffer.from(base64, 'base64');
    expect(Buffer.from(await assemble('frame-power')).equals(committed)).toBe(true);
  });

  it('is the readout PFFFT uses where the engine has WASM SIMD (Node 20 does)', async () => {
    const fft = await createRealFft(8192);
    expect(fft.backend).toBe('pffft-simd');
    expect(fft.readout).toBe('wasm-kernel');
  });

  // overlaps giving hops that are a multiple of 4 (batched, frames transformed in place) and not (copied one by one)
  it.each(windowNames.flatMap((w) => [256, 1024, 8192].flatMap((n) => [0, 0.3, 0.75].map((o) => [w, n, o] as const))))(
    '%s window, N = %i, overlap %s: equals fft.js within 0.01 dB',
    async (window, n, overlap) => {
      const x = signal(51200 * 2 + 123);
      const a = await map(x, 0, window, n, overlap, await createRealFft(n));
      const b = await map(x, 0, window, n, overlap, await createRealFft(n, 'fft.js'));
      expect(worstDb(a, b)).toBeLessThan(0.01);
    },
  );

  it('reads a slice that starts inside the channel (x0 > 0), as a worker gets it', async () => {
    const full = signal(51200);
    const x0 = 4096 * 3;
    const a = await map(full.subarray(x0), x0, 'hann', 4096, 0.75, await createRealFft(4096));
    const b = await map(full.subarray(x0), x0, 'hann', 4096, 0.75, await createRealFft(4096, 'fft.js'));
    expect(a.length).toBeGreaterThan(0);
    expect(worstDb(a, b)).toBeLessThan(0.01);
  });

  it('a single frame (framePower) gives the same row as the batch', async () => {
    const x = signal(20000);
    const fft = await createRealFft(2048);
    const win = makeWindow('hamming', 2048);
    const rows = new Float32Array(3 * 1025);
    fft.framesPower(x, 100, 512, 3, win, rows, 0, 2, 1);
    const one = new Float32Array(1025);
    for (let f = 0; f < 3; f++) {
      fft.framePower(x, 100 + f * 512, win, one, 0, 2, 1);
      expect(Array.from(one)).toEqual(Array.from(rows.subarray(f * 1025, (f + 1) * 1025)));
    }
  });

  it('agrees with PFFFT read out in JavaScript (the fallback) within 0.01 dB', async () => {
    vi.resetModules();
    const fresh = await import('../../../workers/dsp/fft');
    fresh.pffftOptions.kernel = false;
    const js = await fresh.createRealFft(8192);
    expect(js.backend).toBe('pffft-simd');
    expect(js.readout).toBe('js');
    const x = signal(51200 * 3);
    for (const window of windowNames) {
      const a = await map(x, 0, window, 8192, 0.75, await createRealFft(8192));
      const b = await map(x, 0, window, 8192, 0.75, js);
      expect(worstDb(a, b)).toBeLessThan(0.01);
    }
  });

  it('matches scipy.signal.spectrogram (the stft fixture) within 0.01 dB', async () => {
    const fixture = JSON.parse(readFileSync(path.join(PROJECT_ROOT, 'tests/fixtures/spectral/scipy-spectra.json'), 'utf8')) as {
      fsHz: number;
      signal: string;
      cases: { window: WindowName; blockSize: number; overlap: number; spectrogram: string }[];
    };
    const f32 = (b64: string) => {
      const bytes = Buffer.from(b64, 'base64');
      return new Float32Array(bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength));
    };
    const x = f32(fixture.signal);
    for (const c of fixture.cases) {
      const fft = await createRealFft(c.blockSize);
      expect(fft.readout).toBe('wasm-kernel');
      const layout = stftLayout(x.length, fixture.fsHz, c);
      const out = new Float32Array(layout.frames * layout.bins);
      computeFrames(x, 0, layout, makeWindow(c.window, c.blockSize), fft, 0, layout.frames, out);
      const ref = f32(c.spectrogram);
      let worst = 0;
      for (let i = 0; i < ref.length; i++) worst = Math.max(worst, Math.abs(db(out[i]) - db(ref[i])));
      expect(worst).toBeLessThan(0.01);
    }
  });
});
