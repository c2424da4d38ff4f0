/// <reference lib="webworker" />
/**
 * The listening worker: holds a copy of each channel it is asked to play and processes blocks of it
 * ahead of the play head (the ticked guides alone, or the channel without them, by the Vold–Kalman
 * filter: workers/dsp/playback-filter.ts), and whole ranges for a WAV export. Only wiring here.
 */
import * as Comlink from 'comlink';
import { filterBlock, filterRange, type PlaybackFilterOptions, type PlaybackLine } from './dsp/playback-filter';
import type { StftLayout } from './dsp/stft';

export interface ListenBlockRequest {
  /** The channel's id, as loaded */
  id: string;
  from: number;
  to: number;
  lines: PlaybackLine[];
  layout: StftLayout;
  options: PlaybackFilterOptions;
}

/** Channels held, by id (a few: the runs of a comparison). */
const channels = new Map<string, { samples: Float32Array; fsHz: number }>();
const MAX_HELD = 6;

function channel(id: string) {
  const c = channels.get(id);
  if (!c) throw new Error(`The channel to process (${id}) was not handed to the listening worker.`);
  return c;
}

const api = {
  /** Keeps the channel's samples under `id` (the page keeps its own: these are a copy, transferred). */
  load(id: string, samples: Float32Array, fsHz: number): void {
    channels.delete(id);
    channels.set(id, { samples, fsHz });
    while (channels.size > MAX_HELD) channels.delete(channels.keys().next().value!);
  },
  has(id: string): boolean {
    return channels.has(id);
  },
  block(req: ListenBlockRequest): Float32Array {
    const c = channel(req.id);
    const out = filterBlock(c.samples, c.fsHz, req.lines, req.layout, req.from, req.to, req.options);
    return Comlink.transfer(out, [out.buffer as ArrayBuffer]);
  },
  range(req: ListenBlockRequest): Float32Array {
    const c = channel(req.id);
    const out = filterRange(c.samples, c.fsHz, req.lines, req.layout, req.from, req.to, req.options);
    return Comlink.transfer(out, [out.buffer as ArrayBuffer]);
  },
};

export type ListenWorkerApi = typeof api;
if (typeof WorkerGlobalScope !== 'undefined' && self instanceof WorkerGlobalScope) Comlink.expose(api);
