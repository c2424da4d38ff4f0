import { useRef } from 'react';
import { fullView } from '../map/viewport';
import { useBench, useBenchActions, useBenchLive } from '../session/bench-session';
import { useStore } from '../session/store';
import { toolButtonClass } from './bench-panel';
import { useBenchLayout } from '../layout/use-bench-layout';
import { BottomAxis, LeftAxis } from '../../../components/plot/map-axes';
import { mapAxes } from '../map/map-axes';
import { MapScale } from './map-scale';
import { MapNotices, MapStatusLine } from './map-status';
import { MapToolbar } from './map-toolbar';
import { MapView } from './map-view';
import { Readout } from './map-readout';
import { useMapPngExport } from './use-map-png-export';
import { MapSettingsBar, windowLabel } from './map-settings';

// The map, its left axis and the colour bar fill the height left to them, so their edges line up.
const MAP_HEIGHT = 'min-h-0 flex-1';

const fmt = (v: number, decimals: number) => v.toFixed(decimals);

/** The map of one channel: settings, the view controls, the map with its axes, guides and colour bar, and the readout. */
export function MapPanel() {
  const live = useBenchLive();
  const view = useStore(live.viewport);
  const a = useBenchActions();
  const recordingName = useBench((s) => s.recording.entry.name);
  const runId = useBench((s) => s.recording.entry.fingerprint);
  const layout = useBench((s) => s.map.layout);
  const isTimeMap = useBench((s) => s.against === 'time');
  const raster = useBench((s) => s.raster);
  const lut = useBench((s) => s.lut);
  const topDb = useBench((s) => s.topDb);
  const rangeDb = useBench((s) => s.rangeDb);
  const weighting = useBench((s) => s.settings.weighting);
  const windowName = useBench((s) => s.settings.windowName);
  const reference = useBench((s) => s.reference);
  const extents = useBench((s) => s.extents);
  const against = useBench((s) => s.against);
  const swapped = useBench((s) => s.swapped);
  const mode = useBench((s) => s.mode);
  const lines = useBench((s) => s.lines);
  const frameTimes = useBench((s) => s.frameTimes);
  const frameRpm = useBench((s) => s.frameRpm);
  const pinnedX = useBench((s) => s.pinnedX);
  const tonal = useBench((s) => s.tonalLine);
  const marks = useBench((s) => s.shownMarks);
  const againstNote = useBench(againstNoteOf);
  const axes = mapAxes(view, against, swapped);
  const boxRef = useRef<HTMLDivElement>(null);
  const dB = weighting === 'Z' ? 'dB' : `dB(${weighting})`;

  const { exportPng, exportSize, exportError } = useMapPngExport(boxRef, axes, {
    lut,
    topDb,
    rangeDb,
    scaleLabel: `${dB} re ${reference.label}`,
    title: recordingName,
    subtitle: layout ? `${windowLabel[windowName]} · ${layout.blockSize} · Δf ${fmt(layout.binHz, 2)} Hz · against ${against}${swapped ? ' · axes swapped' : ''}` : '',
  });

  const [layoutPrefs, setLayout] = useBenchLayout();
  const exportButton = (
    <button
      type="button"
      className={toolButtonClass()}
      data-testid="export-map-png"
      data-export-size={exportSize ?? undefined}
      disabled={!raster}
      onClick={() => void exportPng()}
      title="The map as you see it, with guides, axes and colour bar"
    >
      Export PNG
    </button>
  );
  const settingsToggle = (
    <button
      type="button"
      className={toolButtonClass(layoutPrefs.mapSettings)}
      aria-expanded={layoutPrefs.mapSettings}
      aria-controls="map-settings"
      onClick={() => setLayout({ mapSettings: !layoutPrefs.mapSettings })}
      title="Channel, window, block size, overlap, weighting, level range and colours"
    >
      Map settings
    </button>
  );

  return (
    <section aria-labelledby="map-heading" className="flex min-h-[30rem] flex-1 flex-col gap-1.5 rounded-lg border border-ink-800 bg-ink-900 px-3 py-1.5">
      <h2 id="map-heading" className="sr-only">
        Map
      </h2>
      {layoutPrefs.mapSettings && (
        <div id="map-settings">
          <MapSettingsBar />
        </div>
      )}
        <MapToolbar view={view} onReset={() => extents && live.viewport.set(fullView(extents))} before={settingsToggle} after={exportButton} />
        <div className="flex min-h-0 flex-1" data-testid="map-figure">
          <div className="flex w-14 shrink-0 flex-col">
            <div className="h-7" />
            <div className={MAP_HEIGHT}>
              <LeftAxis axis={axes.left} testId={swapped ? 'map-time-axis' : 'map-frequency-axis'} />
            </div>
            <div className="h-6" />
          </div>
          <div className="flex min-w-0 flex-1 flex-col pl-2">
            <div className="flex h-7 items-end justify-between gap-3 pb-1 text-xs">
              <p className="truncate font-mono text-[11px] text-mist-500" data-testid="map-resolution">
                {layout && layout.frames > 0
                  ? `Δf ${fmt(layout.binHz, layout.binHz < 10 ? 2 : 1)} Hz · hop ${fmt(layout.hopS * 1000, 1)} ms · ${layout.frames} × ${layout.bins}`
                  : ''}
              </p>
            </div>
            <div ref={boxRef} className={`relative overflow-hidden rounded-sm bg-ink-950 ring-1 ring-ink-800 ${MAP_HEIGHT}`}>
              <MapView
                raster={raster}
                lut={lut}
                topDb={topDb}
                rangeDb={rangeDb}
                extents={extents}
                swapped={swapped}
                against={against}
                lines={lines}
                frameTimes={frameTimes}
                frameRpm={frameRpm}
                pinnedX={pinnedX}
                tonal={tonal}
                runId={runId}
                mode={mode}
                stores={live}
                markPainted={isTimeMap}
                probe={a.probe}
                onPick={a.pick}
                onPin={a.pin}
                marks={marks}
                onMark={a.addMark}
                label={`Map: ${swapped ? 'frequency across' : `${against} across`}, ${swapped ? `${against} up` : 'frequency up'}, level as colour`}
              />
              {mode === 'mark' && (
                <p className="pointer-events-none absolute left-2 top-2 rounded bg-ink-950/85 px-2 py-1 text-xs text-accent" role="status">
                  Click for a point mark, Shift-drag for a box
                </p>
              )}
              {mode === 'pick' && (
                <p className="pointer-events-none absolute left-2 top-2 rounded bg-ink-950/85 px-2 py-1 text-xs text-accent" role="status">
                  Click the carrier on the map
                </p>
              )}
              {againstNote && (
                <p className="pointer-events-none absolute inset-x-0 top-1/2 text-center text-sm text-mist-300" role="status">
                  {againstNote}
                </p>
              )}
            </div>
            <div className="pt-1">
              <BottomAxis axis={axes.bottom} testId={swapped ? 'map-frequency-axis' : 'map-time-axis'} />
            </div>
          </div>
          <MapScale lut={lut} topDb={topDb} rangeDb={rangeDb} reference={reference.label} unit={reference.unit} weighting={weighting} heightClass={MAP_HEIGHT} />
        </div>
        <div className="flex flex-wrap items-center gap-x-3 gap-y-1">
          <div className="min-w-0 flex-[1_1_34rem]">
            <Readout />
          </div>
          <MapStatusLine exportError={exportError} />
        </div>
        <MapNotices />
    </section>
  );
}

/** Why the map against speed is not there yet, if it is asked for. */
function againstNoteOf(s: { against: 'time' | 'speed'; speedRaster: unknown; speedMap: { kind: string; message?: string }; map: { done: boolean } }): string | null {
  if (s.against !== 'speed' || s.speedRaster) return null;
  if (s.speedMap.kind === 'error') return s.speedMap.message ?? null;
  return s.map.done ? 'Resampling the map against speed…' : 'The map against speed comes once the map is complete.';
}
