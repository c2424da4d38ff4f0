import { keepPreviousData, queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { ListViewsQuery, ShareByMailBody, ViewDetail, ViewList } from '../../../../server/schemas/views';
import { api } from '../../../lib/api-client';
import { viewKeys } from './keys';

const listPath = (projectId: number, q: ListViewsQuery) => {
  const params = new URLSearchParams({
    sort: q.sort,
    archived: q.archived,
    page: String(q.page),
    pageSize: String(q.pageSize),
  });
  if (q.order) params.set('order', q.order);
  if (q.q) params.set('q', q.q);
  return `/projects/${projectId}/views?${params}`;
};

export const projectViewsQuery = (projectId: number, query: ListViewsQuery) =>
  queryOptions({
    queryKey: viewKeys.list(projectId, query),
    queryFn: () => api.get<ViewList>(listPath(projectId, query)),
  });

/** One page of the project's views; the previous page stays on screen while the next loads. */
export const useProjectViews = (projectId: number, query: ListViewsQuery) =>
  useQuery({ ...projectViewsQuery(projectId, query), placeholderData: keepPreviousData });

const PAGE = 100; // the largest page the server gives

/**
 * Views per registered recording, archived ones included. The API has no count per recording, so this
 * reads the whole list a page of 100 at a time (a project's views are few hundred at most).
 */
export const viewCountsByRecordingQuery = (projectId: number) =>
  queryOptions({
    queryKey: viewKeys.countsByRecording(projectId),
    queryFn: async () => {
      const counts = new Map<number, number>();
      for (let page = 1; ; page++) {
        const answer = await api.get<ViewList>(
          listPath(projectId, { sort: 'created', order: 'asc', q: '', archived: 'include', page, pageSize: PAGE }),
        );
        for (const v of answer.views) {
          if (v.recordingId !== null) counts.set(v.recordingId, (counts.get(v.recordingId) ?? 0) + 1);
        }
        if (page * PAGE >= answer.total || answer.views.length === 0) return counts;
      }
    },
  });

export const useViewCountsByRecording = (projectId: number) => useQuery(viewCountsByRecordingQuery(projectId));

export const viewQuery = (id: number) =>
  queryOptions({
    queryKey: viewKeys.detail(id),
    queryFn: async () => (await api.get<{ view: ViewDetail }>(`/views/${id}`)).view,
  });

export const useView = (id: number) => useQuery(viewQuery(id));

/** Archive (true) or restore (false); leads only. */
export function useArchiveView() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: async ({ id, archived }: { id: number; archived: boolean }) =>
      (await api.post<{ view: ViewDetail }>(`/views/${id}/archive`, { archived })).view,
    onSuccess: (view) => {
      qc.setQueryData(viewKeys.detail(view.id), view);
      return qc.invalidateQueries({ queryKey: viewKeys.lists(view.projectId) });
    },
  });
}

export function useShareByMail(viewId: number) {
  return useMutation({
    mutationFn: (body: ShareByMailBody) =>
      api.create<{ sharedWith: { name: string; email: string } }>(`/views/${viewId}/share`, body),
  });
}
