import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { createTargetBody, importTargetsBody, ImportTargetsResult, Target } from '../../../../server/schemas/targets';
import { api } from '../../../lib/api-client';
import { projectKeys } from './projects';

const targetsKey = (projectId: number) => [...projectKeys.detail(projectId), 'targets'] as const;

/** A project's targets: limit curves of a track's level against speed. */
export const projectTargetsQuery = (projectId: number) =>
  queryOptions({
    queryKey: targetsKey(projectId),
    queryFn: async () => (await api.get<{ targets: Target[] }>(`/projects/${projectId}/targets`)).targets,
  });

export const useProjectTargets = (projectId: number | null) => useQuery({ ...projectTargetsQuery(projectId ?? 0), enabled: projectId !== null });

export function useCreateTarget(projectId: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: z.input<typeof createTargetBody>) => api.create<{ target: Target }>(`/projects/${projectId}/targets`, body),
    onSettled: () => qc.invalidateQueries({ queryKey: targetsKey(projectId) }),
  });
}

export function useImportTargets(projectId: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: z.input<typeof importTargetsBody>) => api.post<ImportTargetsResult>(`/projects/${projectId}/targets/import`, body),
    onSettled: () => qc.invalidateQueries({ queryKey: targetsKey(projectId) }),
  });
}

export function useDeleteTarget(projectId: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (id: number) => api.delete<void>(`/targets/${id}`),
    onSettled: () => qc.invalidateQueries({ queryKey: targetsKey(projectId) }),
  });
}
