import { Notice } from '../../../components/ui/notice';
import { WriteReplyButton } from './thread';
import { useMarkThread, usePostComment, useViewThread } from '../api/marks';
import { CommentList, ReplyForm } from './thread';

/**
 * A mark's thread for a signed-in member; every member may reply (not on an archived view). The reply box
 * is open under the selected mark only, so a long list stays calm.
 */
export function MarkThread({
  viewId,
  markId,
  mayReply,
  open,
  onOpen,
}: {
  viewId: number;
  markId: number;
  mayReply: boolean;
  open: boolean;
  onOpen: () => void;
}) {
  const { data, isPending, error } = useMarkThread(viewId, markId);
  const post = usePostComment(viewId, markId);
  return (
    <div className="flex flex-col gap-3">
      {isPending && <p className="text-xs text-mist-500">Loading the thread…</p>}
      {error && <Notice tone="error">{error.message}</Notice>}
      {data && <CommentList comments={data} />}
      {mayReply && (open ? <ReplyForm onSend={(body) => post.mutateAsync(body)} /> : <WriteReplyButton onClick={onOpen} />)}
    </div>
  );
}

/** The view's own thread. */
export function ViewThread({ viewId, mayReply }: { viewId: number; mayReply: boolean }) {
  const { data, isPending, error } = useViewThread(viewId);
  const post = usePostComment(viewId, null);
  return (
    <div className="flex flex-col gap-3" data-testid="view-thread">
      {isPending && <p className="text-xs text-mist-500">Loading the thread…</p>}
      {error && <Notice tone="error">{error.message}</Notice>}
      {data && <CommentList comments={data} />}
      {mayReply && <ReplyForm onSend={(body) => post.mutateAsync(body)} />}
    </div>
  );
}
