/**
 * Opens a recording of either kind: WAV/RF64 by its RIFF signature, else CSV/TSV by its name or its
 * text. The entry point the decode worker and the batch CLI share.
 */
import type { ByteSource } from './byte-source';
import { readCsv } from './csv-reader';
import type { DecodeOptions, DecodedRecording, RecordingFormat, RecordingHeader } from './recording';
import { RecordingError } from './recording-error';
import { readWavHeader } from './wav-header';
import { readWavSamples } from './wav-samples';

const TEXT_NAME = /\.(csv|tsv|txt|dat)$/i;

export async function sniffFormat(source: ByteSource): Promise<RecordingFormat> {
  if (source.size === 0) throw new RecordingError('EMPTY_FILE', `${source.name} is empty (0 bytes).`);
  const head = await source.read(0, 512);
  const id = String.fromCharCode(...head.subarray(0, 4));
  if (id === 'RIFF' || id === 'RF64' || /\.wav$/i.test(source.name)) return 'wav';
  if (TEXT_NAME.test(source.name)) return 'csv';
  // Text tables are printable; a stray NUL or control byte means an unknown binary file.
  const binary = head.some((b) => b === 0 || (b < 0x09) || (b > 0x0d && b < 0x20));
  if (!binary) return 'csv';
  throw new RecordingError('UNKNOWN_FORMAT', `${source.name} is neither a WAV file nor a text table (CSV or TSV).`);
}

function checkChannels(name: string, header: RecordingHeader, channels: number[]): void {
  for (const c of channels) {
    if (!Number.isInteger(c) || c < 0 || c >= header.channels.length) {
      throw new RecordingError('BAD_CHANNEL', `${name} has ${header.channels.length} channels; there is no channel ${c + 1}.`);
    }
  }
}

/** The header only (a full read for CSV, where the row count is the frame count). */
export async function readRecordingHeader(source: ByteSource, options: DecodeOptions = {}): Promise<RecordingHeader> {
  if ((await sniffFormat(source)) === 'wav') return readWavHeader(source);
  return (await readCsv(source, { ...options.csv, channels: [], onProgress: options.onProgress })).header;
}

function toShared(x: Float32Array): Float32Array {
  const copy = new Float32Array(new SharedArrayBuffer(x.byteLength));
  copy.set(x);
  return copy;
}

export async function decodeRecording(source: ByteSource, options: DecodeOptions = {}): Promise<DecodedRecording> {
  const format = await sniffFormat(source);
  if (format === 'csv') {
    const rec = await readCsv(source, {
      ...options.csv,
      channels: options.channels,
      onProgress: options.onProgress,
      isCancelled: options.isCancelled,
    });
    if (options.shared) rec.samples = rec.samples.map(toShared);
    return rec;
  }
  const header = await readWavHeader(source);
  const channels = options.channels ?? header.channels.map((c) => c.index);
  checkChannels(source.name, header, channels);
  const { samples, nonFinite } = await readWavSamples(source, {
    layout: header.wav!,
    channelCount: header.channels.length,
    frames: header.frames,
    channels,
    onProgress: options.onProgress,
    isCancelled: options.isCancelled,
    shared: options.shared,
  });
  return { header, channelIndices: channels, samples, nonFinite };
}
