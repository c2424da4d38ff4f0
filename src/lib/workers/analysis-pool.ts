/**
 * Computes maps in a pool of analysis workers (one per core but one, for the page): the frames are split
 * into chunks, each worker is sent only the samples its chunk reads, and the chunks come back to
 * `onChunk` in frame order so a map paints from left to right. The workers are created on first use and
 * kept. Where workers cannot be had, the chunks are computed on this thread in small slices, yielding
 * between them so the page stays responsive.
 */
import * as Comlink from 'comlink';
import type { AnalysisWorkerApi } from '../../../workers/analysis.worker';
import { chunkSampleRange, computeMapChunk, frameChunks } from '../../../workers/dsp/map-chunk';
import { stftLayout, type StftLayout, type StftSettings } from '../../../workers/dsp/stft';

export type MapChunkCallback = (from: number, to: number, power: Float32Array, layout: StftLayout) => void;

export interface MapOptions {
  /** Multiplies every sample before analysis (a channel's calibration, units per file unit). Default 1. */
  scale?: number;
  /** Frames per chunk; by default about 64, more for small blocks so each chunk is worth a message. */
  framesPerChunk?: number;
  /**
   * Samples still being read into `samples` (a channel streamed from its file): how many are there so
   * far, from the start. A chunk is computed once the samples it reads are in.
   */
  filling?: SampleFill;
}

/** A channel's samples arriving from the start: how many are in, and a signal when more come. */
export interface SampleFill {
  readonly samplesIn: number;
  subscribe(listener: () => void): () => void;
}

/** The count of samples in, told to whoever listens (the map, which computes the columns they allow). */
export class SampleCount implements SampleFill {
  samplesIn = 0;
  private readonly listeners = new Set<() => void>();
  subscribe(listener: () => void): () => void {
    this.listeners.add(listener);
    return () => this.listeners.delete(listener);
  }
  set(n: number): void {
    if (n <= this.samplesIn) return;
    this.samplesIn = n;
    for (const l of [...this.listeners]) l();
  }
}

export interface MapJob {
  layout: StftLayout;
  /** Resolves once every chunk has been delivered; rejects on an error, or with an AbortError on cancel. */
  done: Promise<void>;
  cancel(): void;
  /** The FFT routes the chunks so far were computed by ("pffft-simd+kernel", "fft.js"…) */
  engines: ReadonlySet<string>;
}

/** Chunks a worker may hold at once: one computing, one waiting, so it never idles on a round trip. */
const MAX_IN_FLIGHT = 2;

interface Task {
  job: Job;
  index: number;
}

interface Slot {
  worker: Worker;
  remote: Comlink.Remote<AnalysisWorkerApi>;
  inFlight: number;
  /** A worker that fails before its first answer is taken as unavailable (blocked, or no module workers). */
  answered: boolean;
  dead: boolean;
  pending: Set<Task>;
}

interface Job {
  engines: Set<string>;
  samples: Float32Array;
  scale: number;
  settings: StftSettings;
  layout: StftLayout;
  chunks: [number, number][];
  /** The next chunk never sent */
  next: number;
  /** Chunks to send again (their worker died), lowest first */
  retry: number[];
  /** The next chunk to hand to onChunk */
  delivered: number;
  framesDelivered: number;
  results: Map<number, Float32Array>;
  finished: boolean;
  inline: boolean;
  onChunk: MapChunkCallback;
  onProgress?: (fraction: number) => void;
  filling?: SampleFill;
  stopFollowing?: () => void;
  resolve(): void;
  reject(e: unknown): void;
}

let slots: Slot[] | null = null;
const active: Job[] = [];

function abortError(): Error {
  const e = new Error('The map computation was cancelled.');
  e.name = 'AbortError';
  return e;
}

function createSlot(index: number): Slot {
  const worker = new Worker(new URL('../../../workers/analysis.worker.ts', import.meta.url), {
    type: 'module',
    name: `fanlight-analysis-${index + 1}`,
  });
  const slot: Slot = { worker, remote: Comlink.wrap<AnalysisWorkerApi>(worker), inFlight: 0, answered: false, dead: false, pending: new Set() };
  worker.addEventListener('error', (e) => {
    e.preventDefault();
    retire(slot);
  });
  return slot;
}

