/**
 * Reads a MATLAB MAT-file of level 5 (what `save` writes up to -v7, and scipy.io.savemat): numeric
 * vectors and matrices of class double, single and int8 … uint64, compressed (miCOMPRESSED, zlib) or not.
 * Follows "MAT-File Format", The MathWorks, 2013 (Level 5 MAT-files: the 128-byte header, data elements
 * with their 8-byte tags or 4-byte small-element tags, miMATRIX and its sub-elements). A v7.3 file is
 * HDF5 and goes to hdf5-reader.ts.
 *
 * Why our own reader: the npm packages that read level 5 are small one-person projects that turn a
 * whole file into nested JS objects (and bring their own zlib); this one reads element by element from
 * a ByteSource, so only one variable is in memory at a time besides the samples, and it inflates with
 * the platform's DecompressionStream('deflate'), present in browsers, in workers and in Node 20.
 */
import { assembleRecording, type NamedArray, type NumericArray } from './acquisition';
import type { ByteSource } from './byte-source';
import type { DecodedRecording } from './recording';
import { RecordingError } from './recording-error';

/** zlib-wrapped deflate → bytes. Injected where a platform has no DecompressionStream. */
export type Inflate = (bytes: Uint8Array) => Promise<Uint8Array>;

export const platformInflate: Inflate = async (bytes) => {
  const stream = new Blob([bytes as Uint8Array<ArrayBuffer>]).stream().pipeThrough(new DecompressionStream('deflate'));
  return new Uint8Array(await new Response(stream).arrayBuffer());
};

const HEADER_BYTES = 128;
// data types (miXXX) and array classes (mxXXX) of the level 5 format
const MI = { INT8: 1, UINT8: 2, INT16: 3, UINT16: 4, INT32: 5, UINT32: 6, SINGLE: 7, DOUBLE: 9, INT64: 12, UINT64: 13, MATRIX: 14, COMPRESSED: 15, UTF8: 16 } as const;
const NUMERIC_CLASSES = new Set([6, 7, 8, 9, 10, 11, 12, 13, 14, 15]);
const CLASS_NAMES: Record<number, string> = { 1: 'a cell array', 2: 'a struct', 3: 'an object', 4: 'text', 5: 'a sparse matrix' };
const ELEMENT_SIZE: Record<number, number> = { 1: 1, 2: 1, 3: 2, 4: 2, 5: 4, 6: 4, 7: 4, 9: 8, 12: 8, 13: 8, 16: 1 };

export function isMat5Header(head: Uint8Array): boolean {
  return String.fromCharCode(...head.subarray(0, 19)) === 'MATLAB 5.0 MAT-file';
}

export function isMat73Header(head: Uint8Array): boolean {
  return String.fromCharCode(...head.subarray(0, 19)) === 'MATLAB 7.3 MAT-file';
}

interface Element {
  type: number;
  bytes: Uint8Array;
  next: number;
}

/** One data element at `pos` of `buf` (small format when the upper half of the first word is set). */
function element(buf: Uint8Array, pos: number, le: boolean, where: () => string): Element {
  if (pos + 8 > buf.byteLength) throw new RecordingError('BAD_STRUCTURE', `${where()}: a data element is cut short.`);
  const view = new DataView(buf.buffer, buf.byteOffset + pos, 8);
  const word = view.getUint32(0, le);
  if (word >>> 16 !== 0) {
    const n = word >>> 16;
    if (n > 4) throw new RecordingError('BAD_STRUCTURE', `${where()}: a small data element claims ${n} bytes (at most 4).`);
    return { type: word & 0xffff, bytes: buf.subarray(pos + 4, pos + 4 + n), next: pos + 8 };
  }
  const n = view.getUint32(4, le);
  if (pos + 8 + n > buf.byteLength) throw new RecordingError('BAD_STRUCTURE', `${where()}: a data element claims ${n} bytes but only ${buf.byteLength - pos - 8} follow.`);
  return { type: word, bytes: buf.subarray(pos + 8, pos + 8 + n), next: pos + 8 + Math.ceil(n / 8) * 8 };
}

/** The element's values as numbers, in the file's byte order. */
function numbers(e: Element, le: boolean, where: () => string): NumericArray {
  const size = ELEMENT_SIZE[e.type];
  if (!size || e.type === MI.UTF8) throw new RecordingError('BAD_STRUCTURE', `${where()}: data of type ${e.type} is not numeric.`);
  const n = Math.floor(e.bytes.byteLength / size);
  const copy = e.bytes.slice(0, n * size); // aligned, own buffer
  if (!le && size > 1) {
    for (let i = 0; i < copy.length; i += size) copy.subarray(i, i + size).reverse();
  }
  const b = copy.buffer;
  switch (e.type) {
    case MI.INT8: return new Int8Array(b);
    case MI.UINT8: return new Uint8Array(b);
    case MI.INT16: return new Int16Array(b);
    case MI.UINT16: return new Uint16Array(b);
    case MI.INT32: return new Int32Array(b);
    case MI.UINT32: return new Uint32Array(b);
    case MI.SINGLE: return new Float32Array(b);
    case MI.DOUBLE: return new Float64Array(b);
    case MI.INT64: return Float64Array.from(new BigInt64Array(b), Number);
    default: return Float64Array.from(new BigUint64Array(b), Number);
  }
}

