import { useSyncExternalStore } from 'react';
import { queryOptions, useMutation, useQuery, useQueryClient, type QueryClient } from '@tanstack/react-query';
import type { ChannelSetup } from '../../../../workers/io/channel-setup';
import type { SpeedSource } from '../../../../workers/io/speed-source';
import {
  keepInLibrary,
  listLibrary,
  removeFromLibrary,
  storageEstimate,
  updateSetup,
  updateSpeedSource,
  type LibraryEntry,
} from './library-store';
import { copyProgress, type CopyProgress } from './file-store';

// Descriptions only: the files and the decoded samples never enter the query cache.
export const libraryKeys = {
  all: ['library'] as const,
  list: () => [...libraryKeys.all, 'list'] as const,
  storage: () => [...libraryKeys.all, 'storage'] as const,
};

// The library is local: nothing changes it behind our back, and a failed read will not heal on a retry.
const local = { staleTime: Infinity, retry: false } as const;

export const libraryQuery = queryOptions({ queryKey: libraryKeys.list(), queryFn: listLibrary, ...local });

export const useLibrary = () => useQuery(libraryQuery);

export const storageQuery = queryOptions({ queryKey: libraryKeys.storage(), queryFn: storageEstimate, ...local });

export const useStorageEstimate = () => useQuery(storageQuery);

const refreshLibrary = (qc: QueryClient) => qc.invalidateQueries({ queryKey: libraryKeys.all });

/** Keeps a dropped file: its description at once, its copy in the background (the list follows both). */
export function useKeepInLibrary() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: async ({ entry, file }: { entry: LibraryEntry; file: Blob }) => {
      const kept = await keepInLibrary(entry, file);
      kept.copied.then(
        () => refreshLibrary(qc),
        () => refreshLibrary(qc),
      );
      return kept;
    },
    onSettled: () => refreshLibrary(qc),
  });
}

export function useUpdateSetup() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ fingerprint, setup }: { fingerprint: string; setup: ChannelSetup[] }) =>
      updateSetup(fingerprint, setup),
    onSuccess: () => refreshLibrary(qc),
  });
}

export function useUpdateSpeedSource() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ fingerprint, speedSource }: { fingerprint: string; speedSource: SpeedSource | null }) => updateSpeedSource(fingerprint, speedSource),
    onSuccess: () => refreshLibrary(qc),
  });
}

export function useRemoveFromLibrary() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (fingerprint: string) => removeFromLibrary(fingerprint),
    onSettled: () => refreshLibrary(qc),
  });
}

/** How far the copy of a recording into the library has come (null when none is running). */
export const useCopyProgress = (fingerprint: string): CopyProgress | null =>
  useSyncExternalStore(copyProgress.subscribe, () => copyProgress.get(fingerprint));
