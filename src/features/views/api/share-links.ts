import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { SharedCommentBody, SharedViewBundle, ShareLinkSummary, ThreadComment } from '../../../../server/schemas/views';
import { api } from '../../../lib/api-client';
import { viewKeys } from './keys';

export const shareLinksQuery = (viewId: number, enabled: boolean) =>
  queryOptions({
    queryKey: viewKeys.links(viewId),
    queryFn: async () => (await api.get<{ links: ShareLinkSummary[] }>(`/views/${viewId}/links`)).links,
    enabled,
  });

export const useShareLinks = (viewId: number, enabled: boolean) => useQuery(shareLinksQuery(viewId, enabled));

/** The answer holds the link's address: the only time it is ever sent. */
export function useCreateShareLink(viewId: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: { expiresAt: string | null; mayReply: boolean }) =>
      api.create<{ link: ShareLinkSummary; url: string }>(`/views/${viewId}/links`, body),
    onSuccess: () => qc.invalidateQueries({ queryKey: viewKeys.links(viewId) }),
  });
}

export function useRevokeShareLink(viewId: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (linkId: number) => api.delete<void>(`/links/${linkId}`),
    onSuccess: () => qc.invalidateQueries({ queryKey: viewKeys.links(viewId) }),
  });
}

// ---------------------------------------------------------------- through a link, without an account

export const sharedViewQuery = (token: string) =>
  queryOptions({
    queryKey: viewKeys.shared(token),
    queryFn: () => api.get<SharedViewBundle>(`/shared/${token}`),
  });

export const useSharedView = (token: string) => useQuery(sharedViewQuery(token));

export function useSharedReply(token: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: async (body: SharedCommentBody) =>
      (await api.post<{ comment: ThreadComment }>(`/shared/${token}/comments`, body)).comment,
    onSuccess: (comment) => {
      qc.setQueryData<SharedViewBundle>(viewKeys.shared(token), (old) =>
        old ? { ...old, comments: [...old.comments, comment] } : old,
      );
    },
  });
}
