import { zodResolver } from '@hookform/resolvers/zod';
import { useId, useRef, useState, type FormEvent } from 'react';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { shareByMailBody, type ShareLinkSummary } from '../../../../server/schemas/views';
import { Button } from '../../../components/ui/button';
import { Notice } from '../../../components/ui/notice';
import { Section } from '../../../components/ui/section';
import { tableHeadRowClass } from '../../../components/ui/styles';
import { TextField } from '../../../components/ui/text-field';
import { applyServerErrors } from '../../../lib/form-errors';
import { formatDateTime } from '../../../lib/format';
import { useCreateShareLink, useRevokeShareLink, useShareLinks } from '../api/share-links';
import { useShareByMail } from '../api/views';

interface SharePanelProps {
  viewId: number;
  /** An archived view takes no new links. */
  archived: boolean;
  /** For the e-mail field's suggestions. */
  members: { name: string; email: string }[];
}

/** Share links (made, listed, revoked) and sharing with a member by e-mail; engineers and leads. */
export function SharePanel({ viewId, archived, members }: SharePanelProps) {
  return (
    <Section title="Share">
      <div className="flex flex-col gap-5">
        {!archived && <CreateLink viewId={viewId} />}
        <LinkList viewId={viewId} />
        {!archived && <ShareByMail viewId={viewId} members={members} />}
      </div>
    </Section>
  );
}

const today = () => {
  const d = new Date();
  return `${d.getFullYear()}-${String(d.getMonth() + 1).padStart(2, '0')}-${String(d.getDate()).padStart(2, '0')}`;
};

function CreateLink({ viewId }: { viewId: number }) {
  const create = useCreateShareLink(viewId);
  const [expiresOn, setExpiresOn] = useState('');
  const [mayReply, setMayReply] = useState(false);
  const [made, setMade] = useState<{ url: string; mayReply: boolean } | null>(null);
  const [copied, setCopied] = useState(false);
  const urlRef = useRef<HTMLElement>(null);
  const dateId = useId();
  const replyId = useId();

  const submit = (e: FormEvent) => {
    e.preventDefault();
    setCopied(false);
    // the link lasts to the end of the chosen day, in the sharer's time zone
    const expiresAt = expiresOn ? new Date(`${expiresOn}T23:59:59`).toISOString() : null;
    create.mutate(
      { expiresAt, mayReply },
      {
        onSuccess: ({ url, link }) => {
          setMade({ url, mayReply: link.mayReply });
          setExpiresOn('');
          setMayReply(false);
        },
      },
    );
  };

  const copy = async () => {
    if (!made) return;
    try {
      await navigator.clipboard.writeText(made.url);
      setCopied(true);
    } catch {
      // no clipboard (permissions): select the text so Ctrl+C takes it
      const range = document.createRange();
      if (urlRef.current) range.selectNodeContents(urlRef.current);
      window.getSelection()?.removeAllRanges();
      window.getSelection()?.addRange(range);
    }
  };

  return (
    <div className="flex flex-col gap-3">
      <form onSubmit={submit} noValidate className="flex flex-col gap-3" aria-label="Create a share link">
        <p className="text-sm text-mist-300">A link opens this view, its marks and threads without an account.</p>
        {create.error && <Notice tone="error">{create.error.message}</Notice>}
        <div className="flex flex-wrap items-end gap-4">
          <div className="flex flex-col gap-1.5">
            <label htmlFor={dateId} className="text-sm font-medium text-mist-300">
              Expires on <span className="font-normal text-mist-500">(optional)</span>
            </label>
            <input
              id={dateId}
              type="date"
              min={today()}
              value={expiresOn}
              onChange={(e) => setExpiresOn(e.target.value)}
              className="rounded-md border border-ink-700 bg-ink-900 px-3 py-2 font-mono text-sm text-mist-100 focus:border-accent"
            />
          </div>
          <label htmlFor={replyId} className="flex items-center gap-2 pb-2 text-sm text-mist-300">
            <input id={replyId} type="checkbox" checked={mayReply} onChange={(e) => setMayReply(e.target.checked)} className="accent-accent" />
            Visitors may reply
          </label>
        </div>
        <div>
          <Button type="submit" disabled={create.isPending}>
            {create.isPending ? 'Creating…' : 'Create share link'}
          </Button>
        </div>
      </form>
      {made && (
        <div className="flex flex-col gap-2 rounded-md border border-accent/40 bg-ink-950/60 p-3" role="status">
          <p className="text-xs text-mist-300">
            Copy this address now: it is shown only once ({made.mayReply ? 'visitors may reply' : 'read-only'}).
          </p>
          <code ref={urlRef} data-testid="share-link-url" className="break-all font-mono text-xs text-mist-100">
            {made.url}
          </code>
          <div className="flex gap-2">
            <Button type="button" variant="quiet" className="px-3 py-1.5" onClick={copy}>
              {copied ? 'Copied' : 'Copy'}
            </Button>
            <Button type="button" variant="quiet" className="px-3 py-1.5" onClick={() => setMade(null)}>
              Done
            </Button>
          </div>
        </div>
      )}
    </div>
  );
}

