import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { AdminUser, CreateUserBody, UpdateUserFields } from '../../../../server/schemas/admin';
import { api } from '../../../lib/api-client';
import { authKeys } from '../../auth/api/auth';

export const adminKeys = {
  all: ['admin'] as const,
  users: () => [...adminKeys.all, 'users'] as const,
};

export const adminUsersQuery = queryOptions({
  queryKey: adminKeys.users(),
  queryFn: async () => (await api.get<{ users: AdminUser[] }>('/admin/users')).users,
});

/** `enabled` is false for non-admins, who would only get a 403. */
export const useAdminUsers = (enabled: boolean) => useQuery({ ...adminUsersQuery, enabled });

export function useCreateUser() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: async (body: CreateUserBody) => (await api.create<{ user: AdminUser }>('/admin/users', body)).user,
    onSuccess: () => qc.invalidateQueries({ queryKey: adminKeys.users() }),
  });
}

export function useUpdateUser() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: async ({ id, ...fields }: UpdateUserFields & { id: number }) =>
      (await api.patch<{ user: AdminUser }>(`/admin/users/${id}`, fields)).user,
    onSuccess: (user) => {
      qc.setQueryData<AdminUser[]>(adminKeys.users(), (users) => users?.map((u) => (u.id === user.id ? user : u)));
      // An admin may change their own name or role: the header shows both.
      return qc.invalidateQueries({ queryKey: authKeys.me });
    },
  });
}
