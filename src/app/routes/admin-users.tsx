import { useState } from 'react';
import { Notice } from '../../components/ui/notice';
import { useMe } from '../../features/auth/api/auth';
import { useAdminUsers } from '../../features/admin/api/users';
import { CreateUserForm } from '../../features/admin/components/create-user-form';
import { UsersTable } from '../../features/admin/components/users-table';

export function AdminUsersPage() {
  const { data: me } = useMe();
  const isAdmin = me?.siteRole === 'admin';
  const { data: users, isPending, error } = useAdminUsers(isAdmin);
  const [problem, setProblem] = useState<string | null>(null);

  if (!isAdmin) {
    return (
      <div className="mx-auto max-w-5xl px-6 py-8">
        <h1 className="mb-6 text-xl font-semibold">Users</h1>
        <Notice>Only site admins manage users.</Notice>
      </div>
    );
  }
  return (
    <div className="mx-auto max-w-6xl px-6 py-8">
      <h1 className="mb-6 text-xl font-semibold">Users</h1>
      <div className="flex flex-col gap-4">
        {isPending && <p className="text-sm text-mist-500">Loading users…</p>}
        {error && <Notice tone="error">{error.message}</Notice>}
        {problem && <Notice tone="error">{problem}</Notice>}
        {users && <UsersTable users={users} myUserId={me.id} onProblem={setProblem} />}
      </div>
      <div className="mt-10 max-w-xl">
        <CreateUserForm />
      </div>
    </div>
  );
}
