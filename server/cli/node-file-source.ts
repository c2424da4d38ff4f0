import { open, type FileHandle } from 'node:fs/promises';
import path from 'node:path';
import type { ByteSource } from '../../workers/io/byte-source';
import { RecordingError } from '../../workers/io/recording-error';

/** A ByteSource over a file on disk, read with positioned reads (no whole-file load). */
export async function openFileSource(file: string): Promise<ByteSource & { close(): Promise<void> }> {
  let handle: FileHandle;
  try {
    handle = await open(file, 'r');
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    const why = code === 'ENOENT' ? 'does not exist' : code === 'EISDIR' ? 'is a folder, not a file' : `cannot be opened (${code})`;
    throw new RecordingError('READ_FAILED', `${file} ${why}.`);
  }
  const { size } = await handle.stat();
  return {
    name: path.basename(file),
    size,
    async read(offset, length) {
      const n = Math.max(0, Math.min(length, size - offset));
      const buffer = new Uint8Array(n); // a fresh, aligned buffer each time
      let done = 0;
      while (done < n) {
        const { bytesRead } = await handle.read(buffer, done, n - done, offset + done);
        if (bytesRead === 0) break;
        done += bytesRead;
      }
      return done === n ? buffer : buffer.subarray(0, done);
    },
    close: () => handle.close(),
  };
}
