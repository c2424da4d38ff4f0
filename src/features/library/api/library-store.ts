/**
 * The local library: recordings kept in this browser's IndexedDB. Descriptions and files sit in two
 * databases, so listing the library never loads a file.
 */
import { createStore, del, get, promisifyRequest, set, values, type UseStore } from 'idb-keyval';
import type { ChannelSetup } from '../../../../workers/io/channel-setup';
import type { SpeedSource } from '../../../../workers/io/speed-source';
import type { ChannelInfo, CsvOptions, RecordingFormat } from '../../../../workers/io/recording';
import { formatMegabytes } from '../../../lib/format';
import { errorMessage } from '../../../lib/error-message';

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

let stores: { entries: UseStore; files: UseStore } | null = null;

// Opened on first use, so importing this module never touches IndexedDB.
function db() {
  stores ??= {
    entries: createStore('fanlight-library', 'recordings'),
    files: createStore('fanlight-library-files', 'files'),
  };
  return stores;
}

/** Newest first. */
export async function listLibrary(): Promise<LibraryEntry[]> {
  const all = await values<LibraryEntry>(db().entries);
  return all.sort((a, b) => b.addedAt.localeCompare(a.addedAt));
}

export const getEntry = (fingerprint: string) => get<LibraryEntry>(fingerprint, db().entries);

export const getFile = (fingerprint: string) => get<Blob>(fingerprint, db().files);

async function hasFile(fingerprint: string): Promise<boolean> {
  return (await db().files('readonly', (store) => promisifyRequest(store.count(fingerprint)))) > 0;
}

function sameChannels(setup: ChannelSetup[], channels: ChannelInfo[]): boolean {
  return setup.length === channels.length && setup.every((s, i) => s.index === channels[i].index);
}

/**
 * Keeps the file and its description. A recording already in the library keeps its setup, its speed
 * source and the date it was first added (unless it now reads as other channels, e.g. a CSV read with
 * other options). Returns the entry as stored.
 */
export async function addToLibrary(entry: LibraryEntry, file: Blob): Promise<LibraryEntry> {
  const { entries, files } = db();
  const fp = entry.fingerprint;
  const old = await getEntry(fp);
  const same = old !== undefined && sameChannels(old.setup, entry.channels);
  const stored: LibraryEntry = old
    ? {
        ...entry,
        setup: same ? old.setup : entry.setup,
        ...(same && old.speedSource && !entry.speedSource ? { speedSource: old.speedSource } : {}),
        addedAt: old.addedAt,
      }
    : entry;
  const fileWasThere = await hasFile(fp);
  try {
    if (!fileWasThere) await set(fp, file, files);
    await set(fp, stored, entries);
  } catch (e) {
    // Two databases, so no one transaction: undo by hand whatever this call may have written.
    if (!fileWasThere) await del(fp, files).catch(() => undefined);
    if (!old) await del(fp, entries).catch(() => undefined);
    if (isQuotaError(e)) {
      throw new LibraryError(
        `There is no room left in this browser's storage for ${entry.name} (${formatMegabytes(entry.sizeBytes)}). Delete recordings from the library, or free space, and drop it again.`,
        { cause: e },
      );
    }
    throw new LibraryError(`${entry.name} could not be kept in the library: ${describe(e)}`, { cause: e });
  }
  return stored;
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
  const { entries, files } = db();
  await Promise.all([del(fingerprint, entries), del(fingerprint, files)]);
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
