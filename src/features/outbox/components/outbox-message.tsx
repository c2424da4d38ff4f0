import type { OutboxMessage } from '../../../../server/schemas/outbox';
import { formatDateTime } from '../../../lib/format';

// Only web links become anchors: a mail's text is not ours to trust with other schemes.
const isWebLink = (url: string) => /^https?:\/\//i.test(url);

export function OutboxMessageCard({ message }: { message: OutboxMessage }) {
  const links = message.links.filter(isWebLink);
  return (
    <article className="rounded-lg border border-ink-800 bg-ink-900 p-5" aria-label={message.subject}>
      <header className="mb-3 flex flex-wrap items-baseline gap-x-4 gap-y-1">
        <h2 className="text-base font-medium text-mist-100">{message.subject}</h2>
        <time dateTime={message.receivedAt} className="ml-auto font-mono text-xs text-mist-500">
          {formatDateTime(message.receivedAt)}
        </time>
      </header>
      <dl className="mb-3 grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm">
        <dt className="text-mist-500">To</dt>
        <dd className="break-all text-mist-300">{message.to.join(', ')}</dd>
        <dt className="text-mist-500">From</dt>
        <dd className="break-all text-mist-300">{message.from}</dd>
      </dl>
      {links.length > 0 && (
        <ul className="mb-3 flex flex-col gap-1 text-sm">
          {links.map((url) => (
            <li key={url}>
              <a href={url} className="break-all font-mono text-xs text-accent hover:underline">
                {url}
              </a>
            </li>
          ))}
        </ul>
      )}
      <details>
        <summary className="cursor-pointer text-sm text-mist-300 hover:text-mist-100">Text of the message</summary>
        <pre className="mt-2 whitespace-pre-wrap break-words rounded-md bg-ink-950 p-3 font-mono text-xs text-mist-300">
          {message.text}
        </pre>
      </details>
    </article>
  );
}
