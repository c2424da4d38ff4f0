import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { RegisterRecordingBody, RegisteredRecording } from '../../../../server/schemas/recordings';
import { api } from '../../../lib/api-client';
import { projectKeys, refreshProject } from './projects';

export const projectRecordingsQuery = (projectId: number) =>
  queryOptions({
    queryKey: projectKeys.recordings(projectId),
    queryFn: async () =>
      (await api.get<{ recordings: RegisteredRecording[] }>(`/projects/${projectId}/recordings`)).recordings,
  });

export const useProjectRecordings = (projectId: number) => useQuery(projectRecordingsQuery(projectId));

/**
 * Registers a recording's description (never its samples). `created` is false when the project already
 * had this fingerprint and the server updated its description instead.
 */
export function useRegisterRecording() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ projectId, body }: { projectId: number; body: RegisterRecordingBody }) =>
      api.create<{ recording: RegisteredRecording; created: boolean }>(`/projects/${projectId}/recordings`, body),
    onSuccess: (_answer, { projectId }) => refreshProject(qc, projectId),
  });
}
