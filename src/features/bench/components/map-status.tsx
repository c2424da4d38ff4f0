import { Notice } from '../../../components/ui/notice';
import { ProgressBar } from '../../../components/ui/progress-bar';
import { MIN_BLOCK_SAMPLES } from '../session/use-map-model';
import { useBench, useBenchActions } from '../session/bench-session';
import { toolButtonClass } from './bench-panel';
import { windowLabel } from './map-settings';

const fmt = (v: number, decimals: number) => v.toFixed(decimals);

/** The map's progress (with Cancel), where it stopped (with Compute again), or what it is once done. */
export function MapStatusLine({ exportError }: { exportError: string | null }) {
  const a = useBenchActions();
  const status = useBench((s) => s.map.status);
  const layout = useBench((s) => s.map.layout);
  const fsHz = useBench((s) => s.recording.decoded.header.sampleRateHz);
  const windowName = useBench((s) => s.settings.windowName);
  const shared = useBench((s) => typeof SharedArrayBuffer !== 'undefined' && s.map.power?.power.buffer instanceof SharedArrayBuffer);
  const percent = status.kind === 'computing' || status.kind === 'cancelled' ? Math.round(status.fraction * 100) : 0;
  const reading = useBench((s) => s.channelReading);
  const channelsRead = useBench((s) => s.recording.decoded.channelIndices);
  const readPercent = reading ? Math.round(reading.fraction * 100) : 0;
  return (
    <div className="flex min-h-7 flex-wrap items-center gap-3">
      {reading && (
        <>
          <ProgressBar label={`Reading channel ${reading.indices.map((i) => i + 1).join(', ')} from the file`} percent={readPercent} className="h-1.5 w-24" />
          <span className="font-mono text-xs text-mist-500" data-testid="channel-reading">
            Reading channel {reading.indices.map((i) => i + 1).join(', ')}: {readPercent} %
          </span>
        </>
      )}
      {status.kind === 'computing' && (
        <>
          <ProgressBar label="Computing the map" percent={percent} />
          <span className="font-mono text-xs text-mist-500">{percent} %</span>
          <button type="button" className={toolButtonClass()} onClick={a.cancelMap}>
            Cancel
          </button>
        </>
      )}
      {status.kind === 'cancelled' && (
        <>
          <p className="text-sm text-mist-300" role="status">
            Stopped at <span className="font-mono">{percent} %</span>.
          </p>
          <button type="button" className={toolButtonClass()} onClick={a.restartMap}>
            Compute again
          </button>
        </>
      )}
      {status.kind === 'done' && layout && (
        <p className="text-xs text-mist-500" data-testid="map-done" data-engine={status.engine} data-shared={shared} data-channels-read={[...channelsRead].sort((x, y) => x - y).join(',')}>
          {layout.frames} spectra of {fmt(layout.blockSize / fsHz, 3)} s, {windowLabel[windowName]} window.
        </p>
      )}
      {exportError && <p className="text-xs text-danger">{exportError}</p>}
      {/* while a channel is read its bar takes the hint's place, so the line does not wrap and move the map */}
      {!reading && (
        <p className="text-[11px] text-mist-500" title="Drag to pan · wheel to zoom · Shift-drag a box · double-click for the whole map · ? for all the keys">
          Drag to pan · wheel to zoom · ? for keys
        </p>
      )}
    </div>
  );
}

/** Why there is no map, or what a gesture just did. */
export function MapNotices() {
  const tooShort = useBench((s) => s.tooShort);
  const calibrationBad = useBench((s) => s.calibrationBad);
  const channel = useBench((s) => s.settings.channel);
  const status = useBench((s) => s.map.status);
  const note = useBench((s) => s.note);
  const channelError = useBench((s) => s.channelError);
  return (
    <>
      {channelError && <Notice tone="error">{channelError}</Notice>}
      {tooShort && <Notice>The recording is shorter than the smallest block ({MIN_BLOCK_SAMPLES} samples), so it has no map.</Notice>}
      {calibrationBad && <Notice tone="error">The calibration of channel {channel + 1} is not usable; the map keeps the last one that was.</Notice>}
      {status.kind === 'error' && <Notice tone="error">{status.message}</Notice>}
      {note && <Notice>{note}</Notice>}
    </>
  );
}
