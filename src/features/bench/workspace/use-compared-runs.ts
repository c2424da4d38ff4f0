import { useEffect, useState } from 'react';
import { decodeInWorker } from '../../../lib/workers/decode-client';
import { errorMessage } from '../../../lib/error-message';
import { getEntry, getFile } from '../../library/api/library-store';
import type { OpenRecording } from '../hooks/use-recording-reader';

export type ComparedRun =
  | { fingerprint: string; kind: 'reading'; name: string | null }
  | { fingerprint: string; kind: 'ready'; recording: OpenRecording }
  | { fingerprint: string; kind: 'error'; name: string | null; message: string };

/** Reads one library entry for a comparison (its file decoded in the decode worker). */
async function readRun(fingerprint: string): Promise<OpenRecording> {
  const entry = await getEntry(fingerprint).catch(() => undefined);
  if (!entry) throw new Error('That recording is not in the library of this browser any more.');
  const file = await getFile(fingerprint).catch(() => undefined);
  if (!file) throw new Error(`The file of ${entry.name} is missing from the library. Drop it again.`);
  const decoded = await decodeInWorker(file, entry.name, { lazy: true, ...(entry.csv ? { csv: entry.csv } : {}) }).promise;
  return { entry, decoded, file };
}

/**
 * The recordings compared with the open one, read from the library one after another (each keeps its
 * own channel setup and speed source from there). A run read once stays read while it is compared.
 */
export function useComparedRuns(fingerprints: string[]): ComparedRun[] {
  const [runs, setRuns] = useState<Record<string, ComparedRun>>({});
  const key = fingerprints.join(',');
  useEffect(() => {
    let stopped = false;
    const wanted = key ? key.split(',') : [];
    void (async () => {
      for (const fingerprint of wanted) {
        if (stopped) return;
        let known = false;
        setRuns((prev) => {
          known = prev[fingerprint]?.kind === 'ready';
          return known ? prev : { ...prev, [fingerprint]: { fingerprint, kind: 'reading', name: null } };
        });
        if (known) continue;
        try {
          const recording = await readRun(fingerprint);
          if (!stopped) setRuns((prev) => ({ ...prev, [fingerprint]: { fingerprint, kind: 'ready', recording } }));
        } catch (e) {
          if (!stopped) setRuns((prev) => ({ ...prev, [fingerprint]: { fingerprint, kind: 'error', name: null, message: errorMessage(e) } }));
        }
      }
    })();
    return () => {
      stopped = true;
    };
  }, [key]);
  return fingerprints.map((f) => runs[f] ?? { fingerprint: f, kind: 'reading', name: null });
}
