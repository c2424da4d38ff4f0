/**
 * The local library: recordings kept in this browser. Descriptions sit in IndexedDB, files in the
 * Origin Private File System (file-store.ts), so listing the library never loads a file. A dropped file
 * is described at once and copied in the background; the copy's end clears the entry's `copying` mark,
 * and a copy that fails or is cut off by a closed page leaves no entry and no file behind.
 */
import { createStore, del, get, set, values, type UseStore } from 'idb-keyval';
import type { ChannelSetup } from '../../../../workers/io/channel-setup';
import type { SpeedSource } from '../../../../workers/io/speed-source';
import type { ChannelInfo, CsvOptions, RecordingFormat } from '../../../../workers/io/recording';
import { formatMegabytes } from '../../../lib/format';
import { errorMessage } from '../../../lib/error-message';
import { copyProgress, deleteFile, hasFile, readFile, removeLeftovers, storeFile } from './file-store';

export interface LibraryEntry {
  fingerprint: string;
  name: string;
  sizeBytes: number;
  format: RecordingFormat;
  sampleRateHz: number;
  frames: number;
  durationS: number;
  channels: ChannelInfo[];
  setup: ChannelSetup[];
  /** ISO 8601. */
  addedAt: string;
  /** The CSV options the file was read with (e.g. a typed sample rate), so opening it again reads it the same way. */
  csv?: CsvOptions;
  /** The speed source chosen on the Bench; absent, the Bench picks one from the setup */
  speedSource?: SpeedSource;
  /** Its file is being copied into the library now */
  copying?: boolean;
}

export interface StorageEstimate {
  usageBytes: number;
  quotaBytes: number;
}

export class LibraryError extends Error {
  constructor(message: string, options?: { cause?: unknown }) {
    super(message, options);
    this.name = 'LibraryError';
  }
}

let stores: { entries: UseStore } | null = null;

// Opened on first use, so importing this module never touches IndexedDB.
function db() {
  stores ??= { entries: createStore('fanlight-library', 'recordings') };
  return stores;
}

let leftoversCleared: Promise<void> | null = null;

/** Newest first. Entries whose copy was cut off (a page closed mid-copy) are removed, with their partial files. */
export async function listLibrary(): Promise<LibraryEntry[]> {
  const all = await values<LibraryEntry>(db().entries);
  const cutOff = all.filter((e) => e.copying && !copyProgress.get(e.fingerprint));
  await Promise.all(cutOff.map((e) => del(e.fingerprint, db().entries).catch(() => undefined)));
  const kept = all.filter((e) => !cutOff.includes(e));
  // what a closed page left in the file storage is cleared once per page load, not on every listing
  leftoversCleared ??= removeLeftovers(new Set(kept.map((e) => e.fingerprint))).catch(() => undefined);
  await leftoversCleared;
  return kept.sort((a, b) => b.addedAt.localeCompare(a.addedAt));
}

export const getEntry = (fingerprint: string) => get<LibraryEntry>(fingerprint, db().entries);

export const getFile = (fingerprint: string) => readFile(fingerprint);

function sameChannels(setup: ChannelSetup[], channels: ChannelInfo[]): boolean {
  return setup.length === channels.length && setup.every((s, i) => s.index === channels[i].index);
}

const noRoom = (entry: LibraryEntry, e: unknown) =>
  new LibraryError(
    `There is no room left in this browser's storage for ${entry.name} (${formatMegabytes(entry.sizeBytes)}). Delete recordings from the library, or free space, and drop it again.`,
    { cause: e },
  );

const notKept = (entry: LibraryEntry, e: unknown) =>
  isQuotaError(e) ? noRoom(entry, e) : new LibraryError(`${entry.name} could not be kept in the library: ${describe(e)}`, { cause: e });

/**
 * Keeps the file and its description: the description at once (returned as stored), the file copied in
 * the background (`copied` settles when it is in). A recording already in the library keeps its setup,
 * its speed source and the date it was first added (unless it now reads as other channels, e.g. a CSV
 * read with other options). A failed copy removes the new description again and rejects `copied`.
 */
