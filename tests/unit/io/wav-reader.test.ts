/**
 * The streaming WAV reader against two outside references:
 * - the sample values the file format defines (RIFF/WAVE 1.0 spec: little-endian two's complement,
 *   8-bit offset binary; IEEE 754 for float), checked on hand-made bytes;
 * - wav-decoder (an independent npm decoder; `symmetric: true` is the same ±2^(n−1) full-scale
 *   convention) on the same generated files.
 */
import wavDecoder from 'wav-decoder';
import { describe, expect, it } from 'vitest';
import { memorySource } from '../../../workers/io/byte-source';
import { decodeRecording } from '../../../workers/io/decode-recording';
import { readWavHeader } from '../../../workers/io/wav-header';
import { dataBody, enc, fmt, rf64, riff, testChannels, wav } from './wav-fixtures';

const decode = (bytes: Uint8Array, channels?: number[]) => decodeRecording(memorySource(bytes, 'test.wav'), { channels });

describe('WAV reader: sample formats', () => {
  it.each([
    [16, false],
    [24, false],
    [32, false],
    [32, true],
    [64, true],
  ] as const)('%i-bit %s matches wav-decoder (symmetric full scale)', async (bits, float) => {
    const chs = testChannels(3, 1000);
    const bytes = wav(chs, { bits, float });
    const ours = await decode(bytes);
    const ref = await wavDecoder.decode(bytes.buffer.slice(0) as ArrayBuffer, { symmetric: true });
    expect(ours.header).toMatchObject({ sampleRateHz: 8000, frames: 1000, durationS: 0.125 });
    expect(ours.samples).toHaveLength(3);
    for (let c = 0; c < 3; c++) {
      // both in float32; wav-decoder works in float64 before storing, so allow one float32 ulp near 1
      for (let i = 0; i < 1000; i += 7) expect(ours.samples[c][i]).toBeCloseTo(ref.channelData[c][i], 7);
    }
  });

  it('8-bit PCM is unsigned with 128 as zero (RIFF/WAVE 1.0)', async () => {
    const bytes = riff([
      { id: 'fmt ', body: fmt(1, { bits: 8 }) },
      { id: 'data', body: new Uint8Array([0, 64, 128, 192, 255]) },
    ]);
    const { samples } = await decode(bytes);
    expect([...samples[0]]).toEqual([-1, -0.5, 0, 0.5, 127 / 128]);
  });

  it('16-bit PCM: −32768 is −1 full scale and 16384 is 0.5', async () => {
    const body = new Uint8Array(6);
    const dv = new DataView(body.buffer);
    dv.setInt16(0, -32768, true);
    dv.setInt16(2, 16384, true);
    dv.setInt16(4, 32767, true);
    const { samples } = await decode(riff([{ id: 'fmt ', body: fmt(1) }, { id: 'data', body }]));
    expect([...samples[0]]).toEqual([-1, 0.5, 32767 / 32768]);
  });

  it('24-bit PCM sign-extends from bit 23: 0x800000 is −1, 0x400000 is 0.5', async () => {
    const body = new Uint8Array([0x00, 0x00, 0x80, 0x00, 0x00, 0x40, 0xff, 0xff, 0xff]);
    const { samples } = await decode(riff([{ id: 'fmt ', body: fmt(1, { bits: 24 }) }, { id: 'data', body }]));
    expect([...samples[0]]).toEqual([-1, 0.5, -1 / 8388608]);
  });

  it('WAVE_FORMAT_EXTENSIBLE with the PCM and the IEEE-float sub-format', async () => {
    const chs = testChannels(2, 300);
    for (const o of [{ bits: 24 as const }, { bits: 32 as const, float: true }]) {
      const plain = await decode(wav(chs, o));
      const ext = await decode(wav(chs, { ...o, extensible: true }));
      expect(ext.header.wav?.formatTag).toBe(0xfffe);
      expect(ext.header.wav?.subFormatTag).toBe(o.float ? 3 : 1);
      expect(ext.samples).toEqual(plain.samples);
    }
  });

  it('reads 1 and 64 channels, and only the channels asked for, in the order asked', async () => {
    const one = await decode(wav(testChannels(1, 50)));
    expect(one.samples).toHaveLength(1);
    const chs = testChannels(64, 40);
    const all = await decode(wav(chs));
    expect(all.header.channels).toHaveLength(64);
    const some = await decode(wav(chs), [63, 0, 17]);
    expect(some.channelIndices).toEqual([63, 0, 17]);
    expect(some.samples).toEqual([all.samples[63], all.samples[0], all.samples[17]]);
  });

  it('skips unknown chunks before and after data, odd-sized ones with their pad byte', async () => {
    const chs = testChannels(2, 100);
    const bytes = riff([
      { id: 'JUNK', body: new Uint8Array(3) }, // odd size: a pad byte follows
      { id: 'fmt ', body: fmt(2) },
      { id: 'bext', body: enc('odd!!') },
      { id: 'data', body: dataBody(chs) },
      { id: 'LIST', body: enc('INFOISFT') },
      { id: 'cue ', body: new Uint8Array(5) },
    ]);
    const ours = await decode(bytes);
    const plain = await decode(wav(chs));
    expect(ours.header.frames).toBe(100);
    expect(ours.samples).toEqual(plain.samples);
    expect(ours.header.warnings).toEqual([]);
  });

  it('reads RF64 with the data size from ds64 (EBU Tech 3306)', async () => {
    const chs = testChannels(2, 500);
    const ours = await decode(rf64(chs, { bits: 24 }));
    expect(ours.header.wav?.rf64).toBe(true);
    expect(ours.header.frames).toBe(500);
    expect(ours.samples).toEqual((await decode(wav(chs, { bits: 24 }))).samples);
  });

  it('reports NaN and infinite float samples, reads them as 0, and keeps the rest', async () => {
    const ch = Float32Array.from([0.1, NaN, 0.3, Infinity, -Infinity, 0.6]);
    const { samples, nonFinite } = await decode(wav([ch], { bits: 32, float: true }));
    expect([...samples[0]]).toEqual([Math.fround(0.1), 0, Math.fround(0.3), 0, 0, Math.fround(0.6)]);
    expect(nonFinite).toEqual([{ channel: 0, count: 3, firstFrame: 1 }]);
  });

  it('streams across block boundaries (frames of a multi-megabyte file land in order)', async () => {
    const frames = 700_000; // 2.8 MB per channel of 16-bit stereo: more than one 4 MiB block
    const chs = testChannels(2, frames, 51200);
    const { samples } = await decode(wav(chs, { bits: 32, float: true, sampleRateHz: 51200 }));
    expect(samples[1][frames - 1]).toBe(chs[1][frames - 1]);
    expect(samples[0][524_288]).toBe(chs[0][524_288]);
  });

  it('reports progress up to 1 and stops when cancelled', async () => {
    // 12 MB of samples: more than one read block (8 MiB), so there is a moment to stop between them
    const bytes = wav(testChannels(2, 3_000_000), { bits: 16 });
    const seen: number[] = [];
    await decodeRecording(memorySource(bytes, 'p.wav'), { onProgress: (f) => seen.push(f) });
    expect(seen.at(-1)).toBe(1);
    expect(seen.every((f, i) => i === 0 || f >= seen[i - 1])).toBe(true);
    let calls = 0;
    await expect(
      decodeRecording(memorySource(bytes, 'p.wav'), { isCancelled: () => ++calls > 1 }),
    ).rejects.toMatchObject({ code: 'CANCELLED' });
  });
});

