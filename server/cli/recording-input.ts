/**
 * Opening a recording for a command: the channels it asks for, with --cal applied. Samples land in
 * SharedArrayBuffers, so the map's worker threads (thread-pool.ts) read them without a copy.
 */
import { decodeRecording } from '../../workers/io/decode-recording';
import type { DecodedRecording } from '../../workers/io/recording';
import { openFileSource } from './node-file-source';
import type { Options } from './options';
import { UsageError } from './options';

export async function readChannels(file: string, channels: number[]): Promise<DecodedRecording> {
  const source = await openFileSource(file);
  try {
    return await decodeRecording(source, { channels, shared: true });
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
