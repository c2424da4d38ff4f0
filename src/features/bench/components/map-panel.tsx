import { useRef, useState, type ReactNode } from 'react';
import type { StftLayout } from '../../../../workers/dsp/stft';
import type { Weighting } from '../../../../workers/dsp/weighting';
import type { MapStatus } from '../hooks/use-map-computation';
import { canvasToPng, composeMap } from '../map/compose-png';
import { nearestLine, type GuideLine } from '../map/guides';
import type { MapRaster } from '../map/map-raster';
import { fullView, type Extents, type Viewport } from '../map/viewport';
import type { LevelReference } from '../map/level-reference';
import { useStore } from '../state/store';
import type { BenchPointer, BenchStores } from '../state/bench-stores';
import { baseName, downloadBlob } from '../analysis/export';
import { BenchPanel, toolButtonClass } from './bench-panel';
import { BottomAxis, LeftAxis, mapAxes } from './map-axes';
import { MapScale } from './map-scale';
import { MapView, type MapMode, type MarkPlace } from './map-view';
import type { BenchMark } from '../views/view-snapshot';
import { windowLabel } from './map-settings';

// The map and the colour bar share this height so their edges line up.
const MAP_HEIGHT = 'h-[clamp(22rem,58vh,50rem)]';

const fmt = (v: number, decimals: number) => v.toFixed(decimals);

export interface MapPanelProps {
  settingsBar: ReactNode;
  notices: ReactNode;
  recordingName: string;
  layout: StftLayout | null;
  status: MapStatus;
  onCancel: () => void;
  onRestart: () => void;
  raster: MapRaster | null;
  /** The time map is the one whose painting is timed */
  isTimeMap: boolean;
  againstNote: string | null;
  lut: Uint8Array;
  topDb: number;
  rangeDb: number;
  weighting: Weighting;
  reference: LevelReference;
  extents: Extents | null;
  against: 'time' | 'speed';
  onAgainst: (a: 'time' | 'speed') => void;
  speedAvailable: boolean;
  swapped: boolean;
  onSwap: () => void;
  mode: MapMode;
  onMode: (m: MapMode) => void;
  lines: GuideLine[];
  frameTimes: Float64Array | null;
  frameRpm: Float64Array | null;
  pinnedX: number | null;
  stores: BenchStores;
  probe: (x: number, f: number) => BenchPointer | null;
  onPick: (fHz: number) => void;
  onPin: (x: number) => void;
  onZoom: (factor: number) => void;
  marks: BenchMark[];
  onMark: (place: MarkPlace) => void;
  /** The mark mode's text field, under the map tools */
  markTools: ReactNode;
  windowName: keyof typeof windowLabel;
  fsHz: number;
}

