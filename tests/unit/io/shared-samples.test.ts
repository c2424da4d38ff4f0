/**
 * DecodeOptions.shared: the batch CLI asks for samples in SharedArrayBuffers so its worker threads read
 * them without a copy. The values must be those of the ordinary decode (itself checked against
 * wav-decoder in wav-reader.test.ts).
 */
import { describe, expect, it } from 'vitest';
import { memorySource } from '../../../workers/io/byte-source';
import { decodeRecording } from '../../../workers/io/decode-recording';
import { testChannels, wav } from './wav-fixtures';

describe('samples decoded into shared memory', () => {
  it.each([
    [16, false],
    [24, false],
    [32, true],
  ] as const)('%i-bit WAV (float %s): SharedArrayBuffer-backed, equal to the ordinary decode', async (bits, float) => {
    const bytes = wav(testChannels(2, 1500), { bits, float });
    const plain = await decodeRecording(memorySource(bytes, 'test.wav'), { channels: [1, 0] });
    const shared = await decodeRecording(memorySource(bytes, 'test.wav'), { channels: [1, 0], shared: true });
    for (let c = 0; c < 2; c++) {
      expect(plain.samples[c].buffer).toBeInstanceOf(ArrayBuffer);
      expect(shared.samples[c].buffer).toBeInstanceOf(SharedArrayBuffer);
      expect(Array.from(shared.samples[c])).toEqual(Array.from(plain.samples[c]));
    }
  });

  it('a CSV table too', async () => {
    const text = 'time,a,b\n' + Array.from({ length: 200 }, (_, i) => `${(i / 1000).toFixed(3)},${Math.sin(i / 7).toFixed(6)},${i % 5}`).join('\n');
    const bytes = new TextEncoder().encode(text);
    const plain = await decodeRecording(memorySource(bytes, 'test.csv'));
    const shared = await decodeRecording(memorySource(bytes, 'test.csv'), { shared: true });
    expect(shared.samples).toHaveLength(plain.samples.length);
    for (let c = 0; c < plain.samples.length; c++) {
      expect(shared.samples[c].buffer).toBeInstanceOf(SharedArrayBuffer);
      expect(Array.from(shared.samples[c])).toEqual(Array.from(plain.samples[c]));
    }
  });
});
