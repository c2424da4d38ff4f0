import type { PendingInvitation } from '../../../../server/schemas/projects';
import { Button } from '../../../components/ui/button';
import { formatDateTime } from '../../../lib/format';
import { useRevokeInvitation } from '../api/members';

export function PendingInvitations({
  projectId,
  invitations,
  onProblem,
}: {
  projectId: number;
  invitations: PendingInvitation[];
  onProblem: (message: string | null) => void;
}) {
  const revoke = useRevokeInvitation(projectId);
  return (
    <div>
      <h3 className="mb-2 text-sm font-medium text-mist-300">Pending invitations</h3>
      <ul className="flex flex-col divide-y divide-ink-800 text-sm">
        {invitations.map((inv) => (
          <li key={inv.id} className="flex flex-wrap items-center gap-x-4 gap-y-1 py-2">
            <span className="break-all text-mist-100">{inv.email}</span>
            <span className="text-mist-300">{inv.role}</span>
            <span className="text-xs text-mist-500">
              until <span className="font-mono">{formatDateTime(inv.expiresAt)}</span>
              {inv.invitedBy && <> · by {inv.invitedBy}</>}
            </span>
            <Button
              type="button"
              variant="danger"
              className="ml-auto px-2.5 py-1"
              aria-label={`Revoke the invitation for ${inv.email}`}
              disabled={revoke.isPending && revoke.variables === inv.id}
              onClick={() => {
                onProblem(null);
                revoke.mutate(inv.id, { onError: (e) => onProblem(e.message) });
              }}
            >
              Revoke
            </Button>
          </li>
        ))}
      </ul>
    </div>
  );
}
