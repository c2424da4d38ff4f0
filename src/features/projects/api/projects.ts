import { queryOptions, useMutation, useQuery, useQueryClient, type QueryClient } from '@tanstack/react-query';
import type {
  CreateProjectBody,
  ProjectDetail,
  ProjectSummary,
  UpdateProjectBody,
} from '../../../../server/schemas/projects';
import { api } from '../../../lib/api-client';

// Members, activity and recordings sit under the project's key, so refreshing a project refreshes them too.
export const projectKeys = {
  all: ['projects'] as const,
  list: () => [...projectKeys.all, 'list'] as const,
  detail: (id: number) => [...projectKeys.all, 'detail', id] as const,
  members: (id: number) => [...projectKeys.detail(id), 'members'] as const,
  activity: (id: number) => [...projectKeys.detail(id), 'activity'] as const,
  recordings: (id: number) => [...projectKeys.detail(id), 'recordings'] as const,
};

/** After any change in a project: its page (members, activity, recordings) and the list (counts, last activity). */
export function refreshProject(qc: QueryClient, id: number) {
  return Promise.all([
    qc.invalidateQueries({ queryKey: projectKeys.detail(id) }),
    qc.invalidateQueries({ queryKey: projectKeys.list() }),
  ]);
}

export const projectListQuery = queryOptions({
  queryKey: projectKeys.list(),
  queryFn: async () => (await api.get<{ projects: ProjectSummary[] }>('/projects')).projects,
});

export const useProjects = () => useQuery(projectListQuery);

export const projectQuery = (id: number) =>
  queryOptions({
    queryKey: projectKeys.detail(id),
    queryFn: async () => (await api.get<{ project: ProjectDetail }>(`/projects/${id}`)).project,
  });

export const useProject = (id: number) => useQuery(projectQuery(id));

export function useCreateProject() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: async (body: CreateProjectBody) =>
      (await api.create<{ project: ProjectDetail }>('/projects', body)).project,
    onSuccess: (project) => {
      qc.setQueryData(projectKeys.detail(project.id), project);
      return qc.invalidateQueries({ queryKey: projectKeys.list() });
    },
  });
}

export function useUpdateProject(id: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: async (body: UpdateProjectBody) =>
      (await api.patch<{ project: ProjectDetail }>(`/projects/${id}`, body)).project,
    onSuccess: (project) => {
      qc.setQueryData(projectKeys.detail(id), project);
      return refreshProject(qc, id);
    },
  });
}

/** Archive (true) or restore (false). */
export function useSetArchived(id: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: async (archived: boolean) =>
      (await api.post<{ project: ProjectDetail }>(`/projects/${id}/${archived ? 'archive' : 'restore'}`)).project,
    onSuccess: (project) => {
      qc.setQueryData(projectKeys.detail(id), project);
      return refreshProject(qc, id);
    },
  });
}
