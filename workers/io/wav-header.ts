/**
 * Reads the layout of a RIFF/WAVE or RF64 file (EBU Tech 3306) from a ByteSource: format, channels,
 * rate, and where the samples lie. It reads chunk headers only, never the samples, so a file of any
 * size costs a few small reads.
 *
 * Why our own reader: wav-decoder (which the tests use as an independent reference) needs the whole
 * file in one ArrayBuffer, knows neither WAVE_FORMAT_EXTENSIBLE nor RF64, and cannot read a file that is
 * bigger than memory; here we stream by File.slice.
 *
 * References: Microsoft/IBM "Multimedia Programming Interface and Data Specifications 1.0" (1991),
 * RIFF and WAVE; Microsoft "WAVEFORMATEXTENSIBLE" (KSDATAFORMAT_SUBTYPE_PCM / _IEEE_FLOAT GUIDs);
 * EBU Tech 3306 "MBWF / RF64" (2009), the ds64 chunk.
 */
import type { ByteSource } from './byte-source';
import type { ChannelInfo, RecordingHeader, WavLayout } from './recording';
import { RecordingError } from './recording-error';

export const WAVE_FORMAT_PCM = 0x0001;
export const WAVE_FORMAT_IEEE_FLOAT = 0x0003;
export const WAVE_FORMAT_EXTENSIBLE = 0xfffe;
export const MAX_CHANNELS = 64;

const KNOWN_TAGS: Record<number, string> = {
  0x0002: 'Microsoft ADPCM',
  0x0006: 'A-law',
  0x0007: 'µ-law',
  0x0011: 'IMA ADPCM',
  0x0031: 'GSM 6.10',
  0x0050: 'MPEG',
  0x0055: 'MPEG Layer 3',
};
// The 14 bytes that follow the two-byte format tag in the KSDATAFORMAT_SUBTYPE_* GUIDs.
const GUID_TAIL = [0x00, 0x00, 0x00, 0x00, 0x10, 0x00, 0x80, 0x00, 0x00, 0xaa, 0x00, 0x38, 0x9b, 0x71];
const MAX_CHUNKS = 100_000; // a bound on the scan, whatever the bytes say
const U32_MAX = 0xffffffff;

const hex4 = (n: number) => `0x${n.toString(16).padStart(4, '0').toUpperCase()}`;
const ascii = (b: Uint8Array, at: number, n: number) => String.fromCharCode(...b.subarray(at, at + n));
const isChunkName = (b: Uint8Array, at: number) => {
  for (let i = at; i < at + 4; i++) if (b[i] < 0x20 || b[i] > 0x7e) return false;
  return true;
};
const u16 = (b: Uint8Array, at: number) => b[at] | (b[at + 1] << 8);
const u32 = (b: Uint8Array, at: number) => (b[at] | (b[at + 1] << 8) | (b[at + 2] << 16) | (b[at + 3] << 24)) >>> 0;
const u64 = (b: Uint8Array, at: number) => u32(b, at) + u32(b, at + 4) * 2 ** 32;
const printable = (s: string) => s.replace(/[^\x20-\x7e]/g, '?');

interface FmtFields {
  formatTag: number;
  subFormatTag: number | null;
  channels: number;
  sampleRateHz: number;
  blockAlign: number;
  bitsPerSample: number;
}

function parseFmt(name: string, b: Uint8Array, offset: number): FmtFields {
  if (b.byteLength < 16) {
    throw new RecordingError(
      'BAD_FMT_CHUNK',
      `${name}: the fmt chunk at byte offset ${offset} holds ${b.byteLength} bytes; it needs at least 16.`,
    );
  }
  const formatTag = u16(b, 0);
  const channels = u16(b, 2);
  const sampleRateHz = u32(b, 4);
  const blockAlign = u16(b, 12);
  const bitsPerSample = u16(b, 14);
  let subFormatTag: number | null = null;
  if (formatTag === WAVE_FORMAT_EXTENSIBLE) {
    if (b.byteLength < 40) {
      throw new RecordingError(
        'BAD_FMT_CHUNK',
        `${name}: the fmt chunk at byte offset ${offset} says WAVE_FORMAT_EXTENSIBLE but holds ${b.byteLength} bytes instead of 40.`,
      );
    }
    subFormatTag = u16(b, 24);
    if (!GUID_TAIL.every((v, i) => b[26 + i] === v)) {
      throw new RecordingError(
        'UNSUPPORTED_FORMAT',
        `${name} is WAVE_FORMAT_EXTENSIBLE with a sub-format GUID Fanlight does not know; export PCM or IEEE float.`,
      );
    }
  }
  return { formatTag, subFormatTag, channels, sampleRateHz, blockAlign, bitsPerSample };
}

