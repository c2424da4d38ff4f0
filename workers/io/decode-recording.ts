/**
 * Opens a recording of any kind: WAV/RF64 by its RIFF signature, MAT-files (level 5 by their text
 * header, v7.3 and HDF5 by the HDF5 signature at byte 0 or 512), UFF 58 by its "-1" delimiter line,
 * else by the name's extension, else CSV/TSV by its text. The entry point the decode worker and the
 * batch CLI share.
 */
import type { ByteSource } from './byte-source';
import { readCsv } from './csv-reader';
import { hdf5SignatureAt, readHdf5 } from './hdf5-reader';
import { isMat5Header, isMat73Header, readMat5 } from './mat-reader';
import type { DecodeOptions, DecodedRecording, RecordingFormat, RecordingHeader } from './recording';
import { RecordingError } from './recording-error';
import { readWavHeader } from './wav-header';
import { readWavSamples } from './wav-samples';
import { looksLikeUff, readUff } from './uff-reader';

const TEXT_NAME = /\.(csv|tsv|txt|dat)$/i;

export async function sniffFormat(source: ByteSource): Promise<RecordingFormat> {
  if (source.size === 0) throw new RecordingError('EMPTY_FILE', `${source.name} is empty (0 bytes).`);
  const head = await source.read(0, 512);
  const id = String.fromCharCode(...head.subarray(0, 4));
  if (id === 'RIFF' || id === 'RF64') return 'wav';
  if (isMat5Header(head) || isMat73Header(head)) return 'mat';
  if (hdf5SignatureAt(head) >= 0) return 'hdf5';
  if (/\.wav$/i.test(source.name)) return 'wav';
  if (/\.mat$/i.test(source.name)) return 'mat';
  if (/\.(h5|hdf5|he5)$/i.test(source.name)) return 'hdf5';
  if (/\.(uff|unv)$/i.test(source.name)) return 'uff';
  if (TEXT_NAME.test(source.name)) return 'csv';
  if (looksLikeUff(head)) return 'uff';
  // Text tables are printable; a stray NUL or control byte means an unknown binary file.
  const binary = head.some((b) => b === 0 || (b < 0x09) || (b > 0x0d && b < 0x20));
  if (!binary) return 'csv';
  throw new RecordingError('UNKNOWN_FORMAT', `${source.name} is none of the formats read here (WAV, CSV/TSV, MAT, HDF5, UFF 58).`);
}

export function checkChannels(name: string, header: RecordingHeader, channels: number[]): void {
  for (const c of channels) {
    if (!Number.isInteger(c) || c < 0 || c >= header.channels.length) {
      throw new RecordingError('BAD_CHANNEL', `${name} has ${header.channels.length} channels; there is no channel ${c + 1}.`);
    }
  }
}

/** MAT (level 5, or v7.3 through the HDF5 reader), HDF5 and UFF: read whole, the channels asked for. */
async function readAcquisition(source: ByteSource, format: 'mat' | 'hdf5' | 'uff', options: DecodeOptions): Promise<DecodedRecording> {
  const opts = { channels: options.channels, onProgress: options.onProgress, isCancelled: options.isCancelled };
  if (format === 'uff') return readUff(source, opts);
  if (format === 'hdf5') return readHdf5(source, opts);
  const head = await source.read(0, 1024);
  return hdf5SignatureAt(head) >= 0 ? readHdf5(source, opts) : readMat5(source, opts);
}

/** The header only (a full read for CSV, MAT, HDF5 and UFF). */
export async function readRecordingHeader(source: ByteSource, options: DecodeOptions = {}): Promise<RecordingHeader> {
  const format = await sniffFormat(source);
  if (format === 'wav') return readWavHeader(source);
  if (format !== 'csv') return (await readAcquisition(source, format, { ...options, channels: [] })).header;
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
  if (format !== 'wav') {
    const rec = await readAcquisition(source, format, options);
    if (options.shared) rec.samples = rec.samples.map(toShared);
    return rec;
  }
  const header = await readWavHeader(source);
  const channels = options.channels ?? (options.lazy ? [] : header.channels.map((c) => c.index));
  checkChannels(source.name, header, channels);
  if (options.into && (options.into.length !== channels.length || options.into.some((a) => a.length !== header.frames))) {
    throw new RangeError(`${source.name}: each array to decode into must hold ${header.frames} samples, one per channel asked.`);
  }
  const { samples, nonFinite } = await readWavSamples(source, {
    layout: header.wav!,
    channelCount: header.channels.length,
    frames: header.frames,
    channels,
    onProgress: options.onProgress,
    isCancelled: options.isCancelled,
    shared: options.shared,
    into: options.into,
  });
  return { header, channelIndices: channels, samples, nonFinite };
}
