import { useCallback, useEffect, useRef } from 'react';
import { Link, useSearchParams } from 'react-router-dom';
import { ErrorBoundary } from '../../components/errors/error-boundary';
import { Notice } from '../../components/ui/notice';
import { linkClass } from '../../components/ui/styles';
import { paths } from '../../config/paths';
import { BenchPanel } from '../../features/bench/components/bench-panel';
import { DropZone } from '../../features/bench/components/drop-zone';
import { LibraryPanel } from '../../features/bench/components/library-panel';
import { SampleRateForm } from '../../features/bench/components/sample-rate-form';
import { Workbench } from '../../features/bench/components/workbench';
import { useRecordingReader } from '../../features/bench/hooks/use-recording-reader';
import { useViewOnBench } from '../../features/bench/hooks/use-view-on-bench';
import { demoSetup, fetchDemoRecording, useDemoRecordings } from '../../features/bench/api/demo-recordings';
import { errorMessage } from '../../lib/error-message';
import type { LibraryEntry } from '../../features/library/api/library-store';
import { warmPool } from '../../lib/workers/analysis-pool';
import { useComparisonParams } from '../../features/bench/workspace/use-comparison-params';
import { CompareFilePicker } from '../../features/bench/workspace/compare-file-picker';

/**
 * `?open=<fingerprint>` opens a library entry; `?view=<id>` starts it from a saved view of that recording
 * (its settings, guides, zoom and marks); `?project=<id>` preselects the project to register with.
 */
