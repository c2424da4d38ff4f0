/**
 * The CLI's pool of worker threads (one per core) that compute a map's frames in parallel, each
 * sent only the samples its frames need.
 */
import { availableParallelism } from 'node:os';
import path from 'node:path';
import { Worker } from 'node:worker_threads';
import { frameChunks } from '../../workers/dsp/map-chunk';
import { stftLayout, type StftLayout, type StftSettings } from '../../workers/dsp/stft';
import type { MapThreadRequest, RowsFile, WavChannelInput } from './map-thread';

function shared(x: Float32Array): Float32Array {
  const copy = new Float32Array(new SharedArrayBuffer(x.byteLength));
  copy.set(x);
  return copy;
}

/** Set by analyze-launch.mjs when the CLI runs from its JavaScript bundle: the folder holding map-thread.js. */
const bundleDir = () => (globalThis as { fanlightCliBundleDir?: string }).fanlightCliBundleDir;

function startThread(): Worker {
  const dir = bundleDir();
  if (dir) return new Worker(path.join(dir, 'map-thread.js'));
  // A worker thread does not inherit the tsx loader: register it there, then load the TypeScript entry.
  const entry = new URL('./map-thread.ts', import.meta.url).href;
  return new Worker(`import('tsx/esm/api').then((t) => { t.register(); return import(${JSON.stringify(entry)}); });`, { eval: true });
}

type Job = DistributiveOmit<MapThreadRequest, 'id' | 'from' | 'to'>;
type DistributiveOmit<T, K extends PropertyKey> = T extends unknown ? Omit<T, K> : never;

export class MapThreadPool {
  private readonly workers: Worker[];
  private next = 0;
  private readonly pending = new Map<number, { resolve: () => void; reject: (e: Error) => void }>();

  constructor(size = availableParallelism()) {
    this.workers = Array.from({ length: Math.max(1, size) }, () => {
      const w = startThread();
      w.on('message', (m: { id: number; error?: string }) => {
        const p = this.pending.get(m.id);
        this.pending.delete(m.id);
        if (m.error) p?.reject(new Error(m.error));
        else p?.resolve();
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
    const power = new Float32Array(new SharedArrayBuffer(layout.frames * layout.bins * 4));
    await this.run(layout, { samples: this.shareable(x), layout, settings, map: power });
    return { layout, power };
  }

  /**
   * The map as levels in dB (decibels.ts), written by the threads straight into the open file `fd`,
   * frame 0's row at byte `offset`, rows one after another (float32, little-endian as in memory). The
   * samples are the channel `x`, or a WAV channel of `frames` frames that the threads read themselves.
   */
  async mapToFile(
    input: { x: Float32Array } | { wav: WavChannelInput; frames: number },
    fsHz: number,
    settings: StftSettings,
    file: RowsFile,
  ): Promise<StftLayout> {
    const layout = stftLayout('x' in input ? input.x.length : input.frames, fsHz, settings);
    const job: Job = 'x' in input ? { samples: this.shareable(input.x), layout, settings, file } : { wav: input.wav, layout, settings, file };
    // Chunks of at most about 2 MB of rows: each thread's buffers (rows, samples read) stay small, so
    // fewer fresh pages to fault in (costly in a virtual machine) and its first write starts sooner.
    await this.run(layout, job, Math.max(1, Math.floor((2 << 20) / (4 * layout.bins))));
    return layout;
  }

  private shareable(x: Float32Array): Float32Array {
    return x.buffer instanceof SharedArrayBuffer ? x : shared(x);
  }

  private async run(layout: StftLayout, job: Job, maxFramesPerChunk = Infinity): Promise<void> {
    // Chunks go to whichever thread is free (a busy core no longer holds back a fixed share), two in
    // flight per thread so none waits for its next message.
    const perChunk = Math.min(maxFramesPerChunk, Math.ceil(layout.frames / (this.workers.length * 8)));
    const chunks = frameChunks(layout.frames, Math.max(1, perChunk));
    let next = 0;
    const feed = async (w: Worker) => {
      while (next < chunks.length) {
        const [from, to] = chunks[next++];
        const id = this.next++;
        const done = new Promise<void>((resolve, reject) => this.pending.set(id, { resolve, reject }));
        w.postMessage({ ...job, id, from, to } as MapThreadRequest);
        await done;
      }
    };
    await Promise.all(this.workers.flatMap((w) => [feed(w), feed(w)]));
  }

  async close(): Promise<void> {
    await Promise.all(this.workers.map((w) => w.terminate()));
  }
}
