/**
 * A worker thread of the batch CLI: computes map chunks (workers/dsp/map-chunk.ts) into a shared map, or
 * as levels in dB straight into an open file at their rows' place (the .npy of `analyze map`), so the
 * main thread neither converts nor copies them. For a WAV, a thread can read the samples its frames need
 * from the file itself: no decode pass on the main thread, no channel-long buffer.
 */
import { readSync, writeSync } from 'node:fs';
import { parentPort } from 'node:worker_threads';
import type { WavLayout } from '../../workers/io/recording';
import { isFloat } from '../../workers/io/wav-header';
import { decodeWavChannel, replaceNonFinite } from '../../workers/io/wav-samples';
import { chunkSampleRange, computeMapChunkShared, engineOf, mapTools, type MapChunkRequest } from '../../workers/dsp/map-chunk';
import { computeFrames } from '../../workers/dsp/stft';

/** One channel of a WAV file open in this process (fd), its samples times `cal`. */
export interface WavChannelInput {
  fd: number;
  fileName: string;
  layout: WavLayout;
  channelCount: number;
  channel: number;
  cal: number;
}

/** fd: a file open for writing in this process; offset: the byte where frame 0's row goes */
export interface RowsFile {
  fd: number;
  offset: number;
}

type Chunk = Pick<MapChunkRequest, 'layout' | 'settings' | 'from' | 'to'> & { id: number };
export type MapThreadRequest = Chunk &
  ({ samples: Float32Array; map: Float32Array } | { samples: Float32Array; file: RowsFile } | { wav: WavChannelInput; file: RowsFile });

let rows = new Float32Array(0);
let bytes = new Uint8Array(0);
let samples = new Float32Array(0);

function writeRows(fd: number, data: Float32Array, position: number): void {
  const view = new Uint8Array(data.buffer, data.byteOffset, data.byteLength);
  for (let done = 0; done < view.length; ) done += writeSync(fd, view, done, view.length - done, position + done);
}

function readFully(w: WavChannelInput, into: Uint8Array, at: number): void {
  for (let done = 0; done < into.length; ) {
    const got = readSync(w.fd, into, done, into.length - done, at + done);
    if (got === 0) throw new Error(`${w.fileName}: only ${done} bytes could be read at byte offset ${at}.`);
    done += got;
  }
}

/** Samples [first, first + n) of the channel, read from the file. */
function readWav(w: WavChannelInput, first: number, n: number): Float32Array {
  if (samples.length < n) samples = new Float32Array(n);
  const x = samples.subarray(0, n);
  const at = w.layout.dataOffset + first * w.layout.blockAlign;
  const bad = { channel: w.channel, count: 0, firstFrame: -1 };
  if (w.channelCount === 1 && w.layout.blockAlign === 4 && isFloat(w.layout)) {
    // One float32 channel is the file's bytes as they are: read them straight into the samples.
    readFully(w, new Uint8Array(x.buffer, x.byteOffset, x.byteLength), at);
    replaceNonFinite(x, 0, n, bad);
  } else {
    const length = n * w.layout.blockAlign;
    if (bytes.length < length) bytes = new Uint8Array(length);
    readFully(w, bytes.subarray(0, length), at);
    decodeWavChannel(bytes, w.layout, w.channelCount, w.channel, n, x, 0, bad);
  }
  if (w.cal !== 1) for (let i = 0; i < n; i++) x[i] *= w.cal;
  return x;
}

async function computeToFile(req: Extract<MapThreadRequest, { file: RowsFile }>): Promise<string> {
  const { fft, win } = await mapTools(req);
  // Nothing awaits from here to the write, so the two chunks in flight here never share buffers at once.
  let x: Float32Array;
  let x0 = 0;
  if ('wav' in req) {
    const [first, end] = chunkSampleRange(req.layout, req.from, req.to);
    x = readWav(req.wav, first, end - first);
    x0 = first;
  } else x = req.samples;
  const n = (req.to - req.from) * req.layout.bins;
  if (rows.length < n) rows = new Float32Array(n);
  const out = rows.subarray(0, n);
  computeFrames(x, x0, req.layout, win, fft, req.from, req.to, out, true);
  writeRows(req.file.fd, out, req.file.offset + req.from * req.layout.bins * 4);
  return engineOf(fft);
}

parentPort!.on('message', async (req: MapThreadRequest) => {
  try {
    const backend = 'file' in req ? await computeToFile(req) : await computeMapChunkShared(req);
    parentPort!.postMessage({ id: req.id, backend });
  } catch (e) {
    parentPort!.postMessage({ id: req.id, error: e instanceof Error ? e.message : String(e) });
  }
});
