import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ActivityEntry } from '../../../../server/schemas/projects';
import { api } from '../../../lib/api-client';
import { projectKeys } from './projects';

/** Newest first, as the server sends it. */
export const activityQuery = (projectId: number) =>
  queryOptions({
    queryKey: projectKeys.activity(projectId),
    queryFn: async () => (await api.get<{ activity: ActivityEntry[] }>(`/projects/${projectId}/activity`)).activity,
  });

export const useActivity = (projectId: number) => useQuery(activityQuery(projectId));
