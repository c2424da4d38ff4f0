import { siteRoles, type SiteRole } from '../../../../server/schemas/auth';
import type { AdminUser, UpdateUserFields } from '../../../../server/schemas/admin';
import { compactSelectClass, tableHeadRowClass } from '../../../components/ui/styles';
import { formatDateTime } from '../../../lib/format';
import { useUpdateUser } from '../api/users';

export function UsersTable({
  users,
  myUserId,
  onProblem,
}: {
  users: AdminUser[];
  myUserId: number | undefined;
  onProblem: (message: string | null) => void;
}) {
  const update = useUpdateUser();
  const change = (id: number, fields: UpdateUserFields) => {
    onProblem(null);
    update.mutate({ id, ...fields }, { onError: (e) => onProblem(e.message) });
  };
  return (
    <table className="w-full border-collapse text-sm">
      <thead>
        <tr className={tableHeadRowClass}>
          <th className="py-2 pr-4 font-medium">Name</th>
          <th className="py-2 pr-4 font-medium">E-mail</th>
          <th className="py-2 pr-4 font-medium">Site role</th>
          <th className="py-2 pr-4 font-medium">Disabled</th>
          <th className="py-2 pr-4 text-right font-medium">Projects</th>
          <th className="py-2 font-medium">Created</th>
        </tr>
      </thead>
      <tbody>
        {users.map((u) => {
          const busy = update.isPending && update.variables?.id === u.id;
          return (
            <tr key={u.id} className={`border-b border-ink-800 ${u.disabled ? 'text-mist-500' : ''}`}>
              <td className="py-2 pr-4">
                {u.name}
                {u.id === myUserId && <span className="ml-2 text-xs text-mist-500">you</span>}
              </td>
              <td className="break-all py-2 pr-4 text-mist-300">{u.email}</td>
              <td className="py-2 pr-4">
                <select
                  aria-label={`Site role of ${u.name}`}
                  className={compactSelectClass}
                  value={u.siteRole}
                  disabled={busy}
                  onChange={(e) => change(u.id, { siteRole: e.target.value as SiteRole })}
                >
                  {siteRoles.map((r) => (
                    <option key={r} value={r}>
                      {r}
                    </option>
                  ))}
                </select>
              </td>
              <td className="py-2 pr-4">
                <input
                  type="checkbox"
                  aria-label={`Disable ${u.name}`}
                  className="h-4 w-4 accent-accent"
                  checked={u.disabled}
                  disabled={busy}
                  onChange={(e) => change(u.id, { disabled: e.target.checked })}
                />
              </td>
              <td className="py-2 pr-4 text-right font-mono">{u.projectCount}</td>
              <td className="py-2 font-mono text-xs text-mist-300">{formatDateTime(u.createdAt)}</td>
            </tr>
          );
        })}
      </tbody>
    </table>
  );
}