/** The pool, created on first use; a worker that crashed after working is replaced here. */
function pool(): Slot[] {
  if (slots === null) {
    slots = [];
    if (typeof Worker !== 'undefined') {
      const n = Math.max(1, (globalThis.navigator?.hardwareConcurrency || 2) - 1);
      try {
        for (let i = 0; i < n; i++) slots.push(createSlot(i));
      } catch {
        for (const s of slots) s.worker.terminate();
        slots = [];
      }
    }
  } else {
    slots = slots.map((s, i) => {
      if (!s.dead || !s.answered) return s;
      try {
        return createSlot(i);
      } catch {
        return s;
      }
    });
  }
  return slots;
}

/** A dead worker's chunks go back to their jobs, to another worker or to this thread. */
function retire(slot: Slot) {
  if (slot.dead) return;
  slot.dead = true;
  slot.worker.terminate();
  for (const t of slot.pending) {
    if (!t.job.finished) {
      t.job.retry.push(t.index);
      t.job.retry.sort((a, b) => a - b);
    }
  }
  slot.pending.clear();
  slot.inFlight = 0;
  pump();
}

/** A copy of samples [s0, s1), calibrated: the stored channel is never changed. */
function sliceScaled(samples: Float32Array, s0: number, s1: number, scale: number): Float32Array {
  const out = samples.slice(s0, s1);
  if (scale !== 1) for (let i = 0; i < out.length; i++) out[i] *= scale;
  return out;
}

function takeChunk(job: Job): number {
  if (job.retry.length > 0) return job.retry.shift()!;
  return job.next < job.chunks.length ? job.next++ : -1;
}

/** Whether the samples chunk `index` reads are in (always, unless the channel is still being read). */
function chunkReady(job: Job, index: number): boolean {
  if (!job.filling) return true;
  const [from, to] = job.chunks[index];
  return chunkSampleRange(job.layout, from, to)[1] <= job.filling.samplesIn;
}

const hasWork = (job: Job) =>
  !job.finished && !job.inline && (job.retry.length > 0 || (job.next < job.chunks.length && chunkReady(job, job.next)));

function pump() {
  const live = (slots ?? []).filter((s) => !s.dead);
  if (live.length === 0) {
    for (const job of [...active]) if (hasWork(job)) void runInline(job);
    return;
  }
  for (const slot of live) {
    while (slot.inFlight < MAX_IN_FLIGHT) {
      const job = active.find(hasWork);
      if (!job) return;
      send(slot, job, takeChunk(job));
    }
  }
}

function send(slot: Slot, job: Job, index: number) {
  const [from, to] = job.chunks[index];
  const [s0, s1] = chunkSampleRange(job.layout, from, to);
  const samples = sliceScaled(job.samples, s0, s1, job.scale);
  const task: Task = { job, index };
  slot.inFlight++;
  slot.pending.add(task);
  const settle = () => {
    if (!slot.pending.delete(task)) return false;
    slot.inFlight--;
    slot.answered = true;
    return true;
  };
  slot.remote
    .computeChunk(Comlink.transfer({ samples, x0: s0, layout: job.layout, settings: job.settings, from, to }, [samples.buffer]))
    .then(
      (result) => {
        if (!settle()) return;
        job.engines.add(result.backend);
        accept(job, index, result.power);
        pump();
      },
      (e: unknown) => {
        if (!settle()) return;
        fail(job, e);
        pump();
      },
    );
}

/** Frames per slice on this thread: a few milliseconds of work between yields. */
const inlineSlice = (blockSize: number) => Math.max(1, Math.round(131072 / blockSize));
const yieldToPage = () => new Promise<void>((resolve) => setTimeout(resolve, 0));

async function runInline(job: Job) {
  if (job.inline) return;
  job.inline = true;
  const { layout, settings } = job;
  const slice = inlineSlice(layout.blockSize);
  try {
    for (let index = takeChunk(job); index >= 0 && !job.finished; index = takeChunk(job)) {
      while (!chunkReady(job, index) && !job.finished) await moreSamples(job);
      const [from, to] = job.chunks[index];
      const power = new Float32Array((to - from) * layout.bins);
      for (let f = from; f < to; f += slice) {
        await yieldToPage();
        if (job.finished) return;
        const g = Math.min(to, f + slice);
        const [s0, s1] = chunkSampleRange(layout, f, g);
        const part = await computeMapChunk({ samples: sliceScaled(job.samples, s0, s1, job.scale), x0: s0, layout, settings, from: f, to: g });
        power.set(part.power, (f - from) * layout.bins);
        job.engines.add(part.backend);
      }
      accept(job, index, power);
    }
  } catch (e) {
    fail(job, e);
  }
}

