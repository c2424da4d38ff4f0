import { useCallback, useEffect, useRef, useState } from 'react';
import type { DecodedWithFingerprint } from '../../../../workers/decode.worker';
import { defaultSetup, type ChannelSetup } from '../../../../workers/io/channel-setup';
import type { CsvOptions } from '../../../../workers/io/recording';
import { DecodeFailure, decodeInWorker } from '../../../lib/workers/decode-client';
import { useKeepInLibrary } from '../../library/api/library';
import { getEntry, getFile, type LibraryEntry } from '../../library/api/library-store';
import { errorMessage } from '../../../lib/error-message';

/**
 * The recording on the Bench: its library entry, its file (read again for channels asked later) and the
 * channels decoded so far (kept in memory only).
 */
export interface OpenRecording {
  entry: LibraryEntry;
  decoded: DecodedWithFingerprint;
  file: Blob;
}

export interface Reading {
  fileName: string;
  fraction: number;
}

/** A CSV without a time column: the reader needs the sample rate from the engineer. */
export interface RatePrompt {
  file: Blob;
  fileName: string;
  message: string;
}

export interface ReaderNotice {
  tone: 'info' | 'error';
  /** The file concerned, shown next to the message. */
  fileName?: string;
  message: string;
}

export function entryFrom(decoded: DecodedWithFingerprint, fileName: string, csv: CsvOptions | undefined, setup?: ChannelSetup[]): LibraryEntry {
  const h = decoded.header;
  return {
    fingerprint: decoded.fingerprint,
    name: fileName,
    sizeBytes: h.sizeBytes,
    format: h.format,
    sampleRateHz: h.sampleRateHz,
    frames: h.frames,
    durationS: h.durationS,
    channels: h.channels,
    setup: setup && setup.length === h.channels.length ? setup : defaultSetup(h.channels),
    addedAt: new Date().toISOString(),
    ...(csv ? { csv } : {}),
  };
}

/**
 * Reads files in the decode worker, one at a time, and keeps each one read in the library. A newer
 * read supersedes an older one: its answer is dropped.
 */
export function useRecordingReader(onOpened?: (entry: LibraryEntry) => void) {
  const [open, setOpen] = useState<OpenRecording | null>(null);
  const [reading, setReading] = useState<Reading | null>(null);
  const [prompt, setPrompt] = useState<RatePrompt | null>(null);
  const [notice, setNotice] = useState<ReaderNotice | null>(null);
  const current = useRef<{ cancel(): void } | null>(null);
  const keepInLibrary = useKeepInLibrary();
  const keepRef = useRef(keepInLibrary.mutateAsync);
  keepRef.current = keepInLibrary.mutateAsync;
  const openedRef = useRef(onOpened);
  openedRef.current = onOpened;

  useEffect(() => () => current.current?.cancel(), []);

  const read = useCallback(async (file: Blob, fileName: string, csv?: CsvOptions, setup?: ChannelSetup[]) => {
    // For the browser benchmark: from here to 'fanlight:map-painted'
    performance.mark('fanlight:drop');
    current.current?.cancel();
    setPrompt(null);
    setNotice(null);
    setReading({ fileName, fraction: 0 });
    // lazy: a WAV opens with its header alone; the Bench then reads the channels it uses
    const job = decodeInWorker(file, fileName, { lazy: true, ...(csv ? { csv } : {}) }, (fraction) => {
      if (current.current === job) setReading({ fileName, fraction });
    });
    current.current = job;
    let decoded: DecodedWithFingerprint;
    try {
      decoded = await job.promise;
    } catch (e) {
      if (current.current !== job) return;
      current.current = null;
      setReading(null);
      if (e instanceof DecodeFailure && e.code === 'CANCELLED') {
        setNotice({ tone: 'info', message: `Stopped reading ${fileName}.` });
      } else if (e instanceof DecodeFailure && e.code === 'CSV_NEEDS_SAMPLE_RATE' && !csv?.sampleRateHz) {
        setPrompt({ file, fileName, message: e.message });
      } else {
        setNotice({ tone: 'error', fileName, message: errorMessage(e) });
      }
      return;
    }
    if (current.current !== job) return;
    performance.mark('fanlight:decoded');
    try {
      const { entry, copied } = await keepRef.current({ entry: entryFrom(decoded, fileName, csv, setup), file });
      // the recording opens now; its copy into the library goes on in the background
      copied.catch((e: unknown) => setNotice({ tone: 'error', fileName, message: errorMessage(e) }));
      if (current.current !== job) return;
      performance.mark('fanlight:stored');
      setOpen({ entry, decoded, file });
      openedRef.current?.(entry);
    } catch (e) {
      if (current.current !== job) return;
      setNotice({ tone: 'error', message: errorMessage(e) });
    } finally {
      if (current.current === job) {
        current.current = null;
        setReading(null);
      }
    }
  }, []);

  const openFromLibrary = useCallback(
    async (fingerprint: string) => {
      const entry = await getEntry(fingerprint).catch(() => undefined);
      if (!entry) {
        setNotice({
          tone: 'error',
          message: 'That recording is not in the library of this browser. It may have been deleted, or kept in another browser.',
        });
        return;
      }
      const file = await getFile(fingerprint).catch(() => undefined);
      if (!file) {
        setNotice({ tone: 'error', fileName: entry.name, message: 'Its file is missing from the library. Drop it again.' });
        return;
      }
      await read(file, entry.name, entry.csv);
    },
    [read],
  );

  const readWithRate = useCallback(
    (sampleRateHz: number) => {
      if (!prompt) return;
      void read(prompt.file, prompt.fileName, { sampleRateHz, timeColumn: 'none' });
    },
    [prompt, read],
  );

  const cancel = useCallback(() => current.current?.cancel(), []);

  const close = useCallback(() => setOpen(null), []);

  return {
    open,
    reading,
    prompt,
    notice,
    read,
    openFromLibrary,
    readWithRate,
    cancel,
    close,
    dismissPrompt: () => setPrompt(null),
    showNotice: setNotice,
  };
}
