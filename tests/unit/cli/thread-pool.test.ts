/**
 * The CLI's map on worker threads equals the same map computed in one thread (workers/dsp/stft.ts
 * computeFrames, itself checked against scipy.signal.spectrogram in tests/unit/dsp/stft.test.ts):
 * every frame, whichever thread took its chunk.
 */
import { afterAll, describe, expect, it } from 'vitest';
import { MapThreadPool } from '../../../server/cli/thread-pool';
import { createRealFft } from '../../../workers/dsp/fft';
import { computeFrames, stftLayout, type StftSettings } from '../../../workers/dsp/stft';
import { makeWindow } from '../../../workers/dsp/window';

const FS = 51200;
const pool = new MapThreadPool(2);
afterAll(() => pool.close());

function signal(n: number, shared: boolean): Float32Array {
  const x = new Float32Array(shared ? new SharedArrayBuffer(n * 4) : new ArrayBuffer(n * 4));
  let s = 3;
  for (let i = 0; i < n; i++) {
    s = (s * 1664525 + 1013904223) >>> 0;
    x[i] = 0.5 * Math.sin((2 * Math.PI * 730 * i) / FS) + 0.1 * (s / 2 ** 32 - 0.5);
  }
  return x;
}

describe('MapThreadPool', () => {
  it.each([
    [{ window: 'hann', blockSize: 4096, overlap: 0.75 }, true],
    [{ window: 'flattop', blockSize: 2048, overlap: 0.3 }, false],
    [{ window: 'rect', blockSize: 1024, overlap: 0 }, true],
  ] as [StftSettings, boolean][])('%o (shared input %s): equals the map computed in one thread', async (settings, shared) => {
    const x = signal(FS * 3 + 77, shared);
    const { layout, power } = await pool.map(x, FS, settings);
    expect(layout).toEqual(stftLayout(x.length, FS, settings));
    const ref = new Float32Array(layout.frames * layout.bins);
    computeFrames(x, 0, layout, makeWindow(settings.window, settings.blockSize), await createRealFft(settings.blockSize), 0, layout.frames, ref);
    expect(power.length).toBe(ref.length);
    let differ = 0;
    for (let i = 0; i < ref.length; i++) if (power[i] !== ref[i]) differ++;
    expect(differ).toBe(0);
  });
});
