/**
 * Random access to the bytes of a file without loading it: the readers ask for the ranges they need.
 * In the browser a File is read by File.slice; in Node by a file handle; in tests from memory.
 */
export interface ByteSource {
  readonly name: string;
  readonly size: number;
  /** Up to `length` bytes from `offset` (fewer at the end of the file). */
  read(offset: number, length: number): Promise<Uint8Array>;
}

export function blobSource(blob: Blob, name: string): ByteSource {
  return {
    name,
    size: blob.size,
    async read(offset, length) {
      return new Uint8Array(await blob.slice(offset, Math.min(blob.size, offset + length)).arrayBuffer());
    },
  };
}

export function memorySource(bytes: Uint8Array, name = 'memory'): ByteSource {
  return {
    name,
    size: bytes.byteLength,
    async read(offset, length) {
      return bytes.subarray(Math.min(offset, bytes.byteLength), Math.min(bytes.byteLength, offset + length));
    },
  };
}
