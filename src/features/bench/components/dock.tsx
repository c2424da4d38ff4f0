import { memo } from 'react';
import { BandsPanel } from './bands-panel';
import { SlicePanel } from './slice-panel';
import { TracksPanel } from './tracks-panel';

/** The dock below the map: tracks of the tracked guides, the spectrum slice at the pointer, the band levels. */
export const Dock = memo(function Dock() {
  return (
    <div className="grid gap-4 @3xl:grid-cols-2 @[96rem]:grid-cols-[minmax(0,1.45fr)_minmax(0,1fr)_minmax(0,1fr)]" data-testid="dock">
      <div className="@3xl:col-span-2 @[96rem]:col-span-1">
        <TracksPanel />
      </div>
      <SlicePanel />
      <BandsPanel />
    </div>
  );
});