export function BenchPage() {
  const [params, setParams] = useSearchParams();
  const openParam = params.get('open');
  const projectParam = params.get('project') ?? '';
  const preferredProjectId = /^[1-9]\d*$/.test(projectParam) ? Number(projectParam) : null;
  const viewParam = params.get('view') ?? '';
  const viewId = /^[1-9]\d*$/.test(viewParam) ? Number(viewParam) : null;
  // The fingerprint last asked for, so the URL following an open does not start a second read.
  const requested = useRef<string | null>(null);

  const setOpenParam = useCallback(
    (fingerprint: string | null) => {
      requested.current = fingerprint;
      setParams(
        (prev) => {
          const next = new URLSearchParams(prev);
          // a saved view belongs to its recording: opening another one (or none) leaves it; a demo recording
          // fetched for the view (`demo`) is that view's recording
          if (fingerprint !== prev.get('open') && !(fingerprint && prev.get('demo'))) next.delete('view');
          next.delete('demo');
          if (fingerprint) next.set('open', fingerprint);
          else next.delete('open');
          return next;
        },
        { replace: true },
      );
    },
    [setParams],
  );

  useEffect(() => warmPool(), []);

  const reader = useRecordingReader((entry: LibraryEntry) => setOpenParam(entry.fingerprint));
  const { open, reading, prompt, notice, openFromLibrary } = reader;
  const fromView = useViewOnBench(viewId, open?.entry.fingerprint ?? null);

  useEffect(() => {
    if (!openParam || openParam === requested.current) return;
    requested.current = openParam;
    void openFromLibrary(openParam);
  }, [openParam, openFromLibrary]);

  // `?demo=<file>`: one of the server's demo recordings, fetched and read like a dropped file
  const demoParam = params.get('demo');
  const demos = useDemoRecordings();
  const requestedDemo = useRef<string | null>(null);
  const { read, showNotice } = reader;
  useEffect(() => {
    if (!demoParam || demoParam === requestedDemo.current || demos.isPending) return;
    requestedDemo.current = demoParam;
    const recording = demos.data?.find((d) => d.file === demoParam);
    if (!recording) {
      showNotice({ tone: 'error', message: `This server offers no demo recording named ${demoParam}.` });
      return;
    }
    fetchDemoRecording(recording.file).then(
      (blob) => void read(blob, recording.file, undefined, demoSetup(recording)),
      (e: unknown) => showNotice({ tone: 'error', message: errorMessage(e) }),
    );
  }, [demoParam, demos.isPending, demos.data, read, showNotice]);

  const comparison = useComparisonParams(params, setParams, open?.entry.fingerprint ?? null, demos.data);

  const close = () => {
    reader.close();
    setOpenParam(null);
  };

  const intake = (
    <>
      <BenchPanel title="Add a recording">
        <div className="flex flex-col gap-3">
          <DropZone
            reading={reading}
            compact={open !== null}
            onFile={(file) => void reader.read(file, file.name)}
            onRejected={(message) => reader.showNotice({ tone: 'error', message })}
            onCancel={reader.cancel}
          />
          {prompt && !reading && <SampleRateForm prompt={prompt} onSubmit={reader.readWithRate} onCancel={reader.dismissPrompt} />}
          {open && <CompareFilePicker busy={comparison.adding} onFile={comparison.compareFile} />}
          {notice && (
            <Notice tone={notice.tone}>
              {notice.fileName && <span className="break-all font-medium">{notice.fileName}: </span>}
              {notice.message}
            </Notice>
          )}
        </div>
      </BenchPanel>
      <LibraryPanel
        openFingerprint={open?.entry.fingerprint ?? null}
        busy={reading !== null}
        onOpen={(fingerprint) => void openFromLibrary(fingerprint)}
        onOpenFile={(file, name, setup) => void reader.read(file, name, undefined, setup)}
        onRemoved={(fingerprint) => (fingerprint === open?.entry.fingerprint ? close() : comparison.remove(fingerprint))}
        onCompare={open ? comparison.add : undefined}
        onCompareDemo={open ? comparison.compareDemo : undefined}
        onComparePair={comparison.comparePair}
        compared={comparison.compared}
      />
      {comparison.error && <Notice tone="error">The recording could not be added for comparison: {comparison.error.message}</Notice>}
    </>
  );

  const privacy = 'Recordings stay in this browser; registering sends only their description, never the samples.';

  if (open && fromView.kind !== 'loading') {
    const banner = (
      <>
        {fromView.kind === 'unusable' && <Notice tone="error">{fromView.message}</Notice>}
        {fromView.kind === 'ready' && (
          <p className="text-sm text-mist-300" data-testid="bench-from-view">
            Started from the saved view{' '}
            <Link to={paths.view(fromView.value.view.id)} className={linkClass}>
              {fromView.value.view.title}
            </Link>
            : its settings, guides, zoom and marks.
          </p>
        )}
      </>
    );
    // the open Bench fills the window under the header and does not scroll as a page (bench-layout.tsx)
    return (
      <div className="px-1.5 py-1.5 lg:h-[calc(100dvh-3rem)]">
        <h1 className="sr-only">Bench</h1>
        <ErrorBoundary key={`${open.entry.fingerprint}:${fromView.kind === 'ready' ? fromView.value.view.id : ''}`} region="The workbench">
          <Workbench
            recording={open}
            intake={
              <>
                {intake}
                <p className="text-xs text-mist-500">{privacy}</p>
              </>
            }
            banner={banner}
            preferredProjectId={preferredProjectId}
            fromView={fromView.kind === 'ready' ? fromView.value : undefined}
            onClose={close}
            compared={comparison.compared}
            onStopComparing={comparison.remove}
          />
        </ErrorBoundary>
      </div>
    );
  }

  return (
    <div className="mx-auto max-w-[150rem] px-4 py-4">
      <h1 className="sr-only">Bench</h1>
      {open ? (
        <p className="px-2 py-8 text-sm text-mist-500" data-testid="bench-view-loading">
          Opening the saved view…
        </p>
      ) : (
        <div className="grid items-start gap-4 lg:grid-cols-[17.5rem_minmax(0,1fr)]">
          <div className="flex flex-col gap-4">{intake}</div>
          <p
            className="rounded-lg border border-dashed border-ink-700 px-6 py-24 text-center text-sm text-mist-500"
            data-testid="bench-empty"
          >
            Drop a recording, or open one from the library, to see its channels, its map and what the inverter is doing.
          </p>
        </div>
      )}
      <footer className="mt-8 border-t border-ink-800 pt-3 text-xs text-mist-500">{privacy}</footer>
    </div>
  );
}
