import { useReducer, useState } from 'react';
import { Link, useNavigate, useParams } from 'react-router-dom';
import type { PublicUser } from '../../../server/schemas/auth';
import type { InvitationPreview } from '../../../server/schemas/projects';
import { PublicFrame } from '../../components/layouts/public-frame';
import { Button } from '../../components/ui/button';
import { Notice } from '../../components/ui/notice';
import { cardClass, linkClass } from '../../components/ui/styles';
import { paths, signInThen } from '../../config/paths';
import { useMe, useSignOut } from '../../features/auth/api/auth';
import { useAcceptInvitation, useInvitation, type AcceptAnswer } from '../../features/invitations/api/invitations';
import { NewAccountForm } from '../../features/invitations/components/new-account-form';
import { ApiError } from '../../lib/api-client';
import { formatDateTime } from '../../lib/format';

export function InvitationPage() {
  const token = useParams().token ?? '';
  const navigate = useNavigate();
  const me = useMe();
  const invitation = useInvitation(token);
  // Sign-out empties the query cache without telling this page's queries: a render picks up the new ones.
  const [, rerender] = useReducer((n: number) => n + 1, 0);
  const onAccepted = ({ projectId }: AcceptAnswer) => navigate(paths.project(projectId), { replace: true });

  let body;
  if (invitation.isPending || me.isPending) {
    body = <p className="text-sm text-mist-500">Loading the invitation…</p>;
  } else if (invitation.error) {
    body = (
      <div className={cardClass}>
        <h1 className="text-lg font-medium">Invitation</h1>
        <Notice tone="error">
          {invitation.error instanceof ApiError && invitation.error.status < 500 && invitation.error.status !== 0
            ? 'This invitation is unknown, has expired or was already used. Ask the project lead for a new one.'
            : invitation.error.message}
        </Notice>
      </div>
    );
  } else {
    body = (
      <div className="flex flex-col gap-4">
        <Summary invitation={invitation.data} />
        <Decision
          token={token}
          invitation={invitation.data}
          me={me.data ?? null}
          onAccepted={onAccepted}
          onSignedOut={rerender}
        />
      </div>
    );
  }
  return <PublicFrame>{body}</PublicFrame>;
}

function Summary({ invitation }: { invitation: InvitationPreview }) {
  return (
    <div className={cardClass}>
      <h1 className="text-lg font-medium">
        Join <span className="text-accent">{invitation.projectName}</span>
      </h1>
      <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1.5 text-sm">
        <dt className="text-mist-500">Role</dt>
        <dd>{invitation.role}</dd>
        <dt className="text-mist-500">Invited by</dt>
        <dd>{invitation.invitedBy ?? 'not known'}</dd>
        <dt className="text-mist-500">For</dt>
        <dd className="break-all">{invitation.email}</dd>
        <dt className="text-mist-500">Valid until</dt>
        <dd className="font-mono text-xs leading-5">{formatDateTime(invitation.expiresAt)}</dd>
      </dl>
    </div>
  );
}

function Decision({
  token,
  invitation,
  me,
  onAccepted,
  onSignedOut,
}: {
  token: string;
  invitation: InvitationPreview;
  me: PublicUser | null;
  onAccepted: (answer: AcceptAnswer) => void;
  onSignedOut: () => void;
}) {
  if (me && me.email.toLowerCase() === invitation.email.toLowerCase()) {
    return <AcceptAsMe token={token} onAccepted={onAccepted} />;
  }
  if (me) return <SignedInAsOther me={me} invitation={invitation} onSignedOut={onSignedOut} />;
  if (invitation.accountExists) {
    return (
      <div className={cardClass}>
        <p className="text-sm text-mist-300">
          An account for <span className="text-mist-100">{invitation.email}</span> exists. Sign in with it to accept.
        </p>
        <Link to={signInThen(paths.invitation(token))} className={`text-sm ${linkClass}`}>
          Sign in to accept
        </Link>
      </div>
    );
  }
  return <NewAccountForm token={token} email={invitation.email} onAccepted={onAccepted} />;
}

function AcceptAsMe({ token, onAccepted }: { token: string; onAccepted: (answer: AcceptAnswer) => void }) {
  const accept = useAcceptInvitation(token);
  const [problem, setProblem] = useState<string | null>(null);
  return (
    <div className={cardClass}>
      {problem && <Notice tone="error">{problem}</Notice>}
      <Button
        type="button"
        disabled={accept.isPending}
        onClick={() => {
          setProblem(null);
          accept.mutate({}, { onSuccess: onAccepted, onError: (e) => setProblem(e.message) });
        }}
      >
        {accept.isPending ? 'Accepting…' : 'Accept and open the project'}
      </Button>
    </div>
  );
}

function SignedInAsOther({
  me,
  invitation,
  onSignedOut,
}: {
  me: PublicUser;
  invitation: InvitationPreview;
  onSignedOut: () => void;
}) {
  const signOut = useSignOut();
  return (
    <div className={cardClass}>
      <p className="text-sm text-mist-300">
        You are signed in as <span className="text-mist-100">{me.email}</span>, but this invitation is for{' '}
        <span className="text-mist-100">{invitation.email}</span>. Sign out to accept it with the invited e-mail.
      </p>
      <Button type="button" variant="quiet" disabled={signOut.isPending} onClick={() => signOut.mutate(undefined, { onSettled: onSignedOut })}>
        Sign out
      </Button>
    </div>
  );
}
