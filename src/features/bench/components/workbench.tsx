import type { ReactNode } from 'react';
import { ErrorBoundary } from '../../../components/errors/error-boundary';
import type { OpenRecording } from '../hooks/use-recording-reader';
import { BenchLayout } from '../layout/bench-layout';
import { ListenProvider } from '../listen/listen-context';
import { PlaybackBar } from '../listen/playback-bar';
import { BaselineSession } from '../workspace/baseline-session';
import { ComparedRuns } from '../workspace/compared-runs';
import { ComparePanel } from '../workspace/compare-panel';
import { ComparisonSummaryProvider } from '../workspace/use-comparison-summary';
import { BenchWorkspace } from '../workspace/workspace';
import type { ViewOnBench } from '../view-state/view-restore';
import { BenchKeys } from './bench-keys';
import { Dock } from './dock';
import { FindingsPanel } from './findings-panel';
import { GuidesPanel } from './guides-panel';
import { KeepPanels } from './keep-panels';
import { MapPanel } from './map-panel';
import { RecordingBar } from './recording-bar';
import { ChannelsPanel, SpeedPanel } from './setup-panels';

/**
 * The Bench for one open recording (bench-layout.tsx arranges it): the recording with its listening
 * controls and the map in the middle; recordings, channel setup and keeping in the left rail; guides,
 * tracks and findings on the right. Mount it keyed by fingerprint: its session (all the state and
 * computations, see session/bench-session.tsx) belongs to one recording.
 */
export function Workbench({
  recording,
  intake,
  banner,
  preferredProjectId,
  fromView,
  onClose,
  compared = [],
  onStopComparing,
}: {
  recording: OpenRecording;
  intake: ReactNode;
  /** Said above the map (the saved view it started from) */
  banner?: ReactNode;
  preferredProjectId: number | null;
  /** A saved view of this recording to start from (`?view=`): its settings, guides, zoom and marks */
  fromView?: ViewOnBench;
  onClose: () => void;
  /** Library fingerprints of the runs compared with this one (the baseline) */
  compared?: string[];
  onStopComparing?: (fingerprint: string) => void;
}) {
  const centre = (
    <>
      {/* the first screen of the column is the recording and its map; a comparison follows below */}
      <div className="flex shrink-0 flex-col gap-2 lg:h-full lg:min-h-[34rem]">
        {banner}
        <RecordingBar recording={recording} onClose={onClose}>
          <ErrorBoundary region="Listening">
            <PlaybackBar />
          </ErrorBoundary>
        </RecordingBar>
        <ErrorBoundary region="The map">
          <MapPanel />
        </ErrorBoundary>
      </div>
      {compared.length > 0 && (
        <ErrorBoundary region="The comparison">
          <ComparedRuns fingerprints={compared} onRemove={(f) => onStopComparing?.(f)} />
          <ComparePanel />
        </ErrorBoundary>
      )}
    </>
  );
  const right = (
    <>
      {/* guides, tracks and the rest each keep a share of the column and scroll inside it */}
      <div className="lg:max-h-[38vh] lg:shrink-0 lg:overflow-y-auto lg:pr-1">
        <GuidesPanel />
      </div>
      <ErrorBoundary region="The dock">
        <Dock findings={<FindingsPanel />} />
      </ErrorBoundary>
    </>
  );
  const left = [
    { id: 'recordings', label: 'Recordings', content: intake },
    {
      id: 'setup',
      label: 'Channels and speed',
      content: (
        <>
          <ChannelsPanel />
          <SpeedPanel />
        </>
      ),
    },
    { id: 'keep', label: 'Register and save', content: <KeepPanels /> },
  ];
  return (
    <BenchWorkspace>
      <ListenProvider>
        <BaselineSession recording={recording} fromView={fromView} preferredProjectId={preferredProjectId}>
          <ComparisonSummaryProvider>
            <BenchLayout left={left} centre={centre} right={right} />
            <BenchKeys />
          </ComparisonSummaryProvider>
        </BaselineSession>
      </ListenProvider>
    </BenchWorkspace>
  );
}