const statusText: Record<ShareLinkSummary['status'], string> = { active: 'active', expired: 'expired', revoked: 'revoked' };

function LinkList({ viewId }: { viewId: number }) {
  const { data: links, isPending, error } = useShareLinks(viewId, true);
  const revoke = useRevokeShareLink(viewId);
  if (isPending) return <p className="text-sm text-mist-500">Loading links…</p>;
  if (error) return <Notice tone="error">{error.message}</Notice>;
  if (links.length === 0) return <p className="text-sm text-mist-500">No share links yet.</p>;
  return (
    <div className="flex flex-col gap-2">
      {revoke.error && <Notice tone="error">{revoke.error.message}</Notice>}
      <table className="w-full border-collapse text-sm" data-testid="share-links">
        <thead>
          <tr className={tableHeadRowClass}>
            <th className="py-2 pr-3 font-medium">Created</th>
            <th className="py-2 pr-3 font-medium">Expires</th>
            <th className="py-2 pr-3 font-medium">Replies</th>
            <th className="py-2 pr-3 font-medium">Status</th>
            <th className="py-2 font-medium">
              <span className="sr-only">Actions</span>
            </th>
          </tr>
        </thead>
        <tbody>
          {links.map((l) => (
            <tr key={l.id} className="border-b border-ink-800 align-top">
              <td className="py-2 pr-3 text-xs">
                <time dateTime={l.createdAt} className="font-mono text-mist-300">
                  {formatDateTime(l.createdAt)}
                </time>
                <br />
                <span className="text-mist-500">{l.createdBy ?? 'Someone'}</span>
              </td>
              <td className="py-2 pr-3 font-mono text-xs text-mist-300">{l.expiresAt ? formatDateTime(l.expiresAt) : 'never'}</td>
              <td className="py-2 pr-3 text-xs text-mist-300">{l.mayReply ? 'may reply' : 'read-only'}</td>
              <td className={`py-2 pr-3 text-xs ${l.status === 'active' ? 'text-ok' : 'text-mist-500'}`} data-testid="share-link-status">
                {statusText[l.status]}
                {l.revokedAt && (
                  <span className="block font-mono text-mist-500">{formatDateTime(l.revokedAt)}</span>
                )}
              </td>
              <td className="py-2 text-right">
                {l.status === 'active' && (
                  <Button
                    type="button"
                    variant="danger"
                    className="px-2.5 py-1"
                    disabled={revoke.isPending && revoke.variables === l.id}
                    onClick={() => revoke.mutate(l.id)}
                    aria-label={`Revoke the link made ${formatDateTime(l.createdAt)}`}
                  >
                    Revoke
                  </Button>
                )}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

type MailInput = z.input<typeof shareByMailBody>;
type MailOutput = z.output<typeof shareByMailBody>;

function ShareByMail({ viewId, members }: { viewId: number; members: { name: string; email: string }[] }) {
  const share = useShareByMail(viewId);
  const listId = useId();
  const [formError, setFormError] = useState<string | null>(null);
  const [sent, setSent] = useState<string | null>(null);
  const form = useForm<MailInput, unknown, MailOutput>({ resolver: zodResolver(shareByMailBody), defaultValues: { email: '' } });
  const { errors, isSubmitting } = form.formState;
  const onSubmit = form.handleSubmit(async (values) => {
    setFormError(null);
    setSent(null);
    try {
      const { sharedWith } = await share.mutateAsync(values);
      setSent(`We e-mailed ${sharedWith.name} (${sharedWith.email}) a link to this view.`);
      form.reset({ email: '' });
    } catch (e) {
      setFormError(applyServerErrors(e, form.setError));
    }
  });
  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-3 border-t border-ink-800 pt-4" aria-labelledby={`${listId}-h`}>
      <h3 id={`${listId}-h`} className="text-sm font-medium text-mist-300">
        Share by e-mail
      </h3>
      {formError && <Notice tone="error">{formError}</Notice>}
      {sent && <Notice tone="ok">{sent}</Notice>}
      <TextField
        label="Member's e-mail"
        type="email"
        list={listId}
        autoComplete="off"
        error={errors.email?.message}
        hint="Members of the project only; they need their account to open it."
        {...form.register('email')}
      />
      <datalist id={listId}>
        {members.map((m) => (
          <option key={m.email} value={m.email}>
            {m.name}
          </option>
        ))}
      </datalist>
      <div>
        <Button type="submit" variant="quiet" disabled={isSubmitting}>
          {isSubmitting ? 'Sending…' : 'Send by e-mail'}
        </Button>
      </div>
    </form>
  );
}