/** One miMATRIX: a numeric array, or the reason it is not one. */
function matrix(buf: Uint8Array, le: boolean, where: () => string): NamedArray | { skipped: string } {
  const flags = element(buf, 0, le, where);
  const dims = element(buf, flags.next, le, where);
  const nameEl = element(buf, dims.next, le, where);
  const name = new TextDecoder().decode(nameEl.bytes);
  const flagWord = new DataView(flags.bytes.buffer, flags.bytes.byteOffset, 4).getUint32(0, le);
  const cls = flagWord & 0xff;
  const label = name || '(unnamed)';
  if (!NUMERIC_CLASSES.has(cls)) return { skipped: `${label} (${CLASS_NAMES[cls] ?? `class ${cls}`})` };
  if (flagWord & 0x800) return { skipped: `${label} (complex)` };
  const dv = numbers(dims, le, where);
  const shape = Array.from(dv);
  if (shape.filter((d) => d > 1).length > 2) return { skipped: `${label} (${shape.join('×')}, more than 2 dimensions)` };
  const rows = shape[0] ?? 0;
  const cols = shape.slice(1).reduce((a, b) => a * b, 1);
  const real = element(buf, nameEl.next, le, () => `${where()}, variable ${label}`);
  const data = numbers(real, le, () => `${where()}, variable ${label}`);
  if (data.length !== rows * cols) {
    throw new RecordingError('BAD_STRUCTURE', `${where()}, variable ${label}: ${data.length} values where its size ${rows}×${cols} needs ${rows * cols}.`);
  }
  return { name, rows, cols, data, unit: null };
}

export interface MatOptions {
  channels?: number[];
  inflate?: Inflate;
  onProgress?: (fraction: number) => void;
  isCancelled?: () => boolean;
}

export async function readMat5(source: ByteSource, options: MatOptions = {}): Promise<DecodedRecording> {
  const file = source.name;
  if (source.size < HEADER_BYTES) throw new RecordingError('TRUNCATED_FILE', `${file} is cut short: ${source.size} bytes, less than the 128-byte MAT-file header.`);
  const head = await source.read(0, HEADER_BYTES);
  if (!isMat5Header(head)) throw new RecordingError('UNKNOWN_FORMAT', `${file} is not a MAT-file of level 5 or v7.3 (it starts with neither "MATLAB 5.0 MAT-file" nor an HDF5 signature at byte 512).`);
  const endian = String.fromCharCode(head[126], head[127]);
  if (endian !== 'IM' && endian !== 'MI') throw new RecordingError('BAD_STRUCTURE', `${file}: the MAT-file header has no byte-order mark ("${endian}" at byte 126).`);
  const le = endian === 'IM';
  const inflate = options.inflate ?? platformInflate;
  const arrays: NamedArray[] = [];
  const skipped: string[] = [];
  let pos = HEADER_BYTES;
  while (pos + 8 <= source.size) {
    if (options.isCancelled?.()) throw new RecordingError('CANCELLED', `Reading ${file} was stopped.`);
    const at = pos;
    const where = () => `${file}, byte ${at}`;
    const tag = new DataView((await source.read(pos, 8)).slice().buffer);
    const type = tag.getUint32(0, le);
    const n = tag.getUint32(4, le);
    if (pos + 8 + n > source.size) {
      throw new RecordingError('TRUNCATED_FILE', `${file} is cut short: the variable at byte ${pos} needs ${n} bytes but the file ends ${source.size - pos - 8} bytes after its tag.`);
    }
    const body = await source.read(pos + 8, n);
    if (type === MI.COMPRESSED) {
      let inner: Uint8Array;
      try {
        inner = await inflate(body);
      } catch {
        throw new RecordingError('BAD_STRUCTURE', `${file}: the compressed variable at byte ${pos} cannot be inflated (damaged or cut short).`);
      }
      const e = element(inner, 0, le, where);
      if (e.type === MI.MATRIX) {
        const m = matrix(e.bytes, le, where);
        if ('skipped' in m) skipped.push(m.skipped);
        else arrays.push(m);
      }
      pos += 8 + n;
    } else {
      if (type === MI.MATRIX) {
        const m = matrix(body, le, where);
        if ('skipped' in m) skipped.push(m.skipped);
        else arrays.push(m);
      }
      pos += 8 + Math.ceil(n / 8) * 8;
    }
    options.onProgress?.(Math.min(1, pos / source.size));
  }
  return assembleRecording(
    {
      format: 'mat',
      fileName: file,
      sizeBytes: source.size,
      arrays,
      warnings: skipped.length ? [`Not read as channels: ${skipped.join(', ')}.`] : [],
      noRateHint: 'add a scalar fs (or Fs, sampleRate, sample_rate, sr) in Hz, or a time vector t in seconds.',
    },
    options.channels,
  );
}