describe('WAV reader: bad input gets one sentence that names the problem and where', () => {
  const header = (bytes: Uint8Array, name = 'bad.wav') => readWavHeader(memorySource(bytes, name));
  const cases: [string, () => Uint8Array, string, RegExp][] = [
    ['an empty file', () => new Uint8Array(0), 'EMPTY_FILE', /bad\.wav is empty \(0 bytes\)/],
    ['not RIFF/WAVE', () => enc('ID3\x03 this is an mp3'), 'NOT_RIFF_WAVE', /not a RIFF\/WAVE file: bytes 0–11 read "ID3/],
    ['RIFF but not WAVE', () => riff([], 'AVI '), 'NOT_RIFF_WAVE', /not a RIFF\/WAVE/],
    ['no fmt chunk', () => riff([{ id: 'data', body: new Uint8Array(8) }]), 'NO_FMT_CHUNK', /no fmt chunk/],
    ['no data chunk', () => riff([{ id: 'fmt ', body: fmt(2) }]), 'NO_DATA_CHUNK', /no data chunk/],
    ['zero channels', () => riff([{ id: 'fmt ', body: fmt(0) }, { id: 'data', body: new Uint8Array(4) }]), 'ZERO_CHANNELS', /0 channels/],
    [
      'zero sample rate',
      () => riff([{ id: 'fmt ', body: fmt(1, { sampleRateHz: 0 }) }, { id: 'data', body: new Uint8Array(4) }]),
      'ZERO_SAMPLE_RATE',
      /sample rate of 0 Hz/,
    ],
    [
      'an unsupported format tag, named',
      () => {
        const f = fmt(1);
        new DataView(f.buffer).setUint16(0, 0x0011, true);
        return riff([{ id: 'fmt ', body: f }, { id: 'data', body: new Uint8Array(4) }]);
      },
      'UNSUPPORTED_FORMAT',
      /format tag 0x0011 \(IMA ADPCM\)/,
    ],
    [
      'an unsupported bit depth',
      () => {
        const f = fmt(1);
        new DataView(f.buffer).setUint16(14, 12, true);
        new DataView(f.buffer).setUint16(12, 2, true);
        return riff([{ id: 'fmt ', body: f }, { id: 'data', body: new Uint8Array(4) }]);
      },
      'UNSUPPORTED_BIT_DEPTH',
      /12-bit integer PCM samples; Fanlight reads 8, 16, 24, 32-bit/,
    ],
    [
      'a chunk whose name is not text, with its byte offset',
      () => riff([{ id: 'fmt ', body: fmt(1) }, { id: '\x00\x01\x02\x03', body: new Uint8Array(4) }]),
      'BAD_CHUNK',
      /broken chunk at byte offset 36/,
    ],
    ['a short fmt chunk', () => riff([{ id: 'fmt ', body: new Uint8Array(10) }]), 'BAD_FMT_CHUNK', /holds 10 bytes; it needs at least 16/],
  ];
  it.each(cases)('%s', async (_label, make, code, message) => {
    const err = await header(make()).catch((e) => e);
    expect(err).toMatchObject({ name: 'RecordingError', code });
    expect(err.message).toMatch(message);
  });

  it('a data chunk larger than the file: reads the whole frames there and says so', async () => {
    const chs = testChannels(2, 100);
    const bytes = riff([
      { id: 'fmt ', body: fmt(2) },
      { id: 'data', body: dataBody(chs).subarray(0, 250), size: 400 },
    ]);
    const r = await decode(bytes);
    expect(r.header.frames).toBe(62);
    expect(r.header.warnings[0]).toMatch(/data chunk says 400 bytes but the file holds 250 after byte offset 44 .*62 whole frames/);
  });
});
