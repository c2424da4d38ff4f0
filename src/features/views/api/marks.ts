import { queryOptions, useMutation, useQuery, useQueryClient, type QueryClient } from '@tanstack/react-query';
import type { CreateMarkBody, Mark, ThreadComment } from '../../../../server/schemas/views';
import { api } from '../../../lib/api-client';
import { viewKeys } from './keys';

export const marksQuery = (viewId: number) =>
  queryOptions({
    queryKey: viewKeys.marks(viewId),
    queryFn: async () => (await api.get<{ marks: Mark[] }>(`/views/${viewId}/marks`)).marks,
  });

export const useMarks = (viewId: number, enabled = true) => useQuery({ ...marksQuery(viewId), enabled });

/** The project's views table counts marks and threads. */
const refreshLists = (qc: QueryClient) => qc.invalidateQueries({ queryKey: [...viewKeys.all, 'list'] });

export function useCreateMark(viewId: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: async (body: CreateMarkBody) => (await api.create<{ mark: Mark }>(`/views/${viewId}/marks`, body)).mark,
    onSuccess: () => Promise.all([qc.invalidateQueries({ queryKey: viewKeys.marks(viewId) }), refreshLists(qc)]),
  });
}

/** Edits the text; a stale version rejects with ConflictWithCurrent<Mark>. */
export function useUpdateMarkText(viewId: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: async ({ id, version, text }: { id: number; version: number; text: string }) =>
      (await api.patch<{ mark: Mark }>(`/marks/${id}`, { version, text })).mark,
    onSuccess: (mark) => {
      qc.setQueryData<Mark[]>(viewKeys.marks(viewId), (old) => old?.map((m) => (m.id === mark.id ? mark : m)));
    },
  });
}

export function useDeleteMark(viewId: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (id: number) => api.delete<void>(`/marks/${id}`),
    onSuccess: () => Promise.all([qc.invalidateQueries({ queryKey: viewKeys.marks(viewId) }), refreshLists(qc)]),
  });
}

// ---------------------------------------------------------------- threads

export const markThreadQuery = (viewId: number, markId: number) =>
  queryOptions({
    queryKey: viewKeys.markThread(viewId, markId),
    queryFn: async () => (await api.get<{ comments: ThreadComment[] }>(`/marks/${markId}/comments`)).comments,
  });

export const useMarkThread = (viewId: number, markId: number) => useQuery(markThreadQuery(viewId, markId));

export const viewThreadQuery = (viewId: number) =>
  queryOptions({
    queryKey: viewKeys.viewThread(viewId),
    queryFn: async () => (await api.get<{ comments: ThreadComment[] }>(`/views/${viewId}/comments`)).comments,
  });

export const useViewThread = (viewId: number) => useQuery(viewThreadQuery(viewId));

/** A reply in a mark's thread (markId) or in the view's own (null). */
export function usePostComment(viewId: number, markId: number | null) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: async (body: string) =>
      (
        await api.create<{ comment: ThreadComment }>(
          markId === null ? `/views/${viewId}/comments` : `/marks/${markId}/comments`,
          { body },
        )
      ).comment,
    onSuccess: () =>
      Promise.all([
        qc.invalidateQueries({ queryKey: markId === null ? viewKeys.viewThread(viewId) : viewKeys.markThread(viewId, markId) }),
        qc.invalidateQueries({ queryKey: viewKeys.marks(viewId) }),
        refreshLists(qc),
      ]),
  });
}
