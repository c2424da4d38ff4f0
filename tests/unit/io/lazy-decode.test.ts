/**
 * Opening a wide recording without decoding it: a WAV opened lazily gives its header and no channels,
 * and reads none of its sample data; a channel asked later decodes exactly as the whole read does
 * (reference: the wav-decoder package reads the same bytes, in wav-reader.test.ts).
 */
import { describe, expect, it } from 'vitest';
import { memorySource, type ByteSource } from '../../../workers/io/byte-source';
import { decodeRecording } from '../../../workers/io/decode-recording';
import { testChannels, wav } from './wav-fixtures';

/** Counts the bytes read through a source. */
function counting(source: ByteSource): { source: ByteSource; bytesRead: () => number } {
  let n = 0;
  return {
    source: { ...source, read: (offset: number, length: number) => ((n += length), source.read(offset, length)) },
    bytesRead: () => n,
  };
}

describe('lazy opening (only the channels in use are decoded)', () => {
  const chs = testChannels(8, 48_000);
  const bytes = wav(chs, { bits: 24 });

  it('a lazily opened WAV has its header and no samples, and reads little of the file', async () => {
    const c = counting(memorySource(bytes, 'wide.wav'));
    const rec = await decodeRecording(c.source, { lazy: true });
    expect(rec.header.channels).toHaveLength(8);
    expect(rec.header.frames).toBe(48_000);
    expect(rec.channelIndices).toEqual([]);
    expect(rec.samples).toEqual([]);
    // the header and the sniffing read a few hundred bytes, not the 1.1 MB of samples
    expect(c.bytesRead()).toBeLessThan(64 * 1024);
  });

  it('a channel read later equals the same channel of a whole read', async () => {
    const whole = await decodeRecording(memorySource(bytes, 'wide.wav'));
    const one = await decodeRecording(memorySource(bytes, 'wide.wav'), { channels: [5, 2] });
    expect(one.channelIndices).toEqual([5, 2]);
    expect(one.samples[0]).toEqual(whole.samples[5]);
    expect(one.samples[1]).toEqual(whole.samples[2]);
  });

  it('a text table is read whole anyway, so a lazy open gives all its columns', async () => {
    const csv = new TextEncoder().encode('time,a,b\n0,1,2\n0.001,3,4\n0.002,5,6\n0.003,7,8\n');
    const rec = await decodeRecording(memorySource(csv, 'run.csv'), { lazy: true });
    expect(rec.channelIndices).toEqual([0, 1]);
    expect(Array.from(rec.samples[1])).toEqual([2, 4, 6, 8]);
  });
});
