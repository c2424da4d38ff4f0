/**
 * Writes channels as a WAV file: PCM 8/16/24/32-bit or IEEE float 32/64, plain or
 * WAVE_FORMAT_EXTENSIBLE, optionally with extra chunks before or after the data. For the demo
 * generator, the tests and the benchmarks (the readers' input), not for the app's users.
 */
export interface WavWriteOptions {
  sampleRateHz: number;
  bits: 8 | 16 | 24 | 32 | 64;
  float?: boolean;
  extensible?: boolean;
  /** Extra chunks, e.g. [{id:'LIST', body}] before the data, and after it. */
  before?: { id: string; body: Uint8Array }[];
  after?: { id: string; body: Uint8Array }[];
}

const FULL_SCALE: Record<number, number> = { 8: 128, 16: 32768, 24: 8388608, 32: 2147483648 };

function chunk(id: string, body: Uint8Array): Uint8Array {
  const out = new Uint8Array(8 + body.byteLength + (body.byteLength & 1));
  const dv = new DataView(out.buffer);
  for (let i = 0; i < 4; i++) out[i] = id.charCodeAt(i);
  dv.setUint32(4, body.byteLength, true);
  out.set(body, 8);
  return out;
}

export function fmtChunkBody(channels: number, o: WavWriteOptions): Uint8Array {
  const tag = o.float ? 3 : 1;
  const blockAlign = (channels * o.bits) / 8;
  const body = new Uint8Array(o.extensible ? 40 : 16);
  const dv = new DataView(body.buffer);
  dv.setUint16(0, o.extensible ? 0xfffe : tag, true);
  dv.setUint16(2, channels, true);
  dv.setUint32(4, o.sampleRateHz, true);
  dv.setUint32(8, o.sampleRateHz * blockAlign, true);
  dv.setUint16(12, blockAlign, true);
  dv.setUint16(14, o.bits, true);
  if (o.extensible) {
    dv.setUint16(16, 22, true);
    dv.setUint16(18, o.bits, true);
    dv.setUint32(20, 0, true);
    dv.setUint16(24, tag, true);
    body.set([0x00, 0x00, 0x00, 0x00, 0x10, 0x00, 0x80, 0x00, 0x00, 0xaa, 0x00, 0x38, 0x9b, 0x71], 26);
  }
  return body;
}

/** Interleaves and encodes samples (±1 full scale for PCM, clipped) into a data chunk body. */
export function encodeSamples(channels: Float32Array[], o: WavWriteOptions, startFrame = 0, frameCount?: number): Uint8Array {
  const n = frameCount ?? channels[0].length - startFrame;
  const bytes = o.bits / 8;
  const out = new Uint8Array(n * channels.length * bytes);
  const dv = new DataView(out.buffer);
  let p = 0;
  for (let i = startFrame; i < startFrame + n; i++) {
    for (const ch of channels) {
      const x = ch[i];
      if (o.float) {
        if (o.bits === 64) dv.setFloat64(p, x, true);
        else dv.setFloat32(p, x, true);
      } else {
        const fs = FULL_SCALE[o.bits];
        const v = Math.max(-fs, Math.min(fs - 1, Math.round(x * fs)));
        if (o.bits === 8) out[p] = v + 128;
        else if (o.bits === 16) dv.setInt16(p, v, true);
        else if (o.bits === 24) {
          out[p] = v & 0xff;
          out[p + 1] = (v >> 8) & 0xff;
          out[p + 2] = (v >> 16) & 0xff;
        } else dv.setInt32(p, v, true);
      }
      p += bytes;
    }
  }
  return out;
}

export function writeWav(channels: Float32Array[], o: WavWriteOptions): Uint8Array {
  const parts = [
    ...(o.before ?? []).map((c) => chunk(c.id, c.body)),
    chunk('fmt ', fmtChunkBody(channels.length, o)),
    chunk('data', encodeSamples(channels, o)),
    ...(o.after ?? []).map((c) => chunk(c.id, c.body)),
  ];
  // fmt goes first unless extra chunks were asked for before the data: keep fmt ahead of them as well.
  const ordered = [parts[(o.before ?? []).length], ...parts.filter((_, i) => i !== (o.before ?? []).length)];
  const bodyBytes = 4 + ordered.reduce((n, p) => n + p.byteLength, 0);
  const out = new Uint8Array(8 + bodyBytes);
  out.set([0x52, 0x49, 0x46, 0x46], 0); // RIFF
  new DataView(out.buffer).setUint32(4, bodyBytes, true);
  out.set([0x57, 0x41, 0x56, 0x45], 8); // WAVE
  let at = 12;
  for (const p of ordered) {
    out.set(p, at);
    at += p.byteLength;
  }
  return out;
}