/** The map of one channel: settings, the view controls, the map with its axes, guides and colour bar, and the readout. */
export function MapPanel(p: MapPanelProps) {
  const view = useStore(p.stores.viewport);
  const axes = mapAxes(view, p.against, p.swapped);
  const boxRef = useRef<HTMLDivElement>(null);
  const [exportSize, setExportSize] = useState<string | null>(null);
  const [exportError, setExportError] = useState<string | null>(null);
  const { status, layout } = p;
  const percent = status.kind === 'computing' || status.kind === 'cancelled' ? Math.round(status.fraction * 100) : 0;
  const dB = p.weighting === 'Z' ? 'dB' : `dB(${p.weighting})`;

  const exportPng = async () => {
    setExportError(null);
    const map = boxRef.current?.querySelector<HTMLCanvasElement>('[data-testid="map-canvas"]');
    const guides = boxRef.current?.querySelector<HTMLCanvasElement>('[data-testid="map-guides"]');
    if (!map || !guides || !axes.left || !axes.bottom || !layout) return;
    const canvas = composeMap({
      map,
      guides,
      left: axes.left,
      bottom: axes.bottom,
      lut: p.lut,
      topDb: p.topDb,
      rangeDb: p.rangeDb,
      scaleLabel: `${dB} re ${p.reference.label}`,
      title: p.recordingName,
      subtitle: `${windowLabel[p.windowName]} · ${layout.blockSize} · Δf ${fmt(layout.binHz, 2)} Hz · against ${p.against}${p.swapped ? ' · axes swapped' : ''}`,
      dpr: map.width / Math.max(1, map.clientWidth),
    });
    try {
      const blob = await canvasToPng(canvas);
      setExportSize(`${canvas.width}x${canvas.height}`);
      downloadBlob(blob, `${baseName(p.recordingName)}-map.png`);
    } catch (e) {
      setExportError(e instanceof Error ? e.message : String(e));
    }
  };

  const reset = () => p.extents && p.stores.viewport.set(fullView(p.extents));

  return (
    <BenchPanel
      title="Map"
      actions={
        <button
          type="button"
          className={toolButtonClass()}
          data-testid="export-map-png"
          data-export-size={exportSize ?? undefined}
          disabled={!p.raster}
          onClick={() => void exportPng()}
          title="The map as you see it, with guides, axes and colour bar"
        >
          Export PNG
        </button>
      }
    >
      <div className="flex flex-col gap-3">
        {p.settingsBar}
        <div className="flex flex-wrap items-center gap-2" data-testid="map-toolbar">
          <div className="flex items-center gap-1" role="group" aria-label="Against">
            <span className="mr-1 text-[11px] font-medium text-mist-500">Against</span>
            <button type="button" className={toolButtonClass(p.against === 'time')} aria-pressed={p.against === 'time'} onClick={() => p.onAgainst('time')}>
              Time
            </button>
            <button
              type="button"
              className={toolButtonClass(p.against === 'speed')}
              aria-pressed={p.against === 'speed'}
              disabled={!p.speedAvailable}
              title={p.speedAvailable ? 'The map resampled against speed' : 'Set a speed source first'}
              onClick={() => p.onAgainst('speed')}
            >
              Speed
            </button>
          </div>
          <span className="h-5 w-px bg-ink-800" aria-hidden />
          <button type="button" className={toolButtonClass(p.swapped)} aria-pressed={p.swapped} onClick={p.onSwap} title="Frequency across or up (s)">
            Swap axes
          </button>
          <span className="h-5 w-px bg-ink-800" aria-hidden />
          <button type="button" className={toolButtonClass()} aria-label="Zoom in" title="Zoom in (+)" onClick={() => p.onZoom(1 / 1.5)}>
            +
          </button>
          <button type="button" className={toolButtonClass()} aria-label="Zoom out" title="Zoom out (−)" onClick={() => p.onZoom(1.5)}>
            −
          </button>
          <button
            type="button"
            className={toolButtonClass(p.mode === 'box')}
            aria-pressed={p.mode === 'box'}
            title="Drag a box to zoom into (or hold Shift while dragging)"
            onClick={() => p.onMode(p.mode === 'box' ? 'pan' : 'box')}
          >
            Box zoom
          </button>
          <button
            type="button"
            className={toolButtonClass(p.mode === 'mark')}
            aria-pressed={p.mode === 'mark'}
            title="Click the map for a point mark, Shift-drag for a box (m)"
            onClick={() => p.onMode(p.mode === 'mark' ? 'pan' : 'mark')}
          >
            Add mark
          </button>
          <button type="button" className={toolButtonClass()} onClick={reset} title="The whole map (0)">
            Reset view
          </button>
          <ViewRange view={view} against={p.against} />
        </div>
        <div className="flex">
          <div className="flex w-14 shrink-0 flex-col">
            <div className="h-7" />
            <div className={MAP_HEIGHT}>
              <LeftAxis axis={axes.left} testId={p.swapped ? 'map-time-axis' : 'map-frequency-axis'} />
            </div>
          </div>
          <div className="min-w-0 flex-1 pl-2">
            <div className="flex h-7 items-end justify-between gap-3 pb-1 text-xs">
              <p className="truncate font-mono text-[11px] text-mist-500" data-testid="map-resolution">
                {layout && layout.frames > 0
                  ? `Δf ${fmt(layout.binHz, layout.binHz < 10 ? 2 : 1)} Hz · hop ${fmt(layout.hopS * 1000, 1)} ms · ${layout.frames} × ${layout.bins}`
                  : ''}
              </p>
            </div>
            <div ref={boxRef} className={`relative overflow-hidden rounded-sm bg-ink-950 ring-1 ring-ink-800 ${MAP_HEIGHT}`}>
              <MapView
                raster={p.raster}
                lut={p.lut}
                topDb={p.topDb}
                rangeDb={p.rangeDb}
                extents={p.extents}
                swapped={p.swapped}
                against={p.against}
                lines={p.lines}
                frameTimes={p.frameTimes}
                frameRpm={p.frameRpm}
                pinnedX={p.pinnedX}
                mode={p.mode}
                stores={p.stores}
                markPainted={p.isTimeMap}
                probe={p.probe}
                onPick={p.onPick}
                onPin={p.onPin}
                marks={p.marks}
                onMark={p.onMark}
                label={`Map: ${p.swapped ? 'frequency across' : `${p.against} across`}, ${p.swapped ? `${p.against} up` : 'frequency up'}, level as colour`}
              />
              {p.mode === 'mark' && (
                <p className="pointer-events-none absolute left-2 top-2 rounded bg-ink-950/85 px-2 py-1 text-xs text-accent" role="status">
                  Click for a point mark, Shift-drag for a box
                </p>
              )}
              {p.mode === 'pick' && (
                <p className="pointer-events-none absolute left-2 top-2 rounded bg-ink-950/85 px-2 py-1 text-xs text-accent" role="status">
                  Click the carrier on the map
                </p>
              )}
              {p.againstNote && (
                <p className="pointer-events-none absolute inset-x-0 top-1/2 text-center text-sm text-mist-300" role="status">
                  {p.againstNote}
                </p>
              )}
            </div>
            <div className="pt-1">
              <BottomAxis axis={axes.bottom} testId={p.swapped ? 'map-frequency-axis' : 'map-time-axis'} />
            </div>
          </div>
          <MapScale
            lut={p.lut}
            topDb={p.topDb}
            rangeDb={p.rangeDb}
            reference={p.reference.label}
            unit={p.reference.unit}
            weighting={p.weighting}
            heightClass={MAP_HEIGHT}
          />
        </div>
        <Readout stores={p.stores} lines={p.lines} binHz={layout?.binHz ?? 1} weighting={p.weighting} against={p.against} />
        {p.markTools}
        <div className="flex min-h-7 flex-wrap items-center gap-3 pl-16">
          {status.kind === 'computing' && (
            <>
              <div
                role="progressbar"
                aria-label="Computing the map"
                aria-valuemin={0}
                aria-valuemax={100}
                aria-valuenow={percent}
                className="h-1.5 w-64 overflow-hidden rounded-full bg-ink-700"
              >
                <div className="h-full bg-accent transition-[width]" style={{ width: `${percent}%` }} />
              </div>
              <span className="font-mono text-xs text-mist-500">{percent} %</span>
              <button type="button" className={toolButtonClass()} onClick={p.onCancel}>
                Cancel
              </button>
            </>
          )}
          {status.kind === 'cancelled' && (
            <>
              <p className="text-sm text-mist-300" role="status">
                Stopped at <span className="font-mono">{percent} %</span>.
              </p>
              <button type="button" className={toolButtonClass()} onClick={p.onRestart}>
                Compute again
              </button>
            </>
          )}
          {status.kind === 'done' && layout && (
            <p className="text-xs text-mist-500" data-testid="map-done" data-engine={status.engine}>
              {layout.frames} spectra of {fmt(layout.blockSize / p.fsHz, 3)} s, {windowLabel[p.windowName]} window.
            </p>
          )}
          {exportError && <p className="text-xs text-danger">{exportError}</p>}
          <p className="ml-auto text-[11px] text-mist-500">Drag to pan · wheel to zoom · Shift-drag a box · double-click for the whole map · ? for keys</p>
        </div>
        {p.notices}
      </div>
    </BenchPanel>
  );
}

