import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ChannelSetup } from '../../../../workers/io/channel-setup';
import { decodeInWorker } from '../../../lib/workers/decode-client';
import { libraryKeys } from '../../library/api/library';
import { addToLibrary } from '../../library/api/library-store';
import { entryFrom } from '../hooks/use-recording-reader';
import { fetchDemoRecording } from './demo-recordings';

/** Fetches a demo recording into this browser's library (as a drop would), so it can be compared; its fingerprint. */
async function addDemoToLibrary(file: string, setup: ChannelSetup[] | undefined): Promise<string> {
  const blob = await fetchDemoRecording(file);
  const decoded = await decodeInWorker(blob, file).promise;
  const entry = await addToLibrary(entryFrom(decoded, file, undefined, setup), blob);
  return entry.fingerprint;
}

/** Reads a file of the engineer's into the library for a comparison (without opening it); its fingerprint. */
async function addFileToLibrary(file: File): Promise<string> {
  const decoded = await decodeInWorker(file, file.name).promise;
  const entry = await addToLibrary(entryFrom(decoded, file.name, undefined), file);
  return entry.fingerprint;
}

export function useAddFileRun() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (file: File) => addFileToLibrary(file),
    onSettled: () => qc.invalidateQueries({ queryKey: libraryKeys.all }),
  });
}

export function useAddDemoRun() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ file, setup }: { file: string; setup: ChannelSetup[] | undefined }) => addDemoToLibrary(file, setup),
    onSettled: () => qc.invalidateQueries({ queryKey: libraryKeys.all }),
  });
}
