import { useCallback, useEffect, useRef } from 'react';
import { useSearchParams } from 'react-router-dom';
import { Notice } from '../../components/ui/notice';
import { Section } from '../../components/ui/section';
import { DropZone } from '../../features/bench/components/drop-zone';
import { LibraryPanel } from '../../features/bench/components/library-panel';
import { OpenRecordingView } from '../../features/bench/components/open-recording-view';
import { SampleRateForm } from '../../features/bench/components/sample-rate-form';
import { useRecordingReader } from '../../features/bench/hooks/use-recording-reader';
import type { LibraryEntry } from '../../features/library/library-store';

/** `?open=<fingerprint>` opens a library entry; `?project=<id>` preselects the project to register with. */
export function BenchPage() {
  const [params, setParams] = useSearchParams();
  const openParam = params.get('open');
  const projectParam = params.get('project') ?? '';
  const preferredProjectId = /^[1-9]\d*$/.test(projectParam) ? Number(projectParam) : null;
  // The fingerprint last asked for, so the URL following an open does not start a second read.
  const requested = useRef<string | null>(null);

  const setOpenParam = useCallback(
    (fingerprint: string | null) => {
      requested.current = fingerprint;
      setParams(
        (prev) => {
          const next = new URLSearchParams(prev);
          if (fingerprint) next.set('open', fingerprint);
          else next.delete('open');
          return next;
        },
        { replace: true },
      );
    },
    [setParams],
  );

  const reader = useRecordingReader((entry: LibraryEntry) => setOpenParam(entry.fingerprint));
  const { open, reading, prompt, notice, openFromLibrary } = reader;

  useEffect(() => {
    if (!openParam || openParam === requested.current) return;
    requested.current = openParam;
    void openFromLibrary(openParam);
  }, [openParam, openFromLibrary]);

  const close = () => {
    reader.close();
    setOpenParam(null);
  };

  return (
    <div className="mx-auto max-w-[104rem] px-6 py-8">
      <h1 className="mb-6 text-xl font-semibold">Bench</h1>
      <div className="grid items-start gap-6 lg:grid-cols-[20rem_minmax(0,1fr)]">
        <div className="flex flex-col gap-6">
          <Section title="Add a recording">
            <div className="flex flex-col gap-3">
              <DropZone
                reading={reading}
                onFile={(file) => void reader.read(file, file.name)}
                onRejected={(message) => reader.showNotice({ tone: 'error', message })}
                onCancel={reader.cancel}
              />
              {prompt && !reading && (
                <SampleRateForm prompt={prompt} onSubmit={reader.readWithRate} onCancel={reader.dismissPrompt} />
              )}
              {notice && (
                <Notice tone={notice.tone}>
                  {notice.fileName && <span className="break-all font-medium">{notice.fileName}: </span>}
                  {notice.message}
                </Notice>
              )}
            </div>
          </Section>
          <LibraryPanel
            openFingerprint={open?.entry.fingerprint ?? null}
            busy={reading !== null}
            onOpen={(fingerprint) => void openFromLibrary(fingerprint)}
            onRemoved={(fingerprint) => fingerprint === open?.entry.fingerprint && close()}
          />
        </div>
        <div>
          {open ? (
            <OpenRecordingView
              key={open.entry.fingerprint}
              recording={open}
              preferredProjectId={preferredProjectId}
              onClose={close}
            />
          ) : (
            <p
              className="rounded-lg border border-dashed border-ink-700 px-6 py-16 text-center text-sm text-mist-500"
              data-testid="bench-empty"
            >
              Drop a recording, or open one from the library, to see its channels here.
            </p>
          )}
        </div>
      </div>
      <footer className="mt-10 border-t border-ink-800 pt-4 text-xs text-mist-500">
        Recordings stay in this browser; registering sends only their description, never the samples.
      </footer>
    </div>
  );
}