export async function keepInLibrary(entry: LibraryEntry, file: Blob): Promise<{ entry: LibraryEntry; copied: Promise<void> }> {
  const { entries } = db();
  const fp = entry.fingerprint;
  const old = await getEntry(fp);
  const same = old !== undefined && sameChannels(old.setup, entry.channels);
  const { copying: _copying, ...oldKept } = old ?? ({} as Partial<LibraryEntry>);
  const stored: LibraryEntry = old
    ? {
        ...entry,
        setup: same ? old.setup : entry.setup,
        ...(same && oldKept.speedSource && !entry.speedSource ? { speedSource: oldKept.speedSource } : {}),
        addedAt: old.addedAt,
      }
    : entry;
  const fileWasThere = await hasFile(fp).catch(() => false);
  try {
    await set(fp, fileWasThere ? stored : { ...stored, copying: true }, entries);
  } catch (e) {
    throw notKept(entry, e);
  }
  if (fileWasThere) return { entry: stored, copied: Promise.resolve() };
  const copied = storeFile(fp, file).then(
    async () => {
      const now = await getEntry(fp);
      if (now) {
        const { copying: _done, ...rest } = now;
        await set(fp, rest, entries);
      }
    },
    async (e: unknown) => {
      // nothing half-stored: the description goes too (or back to what it was)
      await (old ? set(fp, old, entries) : del(fp, entries)).catch(() => undefined);
      throw notKept(entry, e);
    },
  );
  copied.catch(() => undefined);
  return { entry: stored, copied };
}

/** Keeps the file and its description, and waits for the copy (a file added only for a comparison). */
export async function addToLibrary(entry: LibraryEntry, file: Blob): Promise<LibraryEntry> {
  const kept = await keepInLibrary(entry, file);
  await kept.copied;
  return kept.entry;
}

/** Changes a stored entry; `what` names the change in the errors ("setup", "speed source"). */
async function changeEntry(fingerprint: string, what: string, change: (e: LibraryEntry) => LibraryEntry): Promise<LibraryEntry> {
  const entry = await getEntry(fingerprint);
  if (!entry) throw new LibraryError(`This recording is no longer in the library, so its ${what} cannot be saved.`);
  const next = change(entry);
  try {
    await set(fingerprint, next, db().entries);
  } catch (e) {
    if (isQuotaError(e)) {
      throw new LibraryError(
        `There is no room left in this browser's storage to save the ${what} of ${entry.name}. Delete recordings from the library, or free space.`,
        { cause: e },
      );
    }
    throw new LibraryError(`The ${what} of ${entry.name} could not be saved: ${describe(e)}`, { cause: e });
  }
  return next;
}

export const updateSetup = (fingerprint: string, setup: ChannelSetup[]) => changeEntry(fingerprint, 'setup', (e) => ({ ...e, setup }));

/** Keeps the Bench's speed source with the recording (null: back to the one the setup suggests). */
export const updateSpeedSource = (fingerprint: string, speedSource: SpeedSource | null) =>
  changeEntry(fingerprint, 'speed source', ({ speedSource: _old, ...e }) => (speedSource ? { ...e, speedSource } : e));

export async function removeFromLibrary(fingerprint: string): Promise<void> {
  await Promise.all([del(fingerprint, db().entries), deleteFile(fingerprint)]);
}

export async function storageEstimate(): Promise<StorageEstimate | null> {
  if (typeof navigator === 'undefined' || !navigator.storage?.estimate) return null;
  const { usage, quota } = await navigator.storage.estimate();
  if (usage === undefined || quota === undefined) return null;
  return { usageBytes: usage, quotaBytes: quota };
}

/** Browsers report a full store under different names, sometimes wrapped in another error. */
export function isQuotaError(e: unknown, depth = 0): boolean {
  if (!e || typeof e !== 'object' || depth > 5) return false;
  const { name, code, cause, error } = e as { name?: unknown; code?: unknown; cause?: unknown; error?: unknown };
  if (name === 'QuotaExceededError' || name === 'NS_ERROR_DOM_QUOTA_REACHED') return true;
  if (typeof DOMException !== 'undefined' && e instanceof DOMException && code === 22) return true;
  return isQuotaError(cause, depth + 1) || (error !== e && isQuotaError(error, depth + 1));
}

function describe(e: unknown): string {
  const message = errorMessage(e);
  return message.endsWith('.') ? message : `${message}.`;
}