function checkFmt(name: string, f: FmtFields): void {
  const effective = f.subFormatTag ?? f.formatTag;
  if (effective !== WAVE_FORMAT_PCM && effective !== WAVE_FORMAT_IEEE_FLOAT) {
    const which = f.subFormatTag !== null ? `sub-format ${hex4(effective)}` : `format tag ${hex4(effective)}`;
    const known = KNOWN_TAGS[effective] ? ` (${KNOWN_TAGS[effective]})` : '';
    throw new RecordingError(
      'UNSUPPORTED_FORMAT',
      `${name} uses WAV ${which}${known}, which Fanlight does not read; export PCM or IEEE float samples.`,
    );
  }
  if (f.channels === 0) throw new RecordingError('ZERO_CHANNELS', `${name}: the fmt chunk says the file has 0 channels.`);
  if (f.channels > MAX_CHANNELS) {
    throw new RecordingError('TOO_MANY_CHANNELS', `${name} has ${f.channels} channels; Fanlight reads up to ${MAX_CHANNELS}.`);
  }
  if (f.sampleRateHz === 0) throw new RecordingError('ZERO_SAMPLE_RATE', `${name}: the fmt chunk gives a sample rate of 0 Hz.`);
  const okBits = effective === WAVE_FORMAT_PCM ? [8, 16, 24, 32] : [32, 64];
  if (!okBits.includes(f.bitsPerSample)) {
    const kind = effective === WAVE_FORMAT_PCM ? 'integer PCM' : 'IEEE float';
    throw new RecordingError(
      'UNSUPPORTED_BIT_DEPTH',
      `${name} has ${f.bitsPerSample}-bit ${kind} samples; Fanlight reads ${okBits.join(', ')}-bit ${kind}.`,
    );
  }
  const expected = (f.channels * f.bitsPerSample) / 8;
  if (f.blockAlign !== expected) {
    throw new RecordingError(
      'BAD_FMT_CHUNK',
      `${name}: the fmt chunk gives a block size of ${f.blockAlign} bytes, but ${f.channels} channels of ${f.bitsPerSample} bits need ${expected}.`,
    );
  }
}