/** Resolves when more of a filling channel's samples are in (or at once if it is not filling). */
function moreSamples(job: Job): Promise<void> {
  return new Promise((resolve) => {
    if (!job.filling) return resolve();
    const stop = job.filling.subscribe(() => {
      stop();
      resolve();
    });
  });
}

/** Holds results that come early and hands chunks on strictly in frame order. */
function accept(job: Job, index: number, power: Float32Array) {
  if (job.finished) return;
  job.results.set(index, power);
  while (job.results.has(job.delivered)) {
    const p = job.results.get(job.delivered)!;
    job.results.delete(job.delivered);
    const [from, to] = job.chunks[job.delivered];
    job.delivered++;
    job.framesDelivered += to - from;
    try {
      job.onChunk(from, to, p, job.layout);
      job.onProgress?.(job.framesDelivered / job.layout.frames);
    } catch (e) {
      fail(job, e);
      return;
    }
  }
  if (job.delivered === job.chunks.length) end(job, null);
}

function fail(job: Job, e: unknown) {
  end(job, e instanceof Error ? e : new Error(String(e)));
}

function end(job: Job, error: Error | null) {
  if (job.finished) return;
  job.finished = true;
  job.stopFollowing?.();
  job.results.clear();
  const at = active.indexOf(job);
  if (at >= 0) active.splice(at, 1);
  if (error) job.reject(error);
  else job.resolve();
}

/**
 * Starts the workers, and their FFT for the usual settings, before the first map is asked for (the
 * Bench calls it when it opens), so a dropped file's map does not wait for them.
 */
export function warmPool(settings: StftSettings = { blockSize: 8192, overlap: 0.75, window: 'hann' }) {
  for (const slot of pool()) {
    if (slot.dead) continue;
    slot.remote.warm(settings).then(
      () => {
        slot.answered = true;
      },
      () => undefined,
    );
  }
}

/** Default chunking: about 64 frames, and at least 256 k samples of blocks per chunk for small blocks. */
const defaultFramesPerChunk = (blockSize: number) => Math.max(64, Math.floor(262144 / blockSize));

/**
 * Starts the map of one channel. The layout is known at once (it throws a RangeError for settings the
 * STFT does not take); the powers arrive chunk by chunk, in frame order, as mean squares per bin.
 */
export function startMap(
  samples: Float32Array,
  fsHz: number,
  settings: StftSettings,
  onChunk: MapChunkCallback,
  onProgress?: (fraction: number) => void,
  options: MapOptions = {},
): MapJob {
  const layout = stftLayout(samples.length, fsHz, settings);
  const chunks = frameChunks(layout.frames, options.framesPerChunk ?? defaultFramesPerChunk(settings.blockSize));
  let resolve!: () => void;
  let reject!: (e: unknown) => void;
  const done = new Promise<void>((res, rej) => {
    resolve = res;
    reject = rej;
  });
  // A caller that drops the promise after cancelling should not see an unhandled rejection.
  done.catch(() => undefined);
  const job: Job = {
    engines: new Set(),
    samples,
    scale: options.scale ?? 1,
    settings: { ...settings },
    layout,
    chunks,
    next: 0,
    retry: [],
    delivered: 0,
    framesDelivered: 0,
    results: new Map(),
    finished: false,
    inline: false,
    onChunk,
    onProgress,
    filling: options.filling,
    resolve,
    reject,
  };
  if (chunks.length === 0) {
    job.finished = true;
    resolve();
  } else {
    pool();
    active.push(job);
    // more samples in: the chunks that read them can go out
    if (job.filling) job.stopFollowing = job.filling.subscribe(pump);
    pump();
  }
  return { layout, done, cancel: () => end(job, abortError()), engines: job.engines };
}
