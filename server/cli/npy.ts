/**
 * Writes a float32 array as a NumPy .npy file (format version 1.0: magic, header dict padded to a
 * multiple of 64 bytes, little-endian data) — the format numpy.load reads (NumPy NEP 1).
 * Our own few lines: no npm package for writing .npy is in wide use.
 */
import { writeFile } from 'node:fs/promises';

/** The magic, version and header of a float32 array of `shape`; the data follows it directly. */
export function npyHeader(shape: number[]): Uint8Array {
  const dict = `{'descr': '<f4', 'fortran_order': False, 'shape': (${shape.join(', ')}${shape.length === 1 ? ',' : ''}), }`;
  const unpadded = 10 + dict.length + 1;
  const header = dict + ' '.repeat((64 - (unpadded % 64)) % 64) + '\n';
  const out = new Uint8Array(10 + header.length);
  out.set([0x93, 0x4e, 0x55, 0x4d, 0x50, 0x59, 1, 0], 0); // \x93NUMPY v1.0
  new DataView(out.buffer).setUint16(8, header.length, true);
  out.set(new TextEncoder().encode(header), 10);
  return out;
}

export function npyBytes(data: Float32Array, shape: number[]): Uint8Array {
  const header = npyHeader(shape);
  const out = new Uint8Array(header.length + data.byteLength);
  out.set(header, 0);
  out.set(new Uint8Array(data.buffer, data.byteOffset, data.byteLength), header.length);
  return out;
}

export const writeNpy = (file: string, data: Float32Array, shape: number[]) => writeFile(file, npyBytes(data, shape));
