/**
 * Where the library keeps its recordings' files: the Origin Private File System (one file per
 * fingerprint in the folder "recordings", copied by workers/library-copy.worker.ts as a stream), or —
 * in a browser without it — IndexedDB as before. Files kept in IndexedDB by an older Fanlight are still
 * read from there. Copies in progress are watched through `copyProgress`.
 */
import { createStore, del, get, promisifyRequest, set, type UseStore } from 'idb-keyval';
import type { LibraryCopyControl, LibraryCopyMessage, LibraryCopyRequest } from '../../../../workers/library-copy.worker';
import { onDecodeBusy } from '../../../lib/workers/decode-client';

const FOLDER = 'recordings';

let idbFiles: UseStore | null = null;
const idb = () => (idbFiles ??= createStore('fanlight-library-files', 'files'));

const opfsAvailable = () => typeof navigator !== 'undefined' && typeof navigator.storage?.getDirectory === 'function' && typeof Worker !== 'undefined';

async function folder(): Promise<FileSystemDirectoryHandle> {
  return (await navigator.storage.getDirectory()).getDirectoryHandle(FOLDER, { create: true });
}

async function opfsFile(fingerprint: string): Promise<File | undefined> {
  if (!opfsAvailable()) return undefined;
  try {
    return await (await (await folder()).getFileHandle(fingerprint)).getFile();
  } catch {
    return undefined;
  }
}

/** The copy of each recording being written now: bytes done and in all. */
export interface CopyProgress {
  done: number;
  total: number;
}

const progress = new Map<string, CopyProgress>();
const listeners = new Set<() => void>();
const tell = () => listeners.forEach((l) => l());

export const copyProgress = {
  subscribe(listener: () => void) {
    listeners.add(listener);
    return () => listeners.delete(listener);
  },
  get: (fingerprint: string) => progress.get(fingerprint) ?? null,
};

function copyInWorker(fingerprint: string, file: Blob): Promise<void> {
  return new Promise((resolve, reject) => {
    let worker: Worker;
    try {
      worker = new Worker(new URL('../../../../workers/library-copy.worker.ts', import.meta.url), { type: 'module', name: 'fanlight-library-copy' });
    } catch (e) {
      reject(e instanceof Error ? e : new Error(String(e)));
      return;
    }
    // paused while the Bench reads channels from a file: that read is the one the engineer waits for
    const stopListening = onDecodeBusy((busy) => worker.postMessage({ kind: busy ? 'pause' : 'resume' } satisfies LibraryCopyControl));
    const end = () => {
      stopListening();
      worker.terminate();
      progress.delete(fingerprint);
      tell();
    };
    progress.set(fingerprint, { done: 0, total: file.size });
    tell();
    worker.onmessage = (e: MessageEvent<LibraryCopyMessage>) => {
      const m = e.data;
      if (m.kind === 'progress') {
        progress.set(fingerprint, { done: m.done, total: m.total });
        tell();
      } else if (m.kind === 'done') {
        end();
        resolve();
      } else {
        end();
        reject(new DOMException(m.message, m.name));
      }
    };
    worker.onerror = (e) => {
      e.preventDefault();
      end();
      reject(new Error(e.message || 'The library copy could not start.'));
    };
    worker.postMessage({ kind: 'copy', file, folder: FOLDER, name: fingerprint } satisfies LibraryCopyRequest);
  });
}

/** Keeps the file under its fingerprint; a failed copy leaves nothing behind. */
export async function storeFile(fingerprint: string, file: Blob): Promise<void> {
  if (opfsAvailable()) {
    await copyInWorker(fingerprint, file);
    return;
  }
  progress.set(fingerprint, { done: 0, total: file.size });
  tell();
  try {
    await set(fingerprint, file, idb());
  } finally {
    progress.delete(fingerprint);
    tell();
  }
}

export async function readFile(fingerprint: string): Promise<Blob | undefined> {
  return (await opfsFile(fingerprint)) ?? (await get<Blob>(fingerprint, idb()));
}

export async function hasFile(fingerprint: string): Promise<boolean> {
  if (await opfsFile(fingerprint)) return true;
  return (await idb()('readonly', (store) => promisifyRequest(store.count(fingerprint)))) > 0;
}

export async function deleteFile(fingerprint: string): Promise<void> {
  if (opfsAvailable()) {
    const dir = await folder().catch(() => null);
    await dir?.removeEntry(fingerprint).catch(() => undefined);
    await dir?.removeEntry(`${fingerprint}.partial`).catch(() => undefined);
  }
  await del(fingerprint, idb());
}

/**
 * Removes what an interrupted copy left (a page closed mid-copy): partial files, and files no entry
 * names. `known` are the fingerprints the library describes.
 */
export async function removeLeftovers(known: Set<string>): Promise<void> {
  if (!opfsAvailable()) return;
  const dir = await folder().catch(() => null);
  if (!dir) return;
  const names: string[] = [];
  for await (const name of (dir as unknown as { keys(): AsyncIterable<string> }).keys()) names.push(name);
  for (const name of names) {
    const fingerprint = name.replace(/\.partial$/, '');
    if (progress.has(fingerprint)) continue;
    if (name.endsWith('.partial') || !known.has(fingerprint)) await dir.removeEntry(name).catch(() => undefined);
  }
}