function ViewRange({ view, against }: { view: Viewport | null; against: 'time' | 'speed' }) {
  if (!view) return null;
  const x = against === 'time' ? `${fmt(Math.max(0, view.x[0]), 2)}–${fmt(view.x[1], 2)} s` : `${fmt(Math.max(0, view.x[0]), 0)}–${fmt(view.x[1], 0)} rpm`;
  const kHz = view.f[1] >= 2000;
  const f = kHz ? `${fmt(Math.max(0, view.f[0]) / 1000, 2)}–${fmt(view.f[1] / 1000, 2)} kHz` : `${fmt(Math.max(0, view.f[0]), 0)}–${fmt(view.f[1], 0)} Hz`;
  return (
    <p className="ml-auto font-mono text-[11px] text-mist-500" data-testid="map-view-range" data-x0={view.x[0]} data-x1={view.x[1]}>
      {x} · {f}
    </p>
  );
}

function Readout({
  stores,
  lines,
  binHz,
  weighting,
  against,
}: {
  stores: BenchStores;
  lines: GuideLine[];
  binHz: number;
  weighting: Weighting;
  against: 'time' | 'speed';
}) {
  const probe = useStore(stores.pointer);
  const onMap = probe && probe.from === 'map' ? probe : null;
  const dB = weighting === 'Z' ? 'dB' : `dB(${weighting})`;
  const fDecimals = binHz < 1 ? 2 : binHz < 10 ? 1 : 0;
  const near = onMap ? nearestLine(lines, onMap.frame, onMap.f, against === 'speed' ? onMap.rpm : null) : null;
  const cell = 'inline-block text-right font-mono text-mist-100';
  return (
    <div className="flex min-h-8 flex-wrap items-center gap-x-5 gap-y-1 rounded-md border border-ink-800 bg-ink-950/60 px-3 py-1.5 text-xs text-mist-500" data-testid="map-readout" aria-live="off">
      <span>
        t <span className={`${cell} w-20`}>{onMap ? `${fmt(onMap.timeS, 3)} s` : '—'}</span>
      </span>
      <span>
        n <span className={`${cell} w-20`}>{onMap && Number.isFinite(onMap.rpm) ? `${fmt(onMap.rpm, 0)} rpm` : '—'}</span>
      </span>
      <span>
        f <span className={`${cell} w-24`}>{onMap ? `${fmt(onMap.f, fDecimals)} Hz` : '—'}</span>
      </span>
      <span>
        L{' '}
        <span className={`${cell} w-24 text-accent`}>
          {onMap ? (Number.isFinite(onMap.levelDb) ? `${fmt(onMap.levelDb, 1)} ${dB}` : `−∞ ${dB}`) : '—'}
        </span>
      </span>
      <span className="min-w-0" data-testid="readout-nearest-guide">
        nearest{' '}
        {near ? (
          <span className="font-mono text-mist-100">
            {near.line.label} <span className="text-mist-500">({near.line.detail})</span> Δ {near.deltaHz >= 0 ? '+' : '−'}
            {fmt(Math.abs(near.deltaHz), fDecimals)} Hz
          </span>
        ) : (
          <span className="font-mono text-mist-500">{onMap ? 'no guide' : '—'}</span>
        )}
      </span>
    </div>
  );
}
