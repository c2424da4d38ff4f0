import { useState } from 'react';
import { useParams } from 'react-router-dom';
import type { SharedViewBundle, ThreadComment } from '../../../server/schemas/views';
import { PublicFrame } from '../../components/layouts/public-frame';
import { Notice } from '../../components/ui/notice';
import { cardClass } from '../../components/ui/styles';
import { useSharedReply, useSharedView } from '../../features/views/api/share-links';
import { useSharedSnapshot } from '../../features/views/api/snapshot';
import { SharedFrame } from '../../features/views/components/shared-frame';
import { CommentList, GuestReplyForm, WriteReplyButton } from '../../features/views/components/thread';
import { ViewHeading } from '../../features/views/components/view-heading';
import { ViewLayout } from '../../features/views/components/view-layout';
import { ApiError } from '../../lib/api-client';
import { formatDateTime } from '../../lib/format';
import { useSelectedMark } from '../../features/views/hooks/use-selected-mark';

/** A view opened through a share link, without an account: read-only, with named replies when the link allows. */
export function SharedViewPage() {
  const token = useParams().token ?? '';
  const bundle = useSharedView(token);
  if (bundle.isPending) {
    return (
      <PublicFrame>
        <p className="text-sm text-mist-500">Opening the shared view…</p>
      </PublicFrame>
    );
  }
  if (bundle.error) {
    const gone = bundle.error instanceof ApiError && bundle.error.status === 404;
    return (
      <PublicFrame>
        <div className={cardClass} data-testid="shared-link-invalid">
          <h1 className="text-lg font-medium">{gone ? 'This link is no longer valid' : 'The view cannot be opened'}</h1>
          <p className="text-sm text-mist-300">{bundle.error.message}</p>
          {gone && (
            <p className="text-sm text-mist-500">
              Share links can expire or be revoked by the project. If you are a member of the project, sign in to open
              the view from the project page.
            </p>
          )}
        </div>
      </PublicFrame>
    );
  }
  return <SharedView token={token} bundle={bundle.data} />;
}

function SharedView({ token, bundle }: { token: string; bundle: SharedViewBundle }) {
  const { view, marks, comments, mayReply } = bundle;
  const snapshot = useSharedSnapshot(token, view.hasSnapshot);
  const reply = useSharedReply(token);
  const [name, setName] = useState('');
  const { selectedMarkId, selectMark } = useSelectedMark();

  const threadOf = (markId: number | null): ThreadComment[] => comments.filter((c) => c.markId === markId);
  // the reply box is open under the selected mark and under the view
  const thread = (markId: number | null, open: boolean) => (
    <div className="flex flex-col gap-3">
      <CommentList comments={threadOf(markId)} />
      {mayReply &&
        (open ? (
          <GuestReplyForm name={name} onName={setName} onSend={(values) => reply.mutateAsync({ ...values, markId })} />
        ) : (
          <WriteReplyButton onClick={() => markId !== null && selectMark(markId)} />
        ))}
    </div>
  );

  return (
    <SharedFrame projectName={view.projectName}>
      <ViewLayout
        heading={
          <>
            <ViewHeading
              title={view.title}
              archived={false}
              facts={[
                { label: 'Project', value: view.projectName },
                { label: 'Recording', value: view.recordingName ?? 'not linked' },
                { label: 'Updated', value: <span className="font-mono text-xs">{formatDateTime(view.updatedAt)}</span> },
              ]}
            />
            <div className="mb-6">
              <Notice>
                {mayReply
                  ? 'You opened this view through a share link. You may read it and reply under your name.'
                  : 'You opened this view through a read-only share link.'}
              </Notice>
            </div>
          </>
        }
        state={view.state}
        snapshot={{ hasSnapshot: view.hasSnapshot, data: snapshot.data, isPending: snapshot.isPending, error: snapshot.error }}
        marks={marks}
        selectedMarkId={selectedMarkId}
        onSelectMark={selectMark}
        markParts={(m, _n, selected) => ({ thread: thread(m.id, selected) })}
        discussion={thread(null, true)}
      />
    </SharedFrame>
  );
}
