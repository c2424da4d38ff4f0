/**
 * Reads HDF5 recordings (.h5, .hdf5) and MAT-files v7.3 (HDF5 after a 512-byte MAT header) with the
 * npm package h5wasm (the HDF Group's C library compiled to WebAssembly; it runs in the browser's
 * worker and in Node). Follows the "HDF5 File Format Specification" (The HDF Group) for the signature
 * and the superblock's end-of-file address, checked here before the library sees a cut-short file, and
 * "MAT-File Format", The MathWorks, 2013, for v7.3 (a MATLAB r×c matrix is an HDF5 dataset of shape
 * [c, r], so a MATLAB column is an HDF5 row).
 *
 * HDF5: 1-D numeric datasets of equal length are the channels, named by their path; the rate comes from a
 * scalar dataset or a root attribute sample_rate/fs (…), the unit from a dataset attribute unit/units.
 * MAT v7.3: the level 5 rules (acquisition.ts): a scalar fs or a time vector t, matrices in columns.
 *
 * The whole file goes into h5wasm's in-memory file system: HDF5 needs random access the library does
 * itself, and the ByteSource is asynchronous. So an HDF5 file takes about twice its size in memory while
 * it is read (WebAssembly memory is at most 4 GB): fine for the usual exports, not for multi-GB files.
 */
import { assembleRecording, RATE_NAMES, type NamedArray, type NumericArray } from './acquisition';
import type { ByteSource } from './byte-source';
import type { DecodedRecording } from './recording';
import { RecordingError } from './recording-error';

const SIGNATURE = [0x89, 0x48, 0x44, 0x46, 0x0d, 0x0a, 0x1a, 0x0a];
const NUMERIC_TYPES = new Set([0, 1]); // H5T_INTEGER, H5T_FLOAT

/** Where the HDF5 signature is (0, or 512 after a MAT v7.3 header / a user block), else -1. */
export function hdf5SignatureAt(head: Uint8Array): number {
  for (const at of [0, 512]) {
    if (head.byteLength >= at + 8 && SIGNATURE.every((b, i) => head[at + i] === b)) return at;
  }
  return -1;
}

function readAddress(view: DataView, pos: number, size: number): number {
  if (size === 8) return Number(view.getBigUint64(pos, true));
  if (size === 4) return view.getUint32(pos, true);
  if (size === 2) return view.getUint16(pos, true);
  return -1;
}

/** The file size the superblock asks for (its end-of-file address), or null when unknown. */
function expectedSize(head: Uint8Array, at: number): number | null {
  const view = new DataView(head.buffer, head.byteOffset, head.byteLength);
  const version = head[at + 8];
  let offsetSize: number;
  let basePos: number;
  let eofPos: number;
  if (version === 0 || version === 1) {
    offsetSize = head[at + 13];
    basePos = at + 24 + (version === 1 ? 4 : 0);
    eofPos = basePos + 2 * offsetSize;
  } else if (version === 2 || version === 3) {
    offsetSize = head[at + 9];
    basePos = at + 12;
    eofPos = basePos + 2 * offsetSize;
  } else return null;
  if (eofPos + offsetSize > head.byteLength) return null;
  const base = readAddress(view, basePos, offsetSize);
  const eof = readAddress(view, eofPos, offsetSize);
  if (base < 0 || eof < 0) return null;
  // h5py and MATLAB write the end-of-file address as counted from the file's start, user block included
  return base >= 0 ? eof : null;
}

type H5 = typeof import('h5wasm').default;
type H5Module = Awaited<H5['ready']>;
let loaded: Promise<{ h5: H5; FS: H5Module['FS'] }> | null = null;

/** h5wasm, loaded once on first use (its 4 MB of WebAssembly stay out of the main bundle). */
function h5wasm() {
  loaded ??= import('h5wasm').then(async (m) => {
    const module = await m.default.ready;
    // the library's errors become exceptions instead of pages of diagnostics on stderr
    module.activate_throwing_error_handler();
    return { h5: m.default, FS: module.FS };
  });
  return loaded;
}

let fileCounter = 0;

export interface Hdf5Options {
  channels?: number[];
  onProgress?: (fraction: number) => void;
  isCancelled?: () => boolean;
}

function text(v: unknown): string | null {
  if (typeof v === 'string') return v.trim() || null;
  if (Array.isArray(v) && typeof v[0] === 'string') return v[0].trim() || null;
  return null;
}

