/**
 * Streams the samples of a WAV data chunk into one Float32Array per requested channel, block by block,
 * so memory holds the output channels plus one block. PCM is scaled to ±1 full scale by dividing by
 * 2^(bits−1) (8-bit PCM is unsigned, offset 128), the convention of AES17 full-scale and of most
 * acquisition software (common practice); IEEE float is taken as it is, with NaN/±Inf reported and read as 0.
 *
 * Byte order: WAV is little-endian; the typed-array views assume a little-endian host (x86, ARM).
 */
import type { ByteSource } from './byte-source';
import type { NonFiniteReport, ProgressCallback, WavLayout } from './recording';
import { RecordingError } from './recording-error';
import { isFloat } from './wav-header';

/**
 * Read in blocks of this size, the next one asked for while the current one is converted: in a browser
 * every File.slice read costs a round trip to the browser process (a 37 MB file read in 4 MiB blocks
 * took 280-400 ms in headless Chromium, in 16 MiB blocks 200 ms, in one read 120 ms), so fewer, overlapped
 * reads pay it less (8 MiB keeps a cancel prompt).
 */
const BLOCK_BYTES = 8 * 1024 * 1024;
const READS_IN_FLIGHT = 3;

export interface WavSampleRequest {
  layout: WavLayout;
  channelCount: number;
  frames: number;
  channels: number[];
  onProgress?: ProgressCallback;
  isCancelled?: () => boolean;
  /** Output channels in SharedArrayBuffers (DecodeOptions.shared). */
  shared?: boolean;
  /** Arrays of `frames` samples to decode into (DecodeOptions.into), one per channel asked. */
  into?: Float32Array[];
}

/** Typed views need an offset that is a multiple of the element size; copy when the slice is not. */
function aligned(bytes: Uint8Array, size: number): Uint8Array {
  return bytes.byteOffset % size === 0 ? bytes : bytes.slice();
}

export async function readWavSamples(
  source: ByteSource,
  req: WavSampleRequest,
): Promise<{ samples: Float32Array[]; nonFinite: NonFiniteReport[] }> {
  const { layout, channelCount, frames, channels } = req;
  const framesPerBlock = Math.max(1, Math.floor(BLOCK_BYTES / layout.blockAlign));
  const out = channels.map((_, c) => req.into?.[c] ?? (req.shared ? new Float32Array(new SharedArrayBuffer(frames * 4)) : new Float32Array(frames)));
  const bad = channels.map((channel) => ({ channel, count: 0, firstFrame: -1 }));
  if (channels.length === 0) return { samples: [], nonFinite: [] };

  const readBlock = (start: number) => source.read(layout.dataOffset + start * layout.blockAlign, Math.min(framesPerBlock, frames - start) * layout.blockAlign);
  // A few reads in flight: a browser serves each slice of a File in a round trip to its own process,
  // and one at a time leaves the pipe idle between them (measured here: 8 MiB one ahead ~160 MB/s,
  // three ahead ~280 MB/s).
  const ahead: Promise<Uint8Array>[] = [];
  let asked = 0;
  const fill = () => {
    while (ahead.length < READS_IN_FLIGHT && asked < frames) {
      const read = readBlock(asked);
      read.catch(() => undefined); // handled where awaited; one left behind by an error is no unhandled rejection
      ahead.push(read);
      asked += framesPerBlock;
    }
  };
  fill();
  for (let start = 0; start < frames; start += framesPerBlock) {
    if (req.isCancelled?.()) {
      throw new RecordingError('CANCELLED', `Reading ${source.name} was stopped.`);
    }
    const n = Math.min(framesPerBlock, frames - start);
    const offset = layout.dataOffset + start * layout.blockAlign;
    const bytes = await ahead.shift()!;
    fill();
    if (bytes.byteLength < n * layout.blockAlign) {
      throw new RecordingError('READ_FAILED', `${source.name}: only ${bytes.byteLength} bytes could be read at byte offset ${offset}.`);
    }
    for (let c = 0; c < channels.length; c++) decodeWavChannel(bytes, layout, channelCount, channels[c], n, out[c], start, bad[c]);
    req.onProgress?.(Math.min(1, (start + n) / frames));
  }
  return { samples: out, nonFinite: bad.filter((b) => b.count > 0) };
}

/**
 * Channel `ch` of the n whole frames at the start of `bytes` (a WAV data chunk's bytes from a frame
 * boundary) into dst[start…start+n), scaled as this module's header says; NaN/±Inf read as 0 and counted.
 */
export function decodeWavChannel(
  bytes: Uint8Array,
  layout: WavLayout,
  channelCount: number,
  ch: number,
  n: number,
  dst: Float32Array,
  start: number,
  bad: NonFiniteReport,
): void {
  const bytesPerSample = layout.bitsPerSample / 8;
  const a = bytesPerSample === 2 || bytesPerSample === 4 || bytesPerSample === 8 ? aligned(bytes, bytesPerSample) : bytes;
  const count = n * channelCount;
  if (isFloat(layout)) {
    const v = bytesPerSample === 4 ? new Float32Array(a.buffer, a.byteOffset, count) : new Float64Array(a.buffer, a.byteOffset, count);
    decodeFloat(v, ch, channelCount, n, dst, start, bad);
  } else if (bytesPerSample === 2) {
    const v = new Int16Array(a.buffer, a.byteOffset, count);
    for (let i = 0, j = ch; i < n; i++, j += channelCount) dst[start + i] = v[j] * (1 / 32768);
  } else if (bytesPerSample === 3) {
    const stride = layout.blockAlign;
    for (let i = 0, j = ch * 3; i < n; i++, j += stride) {
      const x = (a[j] | (a[j + 1] << 8) | (a[j + 2] << 16)) << 8; // sign-extend from bit 23
      dst[start + i] = (x >> 8) * (1 / 8388608);
    }
  } else if (bytesPerSample === 4) {
    const v = new Int32Array(a.buffer, a.byteOffset, count);
    for (let i = 0, j = ch; i < n; i++, j += channelCount) dst[start + i] = v[j] * (1 / 2147483648);
  } else {
    for (let i = 0, j = ch; i < n; i++, j += channelCount) dst[start + i] = (a[j] - 128) * (1 / 128);
  }
}

function decodeFloat(
  v: Float32Array | Float64Array,
  ch: number,
  stride: number,
  n: number,
  dst: Float32Array,
  start: number,
  bad: NonFiniteReport,
): void {
  if (stride === 1 && v instanceof Float32Array) {
    // One float32 channel: a block copy, then a read-only pass for NaN/±Inf (x − x is 0 only when finite),
    // several times faster than converting sample by sample into shared memory.
    dst.set(v.subarray(0, n), start);
    replaceNonFinite(dst, start, start + n, bad);
    return;
  }
  for (let i = 0, j = ch; i < n; i++, j += stride) {
    const x = v[j];
    if (Number.isFinite(x)) dst[start + i] = x;
    else {
      dst[start + i] = 0;
      if (bad.count++ === 0) bad.firstFrame = start + i;
    }
  }
}

/** NaN and ±Inf in x[from…to) set to 0 and counted (x − x is 0 only for a finite x). */
export function replaceNonFinite(x: Float32Array, from: number, to: number, bad: NonFiniteReport): void {
  for (let i = from; i < to; i++) {
    const v = x[i];
    if (v - v !== 0) {
      x[i] = 0;
      if (bad.count++ === 0) bad.firstFrame = i;
    }
  }
}
