import { createHash } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { blobSource, memorySource } from '../../../workers/io/byte-source';
import { fingerprint } from '../../../workers/io/fingerprint';
import { testChannels, wav } from './wav-fixtures';

describe('fingerprint', () => {
  it('is SHA-256 of the size, the head and eight sampled blocks (checked against node:crypto)', async () => {
    const bytes = new Uint8Array(1000).map((_, i) => (i * 7) & 0xff);
    // Small file: the head is the whole file and each sampled block reads from its offset to the end.
    const h = createHash('sha256').update(`fanlight-v1:1000:`).update(bytes);
    for (let i = 1; i <= 8; i++) h.update(bytes.subarray(Math.floor((1000 * i) / 9)));
    expect(await fingerprint(memorySource(bytes))).toBe(h.digest('hex'));
  });

  it('is the same from a Blob and from memory, and changes when one sample changes', async () => {
    const bytes = wav(testChannels(2, 200_000));
    const a = await fingerprint(memorySource(bytes));
    expect(await fingerprint(blobSource(new Blob([new Uint8Array(bytes)]), 'x.wav'))).toBe(a);
    const edited = bytes.slice();
    edited[Math.floor(bytes.length / 9) + 100] ^= 1;
    expect(await fingerprint(memorySource(edited))).not.toBe(a);
  });
});
