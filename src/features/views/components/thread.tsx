import { zodResolver } from '@hookform/resolvers/zod';
import { useEffect, useRef, useState } from 'react';
import { useForm } from 'react-hook-form';
import { useLocation } from 'react-router-dom';
import { z } from 'zod';
import { COMMENT_MAX, createCommentBody, sharedCommentBody, type ThreadComment } from '../../../../server/schemas/views';
import { Button } from '../../../components/ui/button';
import { Notice } from '../../../components/ui/notice';
import { TextAreaField } from '../../../components/ui/text-area-field';
import { TextField } from '../../../components/ui/text-field';
import { applyServerErrors } from '../../../lib/form-errors';
import { formatDateTime } from '../../../lib/format';

/** The comments of one thread, oldest first; `#comment-<id>` in the address scrolls to one and rings it. */
export function CommentList({ comments }: { comments: ThreadComment[] }) {
  const { hash } = useLocation();
  const target = /^#comment-(\d+)$/.exec(hash)?.[1];
  const scrolled = useRef(false);
  useEffect(() => {
    if (scrolled.current || !target) return;
    const el = document.getElementById(`comment-${target}`);
    if (el) {
      scrolled.current = true;
      el.scrollIntoView({ block: 'center' });
    }
  }, [target, comments]);

  if (comments.length === 0) return <p className="text-xs text-mist-500">No replies yet.</p>;
  return (
    <ol className="flex flex-col gap-2">
      {comments.map((c) => (
        <li
          key={c.id}
          id={`comment-${c.id}`}
          className={`rounded-md bg-ink-950/60 px-3 py-2 ${String(c.id) === target ? 'ring-1 ring-accent/70' : ''}`}
        >
          <p className="mb-0.5 flex flex-wrap items-baseline gap-x-2 text-xs">
            <span className="font-medium text-mist-100">{c.author.name}</span>
            {c.author.viaLink && <span className="text-mist-500">through a share link</span>}
            <time dateTime={c.createdAt} className="ml-auto font-mono text-mist-500">
              {formatDateTime(c.createdAt)}
            </time>
          </p>
          <p className="whitespace-pre-line break-words text-sm text-mist-300">{c.body}</p>
        </li>
      ))}
    </ol>
  );
}

/** In place of a closed reply box. */
export function WriteReplyButton({ onClick }: { onClick: () => void }) {
  return (
    <div>
      <button type="button" onClick={onClick} className="text-xs text-accent hover:underline">
        Write a reply
      </button>
    </div>
  );
}

type MemberInput = z.input<typeof createCommentBody>;
type MemberOutput = z.output<typeof createCommentBody>;

/** A member's reply. */
export function ReplyForm({ onSend, disabled = false }: { onSend: (body: string) => Promise<unknown>; disabled?: boolean }) {
  const [formError, setFormError] = useState<string | null>(null);
  const form = useForm<MemberInput, unknown, MemberOutput>({ resolver: zodResolver(createCommentBody), defaultValues: { body: '' } });
  const { errors, isSubmitting } = form.formState;
  const onSubmit = form.handleSubmit(async ({ body }) => {
    setFormError(null);
    try {
      await onSend(body);
      form.reset({ body: '' });
    } catch (e) {
      setFormError(applyServerErrors(e, form.setError));
    }
  });
  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-2">
      {formError && <Notice tone="error">{formError}</Notice>}
      <TextAreaField label="Reply" rows={2} maxLength={COMMENT_MAX} error={errors.body?.message} {...form.register('body')} />
      <div>
        <Button type="submit" variant="quiet" className="px-3 py-1.5" disabled={disabled || isSubmitting}>
          {isSubmitting ? 'Sending…' : 'Send reply'}
        </Button>
      </div>
    </form>
  );
}

const guestReply = sharedCommentBody.pick({ name: true, body: true });
type GuestInput = z.input<typeof guestReply>;
type GuestOutput = z.output<typeof guestReply>;

/** A reply through a share link: a name instead of an account (kept between the page's reply boxes). */
export function GuestReplyForm({
  onSend,
  name,
  onName,
}: {
  onSend: (values: GuestOutput) => Promise<unknown>;
  name: string;
  onName: (name: string) => void;
}) {
  const [formError, setFormError] = useState<string | null>(null);
  const form = useForm<GuestInput, unknown, GuestOutput>({ resolver: zodResolver(guestReply), defaultValues: { name, body: '' } });
  const { errors, isSubmitting } = form.formState;
  useEffect(() => {
    if (!form.getValues('name')) form.setValue('name', name);
  }, [name, form]);
  const onSubmit = form.handleSubmit(async (values) => {
    setFormError(null);
    try {
      await onSend(values);
      onName(values.name);
      form.reset({ name: values.name, body: '' });
    } catch (e) {
      setFormError(applyServerErrors(e, form.setError));
    }
  });
  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-2">
      {formError && <Notice tone="error">{formError}</Notice>}
      <TextField label="Your name" autoComplete="name" maxLength={120} error={errors.name?.message} {...form.register('name')} />
      <TextAreaField label="Reply" rows={2} maxLength={COMMENT_MAX} error={errors.body?.message} {...form.register('body')} />
      <div>
        <Button type="submit" variant="quiet" className="px-3 py-1.5" disabled={isSubmitting}>
          {isSubmitting ? 'Sending…' : 'Send reply'}
        </Button>
      </div>
    </form>
  );
}
