/**
 * The CLI's pool of worker threads (one per core) that compute a map's frames in parallel, each
 * sent only the samples its frames need.
 */
import { availableParallelism } from 'node:os';
import { Worker } from 'node:worker_threads';
import { frameChunks } from '../../workers/dsp/map-chunk';
import { stftLayout, type StftLayout, type StftSettings } from '../../workers/dsp/stft';

function shared(x: Float32Array): Float32Array {
  const copy = new Float32Array(new SharedArrayBuffer(x.byteLength));
  copy.set(x);
  return copy;
}

export class MapThreadPool {
  private readonly workers: Worker[];
  private next = 0;
  private readonly pending = new Map<number, () => void>();

  constructor(size = availableParallelism()) {
    this.workers = Array.from({ length: Math.max(1, size) }, () => {
      // A worker thread does not inherit the tsx loader: register it there, then load the TypeScript entry.
      const entry = new URL('./map-thread.ts', import.meta.url).href;
      const w = new Worker(`import('tsx/esm/api').then((t) => { t.register(); return import(${JSON.stringify(entry)}); });`, {
        eval: true,
      });
      w.on('message', (m: { id: number }) => {
        this.pending.get(m.id)?.();
        this.pending.delete(m.id);
      });
      return w;
    });
  }

  get size() {
    return this.workers.length;
  }

  /**
   * The whole map (frames × bins mean-square powers), computed in chunks across the threads. Samples and
   * map live in SharedArrayBuffers that every thread reads and writes in place.
   */
  async map(x: Float32Array, fsHz: number, settings: StftSettings): Promise<{ layout: StftLayout; power: Float32Array }> {
    const layout = stftLayout(x.length, fsHz, settings);
    const samples = x.buffer instanceof SharedArrayBuffer ? x : shared(x);
    const power = new Float32Array(new SharedArrayBuffer(layout.frames * layout.bins * 4));
    // Chunks go to whichever thread is free (a busy core no longer holds back a fixed share), two in
    // flight per thread so none waits for its next message.
    const chunks = frameChunks(layout.frames, Math.max(1, Math.ceil(layout.frames / (this.workers.length * 8))));
    let next = 0;
    const feed = async (w: Worker) => {
      while (next < chunks.length) {
        const [from, to] = chunks[next++];
        const id = this.next++;
        const done = new Promise<void>((resolve) => this.pending.set(id, resolve));
        w.postMessage({ id, samples, map: power, layout, settings, from, to });
        await done;
      }
    };
    await Promise.all(this.workers.flatMap((w) => [feed(w), feed(w)]));
    return { layout, power };
  }

  async close(): Promise<void> {
    await Promise.all(this.workers.map((w) => w.terminate()));
  }
}
