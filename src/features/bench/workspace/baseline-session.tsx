import { useCallback, useEffect, type ReactNode } from 'react';
import type { OpenRecording } from '../hooks/use-recording-reader';
import { BenchSession, type BenchState } from '../session/bench-session';
import type { ViewOnBench } from '../view-state/view-restore';
import { useWorkspace } from './workspace';

/** The open recording's session, published to the workspace as the baseline of any comparison. */
export function BaselineSession({
  recording,
  fromView,
  preferredProjectId,
  children,
}: {
  recording: OpenRecording;
  fromView?: ViewOnBench;
  preferredProjectId: number | null;
  children: ReactNode;
}) {
  const workspace = useWorkspace();
  const id = recording.entry.fingerprint;
  const name = recording.entry.name;
  useEffect(() => () => workspace.withdraw(id), [workspace, id]);
  const publish = useCallback((state: BenchState) => workspace.publish({ id, name, baseline: true, state }), [workspace, id, name]);
  return (
    <BenchSession recording={recording} fromView={fromView} preferredProjectId={preferredProjectId} onPublish={publish}>
      {children}
    </BenchSession>
  );
}
