import { useState } from 'react';
import { useNavigate } from 'react-router-dom';
import { Notice } from '../../../components/ui/notice';
import { Section } from '../../../components/ui/section';
import { paths } from '../../../config/paths';
import { useMe } from '../../auth/api/auth';
import { useMembers } from '../api/members';
import { InviteForm } from './invite-form';
import { MembersTable } from './members-table';
import { PendingInvitations } from './pending-invitations';

export function MembersSection({ projectId, isLead }: { projectId: number; isLead: boolean }) {
  const { data, isPending, error } = useMembers(projectId);
  const { data: me } = useMe();
  const navigate = useNavigate();
  // One place for the answers of the row actions, e.g. the 409 when the last lead would go.
  const [problem, setProblem] = useState<string | null>(null);

  return (
    <Section title="Members">
      <div className="flex flex-col gap-5">
        {isPending && <p className="text-sm text-mist-500">Loading members…</p>}
        {error && <Notice tone="error">{error.message}</Notice>}
        {problem && <Notice tone="error">{problem}</Notice>}
        {data && (
          <MembersTable
            projectId={projectId}
            members={data.members}
            isLead={isLead}
            myUserId={me?.id}
            onProblem={setProblem}
            onRemovedSelf={() => navigate(paths.projects, { replace: true })}
          />
        )}
        {isLead && data && data.invitations.length > 0 && (
          <PendingInvitations projectId={projectId} invitations={data.invitations} onProblem={setProblem} />
        )}
        {isLead && <InviteForm projectId={projectId} />}
      </div>
    </Section>
  );
}
