import { useCallback, useEffect, useRef, useState } from 'react';
import type { ChannelSetup } from '../../../../workers/io/channel-setup';
import { useUpdateSpeedSource } from '../../library/api/library';
import { speedSourceProblem, type SpeedSource } from '../../../../workers/io/speed-source';

const SAVE_PAUSE_MS = 400;

/**
 * The speed source the engineer chose for the open recording (null: the one its setup suggests). It
 * starts from a saved view's, else from the one kept with the recording in the library, and each usable
 * choice is kept there a moment after the last edit, so the recording opens with it next time.
 */
export function useSpeedChoice(fingerprint: string, setup: ChannelSetup[], kept: SpeedSource | undefined, fromView: SpeedSource | null | undefined) {
  const [choice, setChoice] = useState<SpeedSource | null>(fromView ?? kept ?? null);
  const save = useUpdateSpeedSource();
  const mutate = useRef(save.mutate);
  mutate.current = save.mutate;
  const timer = useRef<ReturnType<typeof setTimeout> | null>(null);
  useEffect(() => () => {
    if (timer.current) clearTimeout(timer.current);
  }, []);

  const choose = useCallback(
    (next: SpeedSource | null) => {
      setChoice(next);
      if (timer.current) clearTimeout(timer.current);
      // a source being typed (no pulses per rev yet) is not kept: the last usable one stays
      if (next && speedSourceProblem(next, setup) !== null) return;
      timer.current = setTimeout(() => mutate.current({ fingerprint, speedSource: next }), SAVE_PAUSE_MS);
    },
    [fingerprint, setup],
  );
  return [choice, choose, save.error] as const;
}
