import { useQuery } from '@tanstack/react-query';
import { useMemo } from 'react';
import { projectRecordingsQuery } from '../../projects/api/recordings';
import { viewQuery } from '../../views/api/views';
import { benchRestoreOf, type ViewOnBench } from '../view-state/view-restore';

export type ViewOnBenchState =
  | { kind: 'none' }
  | { kind: 'loading' }
  | { kind: 'ready'; value: ViewOnBench }
  /** The view cannot be read, or is of another recording: the Bench opens the recording as it is */
  | { kind: 'unusable'; message: string };

/**
 * The saved view `?view=` asks for, once it is known to be a view of the open recording (the same
 * fingerprint as the project registered), with what it restores on the Bench.
 */
export function useViewOnBench(viewId: number | null, openFingerprint: string | null): ViewOnBenchState {
  const view = useQuery({ ...viewQuery(viewId ?? 0), enabled: viewId !== null });
  const projectId = view.data?.projectId ?? 0;
  const recordings = useQuery({ ...projectRecordingsQuery(projectId), enabled: view.data !== undefined && view.data.recordingId !== null });
  const restore = useMemo(() => (view.data ? benchRestoreOf(view.data.state) : null), [view.data]);

  if (viewId === null) return { kind: 'none' };
  if (view.error) return { kind: 'unusable', message: `The saved view cannot be opened here: ${view.error.message}` };
  if (view.isPending || !restore) return { kind: 'loading' };
  if (view.data.recordingId === null) return { kind: 'unusable', message: `“${view.data.title}” is linked to no recording, so it cannot be restored on this one.` };
  if (recordings.error) return { kind: 'unusable', message: `The recordings of the view's project cannot be read: ${recordings.error.message}` };
  if (recordings.isPending) return { kind: 'loading' };
  const fingerprint = recordings.data.find((r) => r.id === view.data.recordingId)?.fingerprint;
  if (openFingerprint !== null && fingerprint !== openFingerprint) {
    return { kind: 'unusable', message: `“${view.data.title}” is a view of another recording (${view.data.recordingName ?? 'unknown'}); this one opens as it is.` };
  }
  return { kind: 'ready', value: { view: view.data, restore } };
}
