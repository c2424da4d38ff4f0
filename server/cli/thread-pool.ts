/**
 * The CLI's pool of worker threads (one per core) that compute a map's frames in parallel, each
 * sent only the samples its frames need.
 */
import { availableParallelism } from 'node:os';
import { Worker } from 'node:worker_threads';
import { chunkSampleRange, frameChunks, type MapChunkResult } from '../../workers/dsp/map-chunk';
import { stftLayout, type StftLayout, type StftSettings } from '../../workers/dsp/stft';

export class MapThreadPool {
  private readonly workers: Worker[];
  private next = 0;
  private readonly pending = new Map<number, (r: MapChunkResult) => void>();

  constructor(size = availableParallelism()) {
    this.workers = Array.from({ length: Math.max(1, size) }, () => {
      // A worker thread does not inherit the tsx loader: register it there, then load the TypeScript entry.
      const entry = new URL('./map-thread.ts', import.meta.url).href;
      const w = new Worker(`import('tsx/esm/api').then((t) => { t.register(); return import(${JSON.stringify(entry)}); });`, {
        eval: true,
      });
      w.on('message', (m: MapChunkResult & { id: number }) => {
        this.pending.get(m.id)?.(m);
        this.pending.delete(m.id);
      });
      return w;
    });
  }

  get size() {
    return this.workers.length;
  }

  /** The whole map (frames × bins mean-square powers), computed in chunks across the threads. */
  async map(x: Float32Array, fsHz: number, settings: StftSettings): Promise<{ layout: StftLayout; power: Float32Array }> {
    const layout = stftLayout(x.length, fsHz, settings);
    const power = new Float32Array(layout.frames * layout.bins);
    const perChunk = Math.max(1, Math.ceil(layout.frames / (this.workers.length * 4)));
    await Promise.all(
      frameChunks(layout.frames, perChunk).map(([from, to], i) => {
        const [s0, s1] = chunkSampleRange(layout, from, to);
        const samples = x.slice(s0, s1);
        const id = this.next++;
        const done = new Promise<MapChunkResult>((resolve) => this.pending.set(id, resolve));
        this.workers[i % this.workers.length].postMessage({ id, samples, x0: s0, layout, settings, from, to }, [samples.buffer]);
        return done.then((r) => power.set(r.power, from * layout.bins));
      }),
    );
    return { layout, power };
  }

  async close(): Promise<void> {
    await Promise.all(this.workers.map((w) => w.terminate()));
  }
}
