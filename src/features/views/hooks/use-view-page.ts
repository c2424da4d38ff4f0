import { useQuery } from '@tanstack/react-query';
import { useEffect, useRef } from 'react';
import type { Mark, ViewDetail } from '../../../../server/schemas/views';
import { useMe } from '../../auth/api/auth';
import { useDemoRecordings } from '../../bench/api/demo-recordings';
import { membersQuery } from '../../projects/api/members';
import { projectQuery } from '../../projects/api/projects';
import { projectRecordingsQuery } from '../../projects/api/recordings';
import { useInLocalLibrary } from '../api/local-library';
import { useMarks } from '../api/marks';
import { useSnapshot } from '../api/snapshot';
import { useSelectedMark } from './use-selected-mark';

/**
 * What the view page reads: the caller's role in the view's project, the snapshot, the marks, the
 * members to share with, the recording (and whether this browser, or the demo, has it), and the mark
 * chosen in the address (a mail's link brings it into sight).
 */
export function useViewPage(view: ViewDetail) {
  const { data: me } = useMe();
  const project = useQuery(projectQuery(view.projectId));
  const role = project.data?.role ?? null;
  const isLead = role === 'lead';
  const isEngineer = role === 'engineer' || isLead;
  const open = !view.archived;

  const snapshot = useSnapshot(view.id, view.snapshot !== null);
  const marks = useMarks(view.id);
  const members = useQuery({ ...membersQuery(view.projectId), enabled: isEngineer });
  const recordings = useQuery({ ...projectRecordingsQuery(view.projectId), enabled: view.recordingId !== null });
  const recording = recordings.data?.find((r) => r.id === view.recordingId) ?? null;
  const fingerprint = recording?.fingerprint ?? null;
  const inLibrary = useInLocalLibrary(fingerprint);
  const demos = useDemoRecordings();
  const demoFile = recording && demos.data?.some((d) => d.file === recording.name) ? recording.name : null;

  const { selectedMarkId, selectMark } = useSelectedMark();
  const scrolled = useRef(false);
  useEffect(() => {
    if (scrolled.current || !marks.data || selectedMarkId === null) return;
    scrolled.current = true;
    document.getElementById(`mark-card-${selectedMarkId}`)?.scrollIntoView({ block: 'start' });
  }, [marks.data, selectedMarkId]);

  // a saved comparison reopens with its runs: demo files fetched again, others from this browser's library
  const demoNames = new Set(demos.data?.map((d) => d.file) ?? []);
  const others = view.state.comparison?.runs.slice(1) ?? [];
  const comparedRuns = { fingerprints: others.filter((r) => !demoNames.has(r.name)).map((r) => r.fingerprint), demoFiles: others.filter((r) => demoNames.has(r.name)).map((r) => r.name) };
  const mayEdit = (m: Mark) => open && (isLead || (isEngineer && m.author?.id === me?.id));
  return { me, project, isLead, isEngineer, open, snapshot, marks, members, recording, fingerprint, inLibrary, demoFile, comparedRuns, selectedMarkId, selectMark, mayEdit };
}
