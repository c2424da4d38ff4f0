import type { StftLayout } from '../../../../workers/dsp/stft';
import type { Weighting } from '../../../../workers/dsp/weighting';
import type { WindowName } from '../../../../workers/dsp/window';
import type { GuideLine } from '../map/guides';
import type { LevelReference } from '../map/level-reference';
import type { SpeedRaster } from '../map/speed-raster';
import { useBench, useBenchLive } from '../session/bench-session';
import type { BenchStores } from '../session/live-stores';
import type { MapPower } from '../session/use-map-computation';
import { toolButtonClass } from './bench-panel';

export const PLOT_HEIGHT = 'h-56';

/** What the dock's plots read from the session. */
export interface DockInputs {
  recordingName: string;
  power: MapPower | null;
  ready: boolean;
  layout: StftLayout | null;
  lines: GuideLine[];
  against: 'time' | 'speed';
  frameTimes: Float64Array | null;
  frameRpm: Float64Array | null;
  rpmStep: number;
  speedRaster: SpeedRaster | null;
  windowName: WindowName;
  enbwBins: number;
  weighting: Weighting;
  reference: LevelReference;
  topDb: number;
  rangeDb: number;
  stores: BenchStores;
  pinnedTimeS: number | null;
}

export function useDockInputs(): DockInputs {
  return {
    recordingName: useBench((s) => s.recording.entry.name),
    power: useBench((s) => s.map.power),
    ready: useBench((s) => s.map.done),
    layout: useBench((s) => s.map.layout),
    lines: useBench((s) => s.lines),
    against: useBench((s) => s.against),
    frameTimes: useBench((s) => s.frameTimes),
    frameRpm: useBench((s) => s.frameRpm),
    rpmStep: useBench((s) => s.rpmStep),
    speedRaster: useBench((s) => s.speedRaster),
    windowName: useBench((s) => s.settings.windowName),
    enbwBins: useBench((s) => s.enbwBins),
    weighting: useBench((s) => s.settings.weighting),
    reference: useBench((s) => s.reference),
    topDb: useBench((s) => s.topDb),
    rangeDb: useBench((s) => s.rangeDb),
    stores: useBenchLive(),
    pinnedTimeS: useBench((s) => s.pinnedTimeS),
  };
}

/** A panel's CSV export button. */
export
function CsvButton({ testId, disabled, onClick }: { testId: string; disabled: boolean; onClick: () => void }) {
  return (
    <button type="button" className={toolButtonClass()} data-testid={testId} disabled={disabled} onClick={onClick}>
      CSV
    </button>
  );
}
