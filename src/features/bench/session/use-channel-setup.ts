import { useCallback, useEffect, useRef, useState } from 'react';
import type { ChannelSetup } from '../../../../workers/io/channel-setup';
import { useUpdateSetup } from '../../library/api/library';
import { errorMessage } from '../../../lib/error-message';

export type SaveState = { kind: 'saved' } | { kind: 'pending' } | { kind: 'failed'; message: string };

const DEBOUNCE_MS = 400;

/**
 * The open recording's channel setup, saved to its library entry a moment after the last edit (or at
 * once, with `now`: selects and blurs). Mount it keyed by fingerprint so another recording starts afresh.
 */
export function useChannelSetup(fingerprint: string, initial: ChannelSetup[]) {
  const [setup, setSetup] = useState(initial);
  const [saveState, setSaveState] = useState<SaveState>({ kind: 'saved' });
  const update = useUpdateSetup();
  const mutateRef = useRef(update.mutateAsync);
  mutateRef.current = update.mutateAsync;
  const unsaved = useRef<ChannelSetup[] | null>(null);
  const timer = useRef<ReturnType<typeof setTimeout> | null>(null);
  const mounted = useRef(true);

  const flush = useCallback(() => {
    if (timer.current) clearTimeout(timer.current);
    timer.current = null;
    const next = unsaved.current;
    if (!next) return;
    unsaved.current = null;
    mutateRef.current({ fingerprint, setup: next }).then(
      () => mounted.current && !unsaved.current && setSaveState({ kind: 'saved' }),
      (e: unknown) => mounted.current && setSaveState({ kind: 'failed', message: errorMessage(e) }),
    );
  }, [fingerprint]);

  useEffect(() => {
    mounted.current = true;
    return () => {
      mounted.current = false;
      flush();
    };
  }, [flush]);

  const change = useCallback(
    (next: ChannelSetup[], now = false) => {
      setSetup(next);
      setSaveState({ kind: 'pending' });
      unsaved.current = next;
      if (timer.current) clearTimeout(timer.current);
      if (now) flush();
      else timer.current = setTimeout(flush, DEBOUNCE_MS);
    },
    [flush],
  );

  return { setup, change, flush, saveState };
}
