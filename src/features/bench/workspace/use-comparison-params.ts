import { useCallback, useEffect, useRef } from 'react';
import type { SetURLSearchParams } from 'react-router-dom';
import type { ChannelSetup } from '../../../../workers/io/channel-setup';
import { useAddDemoRun, useAddFileRun } from '../api/add-demo-run';
import { demoSetup, type DemoRecording } from '../api/demo-recordings';

/** At most this many runs beside the open one (six in all). */
export const MAX_COMPARED = 5;

/**
 * The runs compared with the open recording, kept in the address (`?with=<fingerprint>,…`), so a
 * reload or a shared link shows the same comparison. `?withDemo=<file>` fetches a demo recording into
 * the library first (the demo's one-click comparison).
 */
export function useComparisonParams(params: URLSearchParams, setParams: SetURLSearchParams, openFingerprint: string | null, demos: DemoRecording[] | null | undefined) {
  const compared = (params.get('with') ?? '')
    .split(',')
    .filter((f) => /^[0-9a-f]{16,128}$/i.test(f) && f !== openFingerprint)
    .slice(0, MAX_COMPARED);
  const key = compared.join(',');

  const setCompared = useCallback(
    (update: (list: string[]) => string[]) =>
      setParams(
        (prev) => {
          const next = new URLSearchParams(prev);
          const list = update((prev.get('with') ?? '').split(',').filter(Boolean));
          if (list.length) next.set('with', [...new Set(list)].slice(0, MAX_COMPARED).join(','));
          else next.delete('with');
          return next;
        },
        { replace: true },
      ),
    [setParams],
  );
  const add = useCallback((fingerprint: string) => setCompared((list) => [...list, fingerprint]), [setCompared]);
  const remove = useCallback((fingerprint: string) => setCompared((list) => list.filter((f) => f !== fingerprint)), [setCompared]);

  const addDemo = useAddDemoRun();
  const addFile = useAddFileRun();
  const { mutateAsync: readFile } = addFile;
  /** A dropped or picked file joins the comparison (it is kept in the library too). */
  const compareFile = useCallback((file: File) => void readFile(file).then(add, () => undefined), [readFile, add]);
  const { mutateAsync } = addDemo;
  const compareDemo = useCallback((file: string, setup: ChannelSetup[] | undefined) => void mutateAsync({ file, setup }).then(add, () => undefined), [mutateAsync, add]);

  const comparePair = useCallback(
    (baselineFile: string, changedFile: string) =>
      setParams((prev) => {
        const next = new URLSearchParams(prev);
        for (const k of ['open', 'view', 'with']) next.delete(k);
        next.set('demo', baselineFile);
        next.set('withDemo', changedFile);
        return next;
      }),
    [setParams],
  );

  // `?withDemo=a.wav,b.wav`: once the baseline is open, the demo files join the comparison
  const withDemo = params.get('withDemo');
  const asked = useRef<string | null>(null);
  useEffect(() => {
    if (!withDemo || !openFingerprint || !demos || asked.current === withDemo) return;
    asked.current = withDemo;
    const files = withDemo.split(',').filter((f) => demos.some((d) => d.file === f)).slice(0, MAX_COMPARED);
    void Promise.all(
      files.map((file) => {
        const recording = demos.find((d) => d.file === file);
        return mutateAsync({ file, setup: recording ? demoSetup(recording) : undefined });
      }),
    ).then(
      (fingerprints) => {
        setParams(
          (prev) => {
            const next = new URLSearchParams(prev);
            next.delete('withDemo');
            const list = (prev.get('with') ?? '').split(',').filter(Boolean);
            next.set('with', [...new Set([...list, ...fingerprints])].join(','));
            return next;
          },
          { replace: true },
        );
      },
      () => undefined,
    );
  }, [withDemo, openFingerprint, demos, mutateAsync, setParams]);

  return {
    compared: key ? key.split(',') : [],
    add,
    remove,
    compareDemo,
    compareFile,
    comparePair,
    adding: addDemo.isPending || addFile.isPending,
    error: addDemo.error ?? addFile.error,
  };
}
