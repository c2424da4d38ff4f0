import { projectRoles, type ProjectMember, type ProjectRole } from '../../../../server/schemas/projects';
import { Button } from '../../../components/ui/button';
import { compactSelectClass, tableHeadRowClass } from '../../../components/ui/styles';
import { useChangeMemberRole, useRemoveMember } from '../api/members';

interface MembersTableProps {
  projectId: number;
  members: ProjectMember[];
  isLead: boolean;
  myUserId: number | undefined;
  onProblem: (message: string | null) => void;
  onRemovedSelf: () => void;
}

export function MembersTable({ projectId, members, isLead, myUserId, onProblem, onRemovedSelf }: MembersTableProps) {
  const changeRole = useChangeMemberRole(projectId);
  const remove = useRemoveMember(projectId);
  const busy = (userId: number) =>
    (changeRole.isPending && changeRole.variables?.userId === userId) ||
    (remove.isPending && remove.variables === userId);

  const onRole = (userId: number, role: ProjectRole) => {
    onProblem(null);
    changeRole.mutate({ userId, role }, { onError: (e) => onProblem(e.message) });
  };
  const onRemove = (userId: number) => {
    onProblem(null);
    remove.mutate(userId, {
      onSuccess: () => userId === myUserId && onRemovedSelf(),
      onError: (e) => onProblem(e.message),
    });
  };

  return (
    <table className="w-full border-collapse text-sm">
      <thead>
        <tr className={tableHeadRowClass}>
          <th className="py-2 pr-4 font-medium">Name</th>
          <th className="py-2 pr-4 font-medium">E-mail</th>
          <th className="py-2 pr-4 font-medium">Role</th>
          {isLead && (
            <th className="py-2 font-medium">
              <span className="sr-only">Actions</span>
            </th>
          )}
        </tr>
      </thead>
      <tbody>
        {members.map((m) => (
          <tr key={m.userId} className="border-b border-ink-800">
            <td className="py-2 pr-4 text-mist-100">
              {m.name}
              {m.userId === myUserId && <span className="ml-2 text-xs text-mist-500">you</span>}
            </td>
            <td className="break-all py-2 pr-4 text-mist-300">{m.email}</td>
            <td className="py-2 pr-4 text-mist-300">
              {isLead ? (
                <select
                  aria-label={`Role of ${m.name}`}
                  className={compactSelectClass}
                  value={m.role}
                  disabled={busy(m.userId)}
                  onChange={(e) => onRole(m.userId, e.target.value as ProjectRole)}
                >
                  {projectRoles.map((r) => (
                    <option key={r} value={r}>
                      {r}
                    </option>
                  ))}
                </select>
              ) : (
                m.role
              )}
            </td>
            {isLead && (
              <td className="py-2 text-right">
                <Button
                  type="button"
                  variant="danger"
                  className="px-2.5 py-1"
                  aria-label={`Remove ${m.name}`}
                  disabled={busy(m.userId)}
                  onClick={() => onRemove(m.userId)}
                >
                  Remove
                </Button>
              </td>
            )}
          </tr>
        ))}
      </tbody>
    </table>
  );
}
