import type { ListViewsQuery } from '../../../../server/schemas/views';

// Everything of one view (marks, threads, links, snapshot) sits under its key, so one invalidation refreshes it.
export const viewKeys = {
  all: ['views'] as const,
  lists: (projectId: number) => [...viewKeys.all, 'list', projectId] as const,
  list: (projectId: number, query: ListViewsQuery) => [...viewKeys.lists(projectId), query] as const,
  countsByRecording: (projectId: number) => [...viewKeys.lists(projectId), 'by-recording'] as const,
  detail: (id: number) => [...viewKeys.all, 'detail', id] as const,
  snapshot: (id: number) => [...viewKeys.detail(id), 'snapshot'] as const,
  marks: (id: number) => [...viewKeys.detail(id), 'marks'] as const,
  markThread: (viewId: number, markId: number) => [...viewKeys.detail(viewId), 'mark-thread', markId] as const,
  viewThread: (id: number) => [...viewKeys.detail(id), 'thread'] as const,
  links: (id: number) => [...viewKeys.detail(id), 'links'] as const,
  shared: (token: string) => [...viewKeys.all, 'shared', token] as const,
  sharedSnapshot: (token: string) => [...viewKeys.shared(token), 'snapshot'] as const,
  notifications: ['me', 'notifications'] as const,
};
