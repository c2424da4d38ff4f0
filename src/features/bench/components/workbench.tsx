import type { ReactNode } from 'react';
import { ErrorBoundary } from '../../../components/errors/error-boundary';
import type { OpenRecording } from '../hooks/use-recording-reader';
import { BaselineSession } from '../workspace/baseline-session';
import { ComparedRuns } from '../workspace/compared-runs';
import { ComparePanel } from '../workspace/compare-panel';
import { ComparisonSummaryProvider } from '../workspace/use-comparison-summary';
import { BenchWorkspace } from '../workspace/workspace';
import type { ViewOnBench } from '../view-state/view-restore';
import { ListenProvider } from '../listen/listen-context';
import { PlaybackBar } from '../listen/playback-bar';
import { BenchKeys } from './bench-keys';
import { Dock } from './dock';
import { FindingsPanel } from './findings-panel';
import { GuidesPanel } from './guides-panel';
import { KeepPanels } from './keep-panels';
import { MapPanel } from './map-panel';
import { RecordingBar } from './recording-bar';
import { ChannelsPanel, SpeedPanel } from './setup-panels';

/**
 * The Bench for one open recording: the channels and speed source (left), the map with its readout and
 * the dock (centre), the guides and findings (right). Mount it keyed by fingerprint: its session (all
 * the state and computations, see session/bench-session.tsx) belongs to one recording.
 */
export function Workbench({
  recording,
  intake,
  preferredProjectId,
  fromView,
  onClose,
  compared = [],
  onStopComparing,
}: {
  recording: OpenRecording;
  intake: ReactNode;
  preferredProjectId: number | null;
  /** A saved view of this recording to start from (`?view=`): its settings, guides, zoom and marks */
  fromView?: ViewOnBench;
  onClose: () => void;
  /** Library fingerprints of the runs compared with this one (the baseline) */
  compared?: string[];
  onStopComparing?: (fingerprint: string) => void;
}) {
  return (
    <BenchWorkspace>
      <ListenProvider>
      <BaselineSession recording={recording} fromView={fromView} preferredProjectId={preferredProjectId}>
      <ComparisonSummaryProvider>
      {/* Narrow: one column. Wide: channels left, map centre, guides and findings right; in between,
          the guides and findings go under the channels. */}
      <div className="grid items-start gap-4 lg:grid-cols-[17.5rem_minmax(0,1fr)] lg:grid-rows-[auto_auto_1fr] xl:grid-cols-[17.5rem_minmax(0,1fr)_19.5rem]">
        <div className="flex flex-col gap-4 lg:col-start-1 lg:row-start-1">
          {intake}
          <ChannelsPanel />
          <SpeedPanel />
        </div>
        <div className="@container flex min-w-0 flex-col gap-4 lg:col-start-2 lg:row-span-3 lg:row-start-1">
          <RecordingBar recording={recording} onClose={onClose} />
          <ErrorBoundary region="Listening">
            <PlaybackBar />
          </ErrorBoundary>
          <ErrorBoundary region="The map">
            <MapPanel />
          </ErrorBoundary>
          <ErrorBoundary region="The dock">
            <Dock />
          </ErrorBoundary>
          {compared.length > 0 && (
            <ErrorBoundary region="The comparison">
              <ComparedRuns fingerprints={compared} onRemove={(f) => onStopComparing?.(f)} />
              <ComparePanel />
            </ErrorBoundary>
          )}
        </div>
        <div className="flex flex-col gap-4 lg:col-start-1 lg:row-start-2 xl:col-start-3 xl:row-span-3 xl:row-start-1">
          <GuidesPanel />
          <ErrorBoundary region="The findings">
            <FindingsPanel />
          </ErrorBoundary>
        </div>
        <div className="lg:col-start-1 lg:row-start-3 xl:row-start-2">
          <KeepPanels />
        </div>
      </div>
      <BenchKeys />
      </ComparisonSummaryProvider>
      </BaselineSession>
      </ListenProvider>
    </BenchWorkspace>
  );
}
