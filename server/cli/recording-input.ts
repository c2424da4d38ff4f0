/**
 * Opening a recording for a command: the channels it asks for, with --cal applied. Samples land in
 * SharedArrayBuffers, so the map's worker threads (thread-pool.ts) read them without a copy.
 */
import { decodeRecording } from '../../workers/io/decode-recording';
import type { DecodedRecording } from '../../workers/io/recording';
import { openFileSource } from './node-file-source';
import type { Options } from './options';
import { UsageError } from './options';

const warned = new Set<string>();

/**
 * What the reader noticed but read anyway (a data chunk cut short, a partial frame): one line each on
 * stderr, once per file, so the JSON on stdout stays clean and the exit status stays 0.
 */
export function reportWarnings(fileName: string, warnings: readonly string[]): void {
  for (const w of warnings) {
    const line = `warning: ${fileName}: ${w.replace(/\s+/g, ' ')}`;
    if (warned.has(line)) continue;
    warned.add(line);
    process.stderr.write(`${line}\n`);
  }
}

export async function readChannels(file: string, channels: number[]): Promise<DecodedRecording> {
  const source = await openFileSource(file);
  try {
    const rec = await decodeRecording(source, { channels, shared: true });
    reportWarnings(rec.header.fileName, rec.header.warnings);
    return rec;
  } finally {
    await source.close();
  }
}

/** --cal K: engineering units per file unit (multiplies the samples). */
export function calibrationFactor(o: Options): number {
  return o.number('cal', 1, (k) => (k !== 0 ? null : 'must not be 0.'));
}

export function scaled(x: Float32Array, k: number): Float32Array {
  if (k === 1) return x;
  for (let i = 0; i < x.length; i++) x[i] *= k;
  return x;
}

export function channelIndex(o: Options, key = 'channel'): number {
  if (!o.has(key)) throw new UsageError(`--${key} I is required (0 is the first channel).`);
  return o.integer(key);
}
