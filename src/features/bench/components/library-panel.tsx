import { useState } from 'react';
import { Button } from '../../../components/ui/button';
import { Notice } from '../../../components/ui/notice';
import { Section } from '../../../components/ui/section';
import { formatDateTime, formatMegabytes, formatSeconds } from '../../../lib/format';
import { useLibrary, useRemoveFromLibrary, useStorageEstimate } from '../../library/api/library';

interface LibraryPanelProps {
  openFingerprint: string | null;
  busy: boolean;
  onOpen: (fingerprint: string) => void;
  onRemoved: (fingerprint: string) => void;
}

export function LibraryPanel({ openFingerprint, busy, onOpen, onRemoved }: LibraryPanelProps) {
  const { data: entries, isPending, error } = useLibrary();
  const { data: storage } = useStorageEstimate();
  const remove = useRemoveFromLibrary();
  const [problem, setProblem] = useState<string | null>(null);

  const onDelete = (fingerprint: string) => {
    setProblem(null);
    remove.mutate(fingerprint, {
      onSuccess: () => onRemoved(fingerprint),
      onError: (e) => setProblem(e.message),
    });
  };

  return (
    <Section title="Library">
      <div className="flex flex-col gap-3">
        {isPending && <p className="text-sm text-mist-500">Loading the library…</p>}
        {error && <Notice tone="error">The library in this browser cannot be read: {error.message}</Notice>}
        {problem && <Notice tone="error">{problem}</Notice>}
        {entries && entries.length === 0 && (
          <p className="text-sm text-mist-500">Nothing here yet. The recordings you drop are kept in this browser.</p>
        )}
        {entries && entries.length > 0 && (
          <ul className="flex flex-col divide-y divide-ink-800 text-sm" data-testid="library">
            {entries.map((e) => {
              const isOpen = e.fingerprint === openFingerprint;
              return (
                <li
                  key={e.fingerprint}
                  data-testid="library-entry"
                  data-fingerprint={e.fingerprint}
                  aria-current={isOpen ? 'true' : undefined}
                  className="flex items-start gap-2 py-2"
                >
                  <div className="min-w-0 flex-1">
                    <button
                      type="button"
                      title={`Open ${e.name}`}
                      disabled={busy}
                      onClick={() => onOpen(e.fingerprint)}
                      className={`break-all text-left font-medium hover:text-accent disabled:cursor-wait ${
                        isOpen ? 'text-accent' : 'text-mist-100'
                      }`}
                    >
                      {e.name}
                    </button>
                    <p className="mt-0.5 text-xs text-mist-500">
                      <span className="font-mono">{formatSeconds(e.durationS)}</span> ·{' '}
                      <span className="font-mono">{e.channels.length}</span> {e.channels.length === 1 ? 'channel' : 'channels'} ·{' '}
                      <span className="font-mono">{formatMegabytes(e.sizeBytes)}</span>
                    </p>
                    <p className="text-xs text-mist-500">
                      added <time dateTime={e.addedAt} className="font-mono">{formatDateTime(e.addedAt)}</time>
                    </p>
                  </div>
                  <Button
                    type="button"
                    variant="danger"
                    className="px-2.5 py-1"
                    aria-label={`Delete ${e.name} from the library`}
                    disabled={remove.isPending && remove.variables === e.fingerprint}
                    onClick={() => onDelete(e.fingerprint)}
                  >
                    Delete
                  </Button>
                </li>
              );
            })}
          </ul>
        )}
        <p className="border-t border-ink-800 pt-3 text-xs text-mist-500" data-testid="storage-used">
          {storage ? (
            <>
              Storage used: <span className="font-mono">{formatMegabytes(storage.usageBytes)}</span> of{' '}
              <span className="font-mono">{formatMegabytes(storage.quotaBytes)}</span>
            </>
          ) : (
            'This browser does not say how much storage it allows.'
          )}
        </p>
      </div>
    </Section>
  );
}
