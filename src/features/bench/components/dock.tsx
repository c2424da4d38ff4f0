import { memo, type ReactNode } from 'react';
import { ErrorBoundary } from '../../../components/errors/error-boundary';
import { BandsPanel } from './bands-panel';
import { HearingPanel } from './hearing-panel';
import { MarkTools } from './mark-tools';
import { SlicePanel } from './slice-panel';
import { TracksPanel } from './tracks-panel';

/**
 * The dock beside the map: the tracks of the tracked guides always in sight, then (scrolling on their
 * own) the marks, the findings — given, so they keep their own error boundary — the hearing figures, the spectrum slice at the pointer
 * and the band levels.
 */
export const Dock = memo(function Dock({ findings }: { findings: ReactNode }) {
  return (
    <>
      <div className="lg:shrink-0">
        <TracksPanel />
      </div>
      <div className="flex flex-col gap-3 lg:min-h-[9rem] lg:flex-1 lg:overflow-y-auto lg:pr-1" data-testid="dock">
        <MarkTools />
        <ErrorBoundary region="The findings">{findings}</ErrorBoundary>
        <ErrorBoundary region="The hearing figures">
          <HearingPanel />
        </ErrorBoundary>
        <SlicePanel />
        <BandsPanel />
      </div>
    </>
  );
});
