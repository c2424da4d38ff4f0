/// <reference lib="webworker" />
/**
 * Copies a dropped recording into the library's folder of the Origin Private File System: read in
 * 8 MiB slices of the File and written through a synchronous access handle (only a worker may hold
 * one), so a file of gigabytes never sits in memory or goes through IndexedDB as one blob. It is
 * written as NAME.partial and renamed when complete; a copy that fails removes its partial file, so
 * nothing half-stored is left. Progress goes back as { kind: 'progress', done, total }.
 */

export interface LibraryCopyRequest {
  kind: 'copy';
  file: Blob;
  folder: string;
  name: string;
}

/** Holds the copy between slices, and lets it go on. */
export interface LibraryCopyControl {
  kind: 'pause' | 'resume';
}

export type LibraryCopyMessage =
  | { kind: 'progress'; done: number; total: number }
  | { kind: 'done' }
  | { kind: 'error'; name: string; message: string };

/** Bytes read and written per step: large enough to stream at disk speed, small for memory. */
const SLICE_BYTES = 8 << 20;

interface SyncHandle {
  write(buffer: Uint8Array, options: { at: number }): number;
  truncate(size: number): void;
  flush(): void;
  close(): void;
}

/** FileSystemHandle.move(newName) (File System standard, OPFS): not yet in TypeScript's DOM types. */
type Movable = FileSystemFileHandle & { move(name: string): Promise<void>; createSyncAccessHandle(): Promise<SyncHandle> };

const post = (m: LibraryCopyMessage) => (self as DedicatedWorkerGlobalScope).postMessage(m);

async function copy({ file, folder, name }: LibraryCopyRequest): Promise<void> {
  const root = await navigator.storage.getDirectory();
  const dir = await root.getDirectoryHandle(folder, { create: true });
  const partialName = `${name}.partial`;
  const partial = (await dir.getFileHandle(partialName, { create: true })) as Movable;
  let handle: SyncHandle | null = await partial.createSyncAccessHandle();
  try {
    handle.truncate(0);
    for (let at = 0; at < file.size; at += SLICE_BYTES) {
      await notPaused();
      const bytes = new Uint8Array(await file.slice(at, at + SLICE_BYTES).arrayBuffer());
      let written = 0;
      while (written < bytes.length) written += handle.write(bytes.subarray(written), { at: at + written });
      post({ kind: 'progress', done: Math.min(file.size, at + SLICE_BYTES), total: file.size });
    }
    handle.flush();
    handle.close();
    handle = null;
    await dir.removeEntry(name).catch(() => undefined);
    await partial.move(name);
  } catch (e) {
    handle?.close();
    await dir.removeEntry(partialName).catch(() => undefined);
    throw e;
  }
}

let paused = false;
let resumed: (() => void) | null = null;
const notPaused = () => (paused ? new Promise<void>((resolve) => (resumed = resolve)) : Promise.resolve());

self.onmessage = (e: MessageEvent<LibraryCopyRequest | LibraryCopyControl>) => {
  const m = e.data;
  if (m.kind !== 'copy') {
    paused = m.kind === 'pause';
    if (!paused) {
      resumed?.();
      resumed = null;
    }
    return;
  }
  copy(m).then(
    () => post({ kind: 'done' }),
    (err: unknown) => post({ kind: 'error', name: err instanceof Error ? err.name : 'Error', message: err instanceof Error ? err.message : String(err) }),
  );
};
