/** Small WAV files built in memory for the reader tests (no binary blobs in the repository). */
import { encodeSamples, fmtChunkBody, writeWav, type WavWriteOptions } from '../../../workers/io/wav-writer';

/** A test signal: channel c is a sine of amplitude 0.5 at (c+1)·97 Hz plus a ramp, so channels differ. */
export function testChannels(channels: number, frames: number, fs = 8000): Float32Array[] {
  return Array.from({ length: channels }, (_, c) =>
    Float32Array.from({ length: frames }, (_, i) => 0.5 * Math.sin((2 * Math.PI * (c + 1) * 97 * i) / fs) + 0.4 * (i / frames) - 0.2),
  );
}

export const wav = (chs: Float32Array[], o: Partial<WavWriteOptions> = {}) => writeWav(chs, { sampleRateHz: 8000, bits: 16, ...o });

const enc = (s: string) => new TextEncoder().encode(s);

/** Raw RIFF assembly for the malformed cases: a list of [id, body] chunks with an optional size override. */
export function riff(chunks: { id: string; body: Uint8Array; size?: number; noPad?: boolean }[], form = 'WAVE', riffId = 'RIFF'): Uint8Array {
  const parts = chunks.map((c) => {
    const pad = c.noPad ? 0 : c.body.byteLength & 1;
    const out = new Uint8Array(8 + c.body.byteLength + pad);
    out.set(enc(c.id.padEnd(4).slice(0, 4)), 0);
    new DataView(out.buffer).setUint32(4, c.size ?? c.body.byteLength, true);
    out.set(c.body, 8);
    return out;
  });
  const total = 12 + parts.reduce((n, p) => n + p.byteLength, 0);
  const out = new Uint8Array(total);
  out.set(enc(riffId), 0);
  new DataView(out.buffer).setUint32(4, total - 8, true);
  out.set(enc(form), 8);
  let at = 12;
  for (const p of parts) {
    out.set(p, at);
    at += p.byteLength;
  }
  return out;
}

export function fmt(channels: number, o: Partial<WavWriteOptions> = {}): Uint8Array {
  return fmtChunkBody(channels, { sampleRateHz: 8000, bits: 16, ...o });
}

export function dataBody(chs: Float32Array[], o: Partial<WavWriteOptions> = {}): Uint8Array {
  return encodeSamples(chs, { sampleRateHz: 8000, bits: 16, ...o });
}

/** RF64 (EBU Tech 3306): RF64 header, ds64 with the 64-bit data size, and data whose 32-bit size is 0xFFFFFFFF. */
export function rf64(chs: Float32Array[], o: Partial<WavWriteOptions> = {}): Uint8Array {
  const data = dataBody(chs, o);
  const ds64 = new Uint8Array(28);
  const dv = new DataView(ds64.buffer);
  const riffSize = 4 + (8 + 28) + (8 + 16) + (8 + data.byteLength);
  dv.setUint32(0, riffSize, true);
  dv.setUint32(8, data.byteLength, true); // low 32 bits of the data size
  dv.setUint32(12, 0, true);
  dv.setUint32(16, chs[0].length, true);
  return riff(
    [
      { id: 'ds64', body: ds64 },
      { id: 'fmt ', body: fmt(chs.length, o) },
      { id: 'data', body: data, size: 0xffffffff },
    ],
    'WAVE',
    'RF64',
  );
}

export { enc };
