/**
 * Property-based fuzzing (fast-check): mutated headers and random bytes thrown at the WAV reader must
 * never hang, never crash, and never throw anything but RecordingError.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { memorySource } from '../../../workers/io/byte-source';
import { decodeRecording } from '../../../workers/io/decode-recording';
import { RecordingError } from '../../../workers/io/recording-error';
import { rf64, testChannels, wav } from './wav-fixtures';

const base = [
  wav(testChannels(2, 64)),
  wav(testChannels(3, 40), { bits: 24, extensible: true }),
  wav(testChannels(1, 50), { bits: 32, float: true }),
  rf64(testChannels(2, 30)),
];

async function readsOrRefuses(bytes: Uint8Array): Promise<void> {
  try {
    const r = await decodeRecording(memorySource(bytes, 'fuzz.wav'));
    // when it reads, what it returns is consistent
    expect(r.samples).toHaveLength(r.header.channels.length);
    for (const s of r.samples) expect(s.length).toBe(r.header.frames);
  } catch (e) {
    if (!(e instanceof RecordingError)) throw e;
    expect(e.message.length).toBeGreaterThan(10);
  }
}

describe('WAV reader fuzzing', () => {
  it('survives thousands of mutated headers', async () => {
    await fc.assert(
      fc.asyncProperty(
        fc.constantFrom(...base.keys()),
        fc.array(fc.tuple(fc.nat(80), fc.nat(255)), { minLength: 1, maxLength: 8 }),
        fc.option(fc.nat(400), { nil: undefined }),
        async (which, edits, cut) => {
          const bytes = base[which].slice(0, cut);
          for (const [at, value] of edits) if (at < bytes.length) bytes[at] = value;
          await readsOrRefuses(bytes);
        },
      ),
      { numRuns: 3000 },
    );
  });

  it('survives random byte strings, with and without a RIFF/WAVE start', async () => {
    await fc.assert(
      fc.asyncProperty(fc.uint8Array({ maxLength: 300 }), fc.boolean(), async (random, riffStart) => {
        const bytes = riffStart ? new Uint8Array([...new TextEncoder().encode('RIFF\x00\x00\x00\x00WAVE'), ...random]) : random;
        await readsOrRefuses(bytes);
      }),
      { numRuns: 2000 },
    );
  });

  it('survives huge chunk sizes that point far past the end', async () => {
    await fc.assert(
      fc.asyncProperty(fc.nat(), fc.constantFrom(16, 40), async (size, where) => {
        const bytes = base[0].slice();
        new DataView(bytes.buffer).setUint32(where, size >>> 0, true);
        await readsOrRefuses(bytes);
      }),
      { numRuns: 1000 },
    );
  });
});
