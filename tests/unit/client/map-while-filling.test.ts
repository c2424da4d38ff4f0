/**
 * A map computed while its channel is still being read: no chunk is computed before the samples it reads
 * are in, and the map that results equals the map of the whole channel computed at once (the STFT of
 * workers/dsp/stft, itself checked against scipy.signal.stft in tests/unit/dsp). Runs the pool's on-page
 * path (no Worker in Node), the same scheduling as with workers.
 */
import { describe, expect, it } from 'vitest';
import { SampleCount, startMap } from '../../../src/lib/workers/analysis-pool';
import { chunkSampleRange } from '../../../workers/dsp/map-chunk';

function signal(n: number, fs: number): Float32Array {
  return Float32Array.from({ length: n }, (_, i) => Math.sin((2 * Math.PI * 1000 * i) / fs) + 0.1 * Math.sin((2 * Math.PI * 3170 * i) / fs));
}

async function wholeMap(samples: Float32Array, fs: number, settings: { blockSize: number; overlap: number; window: 'hann' }) {
  const parts: Float32Array[] = [];
  const job = startMap(samples, fs, settings, (_f, _t, p) => parts.push(p.slice()), undefined, { framesPerChunk: 16 });
  await job.done;
  return parts;
}

describe('the map of a channel still being read', () => {
  const fs = 8000;
  const settings = { blockSize: 256, overlap: 0.5, window: 'hann' as const };
  const full = signal(40_000, fs);

  it('computes each chunk only once its samples are in, and ends equal to the map of the whole channel', async () => {
    const reference = await wholeMap(full, fs, settings);
    const filling = new Float32Array(full.length);
    const fill = new SampleCount();
    const parts: Float32Array[] = [];
    let violations = 0;
    const job = startMap(
      filling,
      fs,
      settings,
      (from, to, power, layout) => {
        if (chunkSampleRange(layout, from, to)[1] > fill.samplesIn) violations++;
        parts.push(power.slice());
      },
      undefined,
      { framesPerChunk: 16, filling: fill },
    );
    // the "file" arrives in 7 steps, with a pause between them
    for (let step = 1; step <= 7; step++) {
      await new Promise((r) => setTimeout(r, 5));
      const upTo = Math.round((full.length * step) / 7);
      filling.set(full.subarray(fill.samplesIn, upTo), fill.samplesIn);
      fill.set(upTo);
    }
    await job.done;
    expect(violations).toBe(0);
    expect(parts.length).toBe(reference.length);
    for (let i = 0; i < parts.length; i++) expect(parts[i]).toEqual(reference[i]);
  });

  it('waits, with nothing computed, while no samples are in', async () => {
    const fill = new SampleCount();
    let chunks = 0;
    const job = startMap(new Float32Array(full.length), fs, settings, () => chunks++, undefined, { framesPerChunk: 16, filling: fill });
    await new Promise((r) => setTimeout(r, 50));
    expect(chunks).toBe(0);
    job.cancel();
    await expect(job.done).rejects.toThrow(/cancelled/);
  });
});
