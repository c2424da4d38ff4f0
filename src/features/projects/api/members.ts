import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type {
  ChangeMemberBody,
  InviteBody,
  PendingInvitation,
  ProjectMember,
} from '../../../../server/schemas/projects';
import { api } from '../../../lib/api-client';
import { projectKeys, refreshProject } from './projects';

/** `invitations` is filled only when the caller leads the project. */
export interface MembersAnswer {
  members: ProjectMember[];
  invitations: PendingInvitation[];
}

export const membersQuery = (projectId: number) =>
  queryOptions({
    queryKey: projectKeys.members(projectId),
    queryFn: () => api.get<MembersAnswer>(`/projects/${projectId}/members`),
  });

export const useMembers = (projectId: number) => useQuery(membersQuery(projectId));

export function useInvite(projectId: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: async (body: InviteBody) =>
      api.create<{ invitation: PendingInvitation; mailSent: boolean }>(`/projects/${projectId}/invitations`, body),
    onSuccess: () => refreshProject(qc, projectId),
  });
}

export function useRevokeInvitation(projectId: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (invitationId: number) => api.delete<void>(`/projects/${projectId}/invitations/${invitationId}`),
    onSuccess: () => refreshProject(qc, projectId),
  });
}

export function useChangeMemberRole(projectId: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: async ({ userId, ...body }: ChangeMemberBody & { userId: number }) =>
      (await api.patch<{ member: ProjectMember }>(`/projects/${projectId}/members/${userId}`, body)).member,
    onSuccess: () => refreshProject(qc, projectId),
  });
}

export function useRemoveMember(projectId: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (userId: number) => api.delete<void>(`/projects/${projectId}/members/${userId}`),
    onSuccess: () => refreshProject(qc, projectId),
  });
}
