import { Link } from 'react-router-dom';
import { Button } from '../../components/ui/button';
import { Logo } from '../../components/ui/logo';
import { Notice } from '../../components/ui/notice';
import { paths } from '../../config/paths';
import { useOutbox } from '../../features/outbox/api/outbox';
import { OutboxMessageCard } from '../../features/outbox/components/outbox-message';
import { ApiError } from '../../lib/api-client';

export function OutboxPage() {
  const { data: messages, isPending, error, isFetching, refetch } = useOutbox();
  const absent = error instanceof ApiError && error.status === 404;
  return (
    <div className="flex min-h-screen flex-col">
      <header className="flex items-center gap-6 border-b border-ink-800 bg-ink-900 px-5 py-2.5">
        <Link to={paths.signIn} className="flex items-center gap-2 text-accent">
          <Logo />
          <span className="text-base font-semibold tracking-wide text-mist-100">Fanlight</span>
        </Link>
        <span className="text-sm text-mist-300">Outbox</span>
      </header>
      <main className="mx-auto w-full max-w-4xl flex-1 px-6 py-8">
        <div className="mb-6 flex flex-wrap items-center gap-4">
          <h1 className="text-xl font-semibold">Outbox</h1>
          <Button type="button" variant="quiet" className="ml-auto" disabled={isFetching} onClick={() => refetch()}>
            {isFetching ? 'Refreshing…' : 'Refresh'}
          </Button>
        </div>
        <p className="mb-6 text-sm text-mist-500">Development and test only: mail that Fanlight sent to the local mail fake.</p>
        {isPending && <p className="text-sm text-mist-500">Loading messages…</p>}
        {absent && <Notice>The Outbox exists only in development and test.</Notice>}
        {error && !absent && <Notice tone="error">{error.message}</Notice>}
        {messages && messages.length === 0 && (
          <p className="rounded-lg border border-dashed border-ink-700 px-6 py-10 text-center text-sm text-mist-500">
            No mail yet.
          </p>
        )}
        {messages && messages.length > 0 && (
          <div className="flex flex-col gap-4">
            {messages.map((m) => (
              <OutboxMessageCard key={m.id} message={m} />
            ))}
          </div>
        )}
      </main>
    </div>
  );
}
