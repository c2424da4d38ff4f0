import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { PublicUser } from '../../../../server/schemas/auth';
import type { AcceptInvitationBody, InvitationPreview } from '../../../../server/schemas/projects';
import { api, forgetCsrfToken } from '../../../lib/api-client';
import { authKeys } from '../../auth/api/auth';
import { projectKeys } from '../../projects/api/projects';

export const invitationKeys = {
  all: ['invitations'] as const,
  preview: (token: string) => [...invitationKeys.all, token] as const,
};

export const invitationQuery = (token: string) =>
  queryOptions({
    queryKey: invitationKeys.preview(token),
    queryFn: async () => (await api.get<{ invitation: InvitationPreview }>(`/invitations/${token}`)).invitation,
  });

export const useInvitation = (token: string) => useQuery(invitationQuery(token));

export interface AcceptAnswer {
  user: PublicUser;
  projectId: number;
}

/** `{}` when signed in as the invitee; `{ name, password }` creates the account and signs it in. */
export function useAcceptInvitation(token: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: AcceptInvitationBody) => api.post<AcceptAnswer>(`/invitations/${token}/accept`, body),
    onSuccess: async ({ user }) => {
      // A new account comes with a new session, and the cross-site token is bound to the session.
      forgetCsrfToken();
      qc.setQueryData(authKeys.me, user);
      qc.removeQueries({ queryKey: invitationKeys.preview(token) }); // used up
      await Promise.all([
        qc.invalidateQueries({ queryKey: authKeys.me }),
        qc.invalidateQueries({ queryKey: projectKeys.all }),
      ]);
    },
  });
}
