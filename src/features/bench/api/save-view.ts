/**
 * Saving what the Bench shows, as mutations: a new view (the recording registered with the project
 * first when it is not there yet, then the view, its snapshot and the pending marks in one request, one
 * transaction on the server), or the changes to the view the Bench was opened from (checked against
 * its version).
 */
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { registerRecordingBody } from '../../../../server/schemas/recordings';
import { saveViewBody, type SaveViewChangesBody, type ViewDetail } from '../../../../server/schemas/views';
import type { ChannelSetup } from '../../../../workers/io/channel-setup';
import { encodeSnapshot } from '../../../../workers/io/snapshot-codec';
import { SNAPSHOT_CONTENT_TYPE, type SnapshotHeader } from '../../../../workers/io/snapshot-format';
import { api } from '../../../lib/api-client';
import type { LibraryEntry } from '../../library/api/library-store';
import { projectRecordingsQuery, useRegisterRecording } from '../../projects/api/recordings';
import { viewKeys } from '../../views/api/keys';

/** The picture a save sends: the snapshot's checked header and its level bytes. */
export interface SnapshotPicture {
  header: SnapshotHeader;
  map: Uint8Array;
}

/** The multipart body of a whole save: the view (with its marks) as JSON, and the snapshot file. */
function wholeView(view: unknown, picture: SnapshotPicture): FormData {
  const form = new FormData();
  form.append('view', JSON.stringify(view));
  form.append('snapshot', new Blob([encodeSnapshot(picture.header, picture.map).slice()], { type: SNAPSHOT_CONTENT_TYPE }), 'map.fls');
  return form;
}

export const issuesText = (issues: { path: PropertyKey[]; message: string }[]) =>
  issues
    .slice(0, 4)
    .map((i) => (i.path.length ? `${i.path.map(String).join('.')}: ${i.message}` : i.message))
    .join(' ');

export interface NewViewInput {
  project: { id: number; name: string };
  entry: LibraryEntry;
  setup: ChannelSetup[];
  /** Why the setup cannot be registered (empty when it can) */
  setupProblems: string[];
  title: string;
  state: unknown;
  marks: unknown[];
  picture: SnapshotPicture;
}

export function useSaveNewView() {
  const qc = useQueryClient();
  const register = useRegisterRecording();
  return useMutation({
    mutationFn: async (v: NewViewInput): Promise<ViewDetail> => {
      const known = await qc.fetchQuery(projectRecordingsQuery(v.project.id));
      let recordingId = known.find((r) => r.fingerprint === v.entry.fingerprint)?.id;
      if (recordingId === undefined) {
        if (v.setupProblems.length > 0) throw new Error(`The recording must be registered with ${v.project.name} first; fix the channel setup. ${v.setupProblems.join(' ')}`);
        const body = registerRecordingBody.safeParse({
          name: v.entry.name,
          fingerprint: v.entry.fingerprint,
          format: v.entry.format,
          sampleRateHz: v.entry.sampleRateHz,
          durationS: v.entry.durationS,
          channels: v.setup.map(({ index, name, quantity, unit, calibration }) => ({ index, name, quantity, unit, calibration })),
        });
        if (!body.success) throw new Error(issuesText(body.error.issues));
        recordingId = (await register.mutateAsync({ projectId: v.project.id, body: body.data })).recording.id;
      }
      const body = saveViewBody.parse({ title: v.title, recordingId, state: v.state, marks: v.marks });
      return (await api.sendForm<{ view: ViewDetail }>('POST', `/projects/${v.project.id}/views`, wholeView(body, v.picture))).view;
    },
    onSuccess: () => qc.invalidateQueries({ queryKey: viewKeys.all }),
  });
}

export function useSaveViewChanges() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: async ({ viewId, body, picture }: { viewId: number; body: SaveViewChangesBody; picture: SnapshotPicture }) =>
      (await api.sendForm<{ view: ViewDetail }>('PATCH', `/views/${viewId}`, wholeView(body, picture))).view,
    onSuccess: () => qc.invalidateQueries({ queryKey: viewKeys.all }),
  });
}
