import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ProjectSummary } from '../../../../server/schemas/projects';
import { api } from '../../../lib/api-client';

export const projectKeys = {
  all: ['projects'] as const,
  list: () => [...projectKeys.all, 'list'] as const,
};

export const projectListQuery = queryOptions({
  queryKey: projectKeys.list(),
  queryFn: async () => (await api.get<{ projects: ProjectSummary[] }>('/projects')).projects,
});

export const useProjects = () => useQuery(projectListQuery);