/** Reads the header of a WAV or RF64 file; throws RecordingError with a sentence naming what and where. */
export async function readWavHeader(source: ByteSource): Promise<RecordingHeader> {
  const name = source.name;
  if (source.size === 0) throw new RecordingError('EMPTY_FILE', `${name} is empty (0 bytes).`);
  const head = await source.read(0, 12);
  const riffId = head.byteLength >= 4 ? ascii(head, 0, 4) : '';
  if (head.byteLength < 12 || (riffId !== 'RIFF' && riffId !== 'RF64') || ascii(head, 8, 4) !== 'WAVE') {
    throw new RecordingError(
      'NOT_RIFF_WAVE',
      `${name} is not a RIFF/WAVE file: bytes 0–11 read "${printable(ascii(head, 0, Math.min(12, head.byteLength)))}" instead of "RIFF….WAVE".`,
    );
  }
  const rf64 = riffId === 'RF64';
  const warnings: string[] = [];
  let ds64DataBytes: number | null = null;
  let fmt: FmtFields | null = null;
  let data: { offset: number; declared: number } | null = null;
  let offset = 12;

  for (let n = 0; n < MAX_CHUNKS && offset + 8 <= source.size; n++) {
    const h = await source.read(offset, 8);
    if (h.byteLength < 8) break;
    if (!isChunkName(h, 0)) {
      if (fmt && data) {
        warnings.push(`Bytes after offset ${offset} are not a chunk and were ignored.`);
        break;
      }
      throw new RecordingError(
        'BAD_CHUNK',
        `${name} has a broken chunk at byte offset ${offset}: its name is not text, so the file may be cut or corrupt.`,
      );
    }
    const id = ascii(h, 0, 4);
    let size = u32(h, 4);
    const body = offset + 8;
    if (id === 'ds64') {
      if (!rf64) warnings.push(`A ds64 chunk at byte offset ${offset} in a RIFF file was ignored.`);
      else {
        const b = await source.read(body, Math.min(size, 28));
        if (b.byteLength < 16) {
          throw new RecordingError('BAD_CHUNK', `${name}: the ds64 chunk at byte offset ${offset} is shorter than 16 bytes.`);
        }
        ds64DataBytes = u64(b, 8);
      }
    } else if (id === 'fmt ') {
      if (body + size > source.size) {
        throw new RecordingError(
          'BAD_FMT_CHUNK',
          `${name}: the fmt chunk at byte offset ${offset} says ${size} bytes, but the file ends ${source.size - body} bytes after its header.`,
        );
      }
      fmt = parseFmt(name, await source.read(body, Math.min(size, 64)), offset);
    } else if (id === 'data') {
      if (rf64 && size === U32_MAX) {
        if (ds64DataBytes === null) {
          throw new RecordingError('BAD_CHUNK', `${name} is RF64, but no ds64 chunk before byte offset ${offset} gives the data size.`);
        }
        size = ds64DataBytes;
      }
      data = { offset: body, declared: size };
    }
    // Chunks are padded to an even size (RIFF): skip the pad byte after an odd-sized chunk.
    offset = body + size + (size & 1);
  }

  if (!fmt) throw new RecordingError('NO_FMT_CHUNK', `${name} has no fmt chunk, so its sample format is unknown.`);
  if (!data) throw new RecordingError('NO_DATA_CHUNK', `${name} has no data chunk: there are no samples to read.`);
  checkFmt(name, fmt);

  let dataBytes = data.declared;
  const available = source.size - data.offset;
  const cutShort = dataBytes > available;
  if (cutShort) {
    warnings.push(
      `The data chunk says ${dataBytes} bytes but the file holds ${available} after byte offset ${data.offset} (it was cut short); the ${Math.floor(available / fmt.blockAlign)} whole frames there were read.`,
    );
    dataBytes = available;
  }
  const frames = Math.floor(dataBytes / fmt.blockAlign);
  // a file cut short says so once: its message already counts the whole frames that were read
  if (dataBytes % fmt.blockAlign !== 0 && !cutShort) {
    warnings.push(`The data chunk ends in a partial frame of ${dataBytes % fmt.blockAlign} bytes, which was left out.`);
  }
  if (frames === 0) throw new RecordingError('NO_SAMPLES', `${name}: the data chunk at byte offset ${data.offset - 8} holds no whole sample frame.`);

  const wav: WavLayout = {
    formatTag: fmt.formatTag,
    subFormatTag: fmt.subFormatTag,
    bitsPerSample: fmt.bitsPerSample,
    blockAlign: fmt.blockAlign,
    dataOffset: data.offset,
    dataBytes: frames * fmt.blockAlign,
    rf64,
  };
  const channels: ChannelInfo[] = Array.from({ length: fmt.channels }, (_, i) => ({ index: i, name: `ch${i + 1}`, unit: null }));
  return {
    format: 'wav',
    fileName: name,
    sizeBytes: source.size,
    sampleRateHz: fmt.sampleRateHz,
    frames,
    durationS: frames / fmt.sampleRateHz,
    channels,
    warnings,
    wav,
  };
}

export const isFloat = (w: WavLayout) => (w.subFormatTag ?? w.formatTag) === WAVE_FORMAT_IEEE_FLOAT;
