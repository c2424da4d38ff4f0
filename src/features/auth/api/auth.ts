import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { PublicUser, SignInBody } from '../../../../server/schemas/auth';
import { api, forgetCsrfToken } from '../../../lib/api-client';

export const authKeys = { me: ['auth', 'me'] as const };

/** The signed-in user, or null when there is no session (asked so that no session is a 200, not a 401). */
export const meQuery = queryOptions({
  queryKey: authKeys.me,
  queryFn: async (): Promise<PublicUser | null> => (await api.get<{ user: PublicUser | null }>('/auth/session')).user,
  staleTime: 60_000,
});

export const useMe = () => useQuery(meQuery);

export function useSignIn() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: SignInBody) => api.post<{ user: PublicUser }>('/auth/signin', body),
    onSuccess: ({ user }) => {
      forgetCsrfToken();
      qc.clear();
      qc.setQueryData(authKeys.me, user);
    },
  });
}

export function useSignOut() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: () => api.post<void>('/auth/signout'),
    onSettled: () => {
      forgetCsrfToken();
      qc.clear();
      qc.setQueryData(authKeys.me, null);
    },
  });
}