export async function readHdf5(source: ByteSource, options: Hdf5Options = {}): Promise<DecodedRecording> {
  const file = source.name;
  const head = await source.read(0, 1024);
  const at = hdf5SignatureAt(head);
  if (at < 0) throw new RecordingError('UNKNOWN_FORMAT', `${file} is not an HDF5 file (no HDF5 signature at byte 0 or 512).`);
  const mat73 = at === 512 && String.fromCharCode(...head.subarray(0, 10)) === 'MATLAB 7.3';
  const needed = expectedSize(head, at);
  if (needed !== null && needed > source.size) {
    throw new RecordingError('TRUNCATED_FILE', `${file} is cut short: its HDF5 superblock says ${needed} bytes but the file has ${source.size}.`);
  }
  const bytes = await source.read(0, source.size);
  options.onProgress?.(0.5);
  if (options.isCancelled?.()) throw new RecordingError('CANCELLED', `Reading ${file} was stopped.`);
  const { h5, FS } = await h5wasm();
  const path = `/fanlight-${++fileCounter}.h5`;
  try {
    FS.writeFile(path, bytes);
  } catch {
    throw new RecordingError(
      'READ_FAILED',
      `${file} (${(source.size / 2 ** 20).toFixed(0)} MB) does not fit in the HDF5 reader's memory; save fewer or shorter channels per file.`,
    );
  }
  let f: InstanceType<H5['File']> | null = null;
  try {
    try {
      f = new h5.File(path, 'r');
    } catch {
      throw new RecordingError('BAD_STRUCTURE', `${file} cannot be opened as HDF5 (the file is damaged).`);
    }
    const arrays: NamedArray[] = [];
    const skipped: string[] = [];
    let rate: number | null = null;
    if (!mat73) {
      for (const [k, a] of Object.entries(f.attrs)) {
        const v = Number(Array.isArray(a.value) ? NaN : a.value);
        if (RATE_NAMES.has(k) && v > 0 && Number.isFinite(v)) rate ??= v;
      }
    }
    const visit = (group: InstanceType<H5['Group']>, prefix: string) => {
      for (const key of group.keys()) {
        if (mat73 && key.startsWith('#')) continue; // #refs#, #subsystem#: MATLAB's internals
        const name = prefix ? `${prefix}/${key}` : key;
        const entity = group.get(key);
        if (entity instanceof h5.Group) {
          visit(entity, name);
          continue;
        }
        if (!(entity instanceof h5.Dataset)) continue;
        const meta = entity.metadata;
        const shape = entity.shape ?? [];
        const matClass = mat73 ? text(entity.attrs.MATLAB_class?.value) : null;
        if (!NUMERIC_TYPES.has(meta.type) || (matClass !== null && ['char', 'logical', 'cell', 'struct'].includes(matClass))) {
          skipped.push(`${name} (not numeric)`);
          continue;
        }
        if (mat73 && entity.attrs.MATLAB_empty) {
          skipped.push(`${name} (empty)`); // v7.3 keeps an empty array's size as its data
          continue;
        }
        const long = shape.filter((d) => d > 1);
        if (long.length > (mat73 ? 2 : 1)) {
          skipped.push(`${name} (${shape.join('×')})`);
          continue;
        }
        const value = entity.value;
        if (value === null || typeof value !== 'object' || !('length' in value)) {
          const v = Number(value);
          arrays.push({ name, rows: 1, cols: 1, data: [v], unit: null });
          continue;
        }
        const data: NumericArray =
          value instanceof BigInt64Array || value instanceof BigUint64Array ? Float64Array.from(value, Number) : (value as NumericArray);
        const unit = mat73 ? null : text(entity.attrs.unit?.value ?? entity.attrs.units?.value);
        // v7.3: HDF5 shape [c, r] holds a MATLAB r×c matrix column by column; plain HDF5: one vector
        const rows = mat73 && shape.length === 2 ? shape[1] : data.length;
        const cols = mat73 && shape.length === 2 ? shape[0] : 1;
        arrays.push({ name, rows, cols, data, unit });
      }
    };
    try {
      visit(f, '');
    } catch (e) {
      if (e instanceof RecordingError) throw e;
      throw new RecordingError('BAD_STRUCTURE', `${file} is damaged: HDF5 cannot read its groups and datasets.`);
    }
    if (!mat73) {
      // a scalar dataset fs is the rate, not a channel; so is a 1-element one
      for (const a of arrays) if (a.data.length === 1 && RATE_NAMES.has(a.name)) rate ??= Number(a.data[0]);
    }
    options.onProgress?.(1);
    return assembleRecording(
      {
        format: mat73 ? 'mat' : 'hdf5',
        fileName: file,
        sizeBytes: source.size,
        arrays,
        sampleRateHz: rate,
        warnings: skipped.length ? [`Not read as channels: ${skipped.join(', ')}.`] : [],
        noRateHint: mat73
          ? 'add a scalar fs (or Fs, sampleRate, sample_rate, sr) in Hz, or a time vector t in seconds.'
          : 'add a root attribute or a scalar dataset sample_rate (or fs) in Hz, or a time dataset t in seconds.',
      },
      options.channels,
    );
  } finally {
    try {
      f?.close();
    } catch {
      // closing a half-opened file: nothing more to free
    } finally {
      FS.unlink(path);
    }
  }
}
