import type { ReactNode } from 'react';
import type { Viewport } from '../map/viewport';
import { useBench, useBenchActions } from '../session/bench-session';
import { toolButtonClass } from './bench-panel';
import { ViewRange } from './map-readout';

/** Against time or speed, swap, zoom, box zoom, add marks, reset, and the visible span. */
export function MapToolbar({ view, onReset, before, after }: { view: Viewport | null; onReset: () => void; before?: ReactNode; after?: ReactNode }) {
  const a = useBenchActions();
  const against = useBench((s) => s.against);
  const speedAvailable = useBench((s) => s.frameRpm !== null);
  const swapped = useBench((s) => s.swapped);
  const mode = useBench((s) => s.mode);
  return (
    <div className="flex flex-wrap items-center gap-2" data-testid="map-toolbar">
      {before}
      {before && <span className="h-5 w-px bg-ink-800" aria-hidden />}
      <div className="flex items-center gap-1" role="group" aria-label="Against">
        <span className="mr-1 text-[11px] font-medium text-mist-500">Against</span>
        <button type="button" className={toolButtonClass(against === 'time')} aria-pressed={against === 'time'} onClick={() => a.setAgainst('time')}>
          Time
        </button>
        <button
          type="button"
          className={toolButtonClass(against === 'speed')}
          aria-pressed={against === 'speed'}
          disabled={!speedAvailable}
          title={speedAvailable ? 'The map resampled against speed' : 'Set a speed source first'}
          onClick={() => a.setAgainst('speed')}
        >
          Speed
        </button>
      </div>
      <span className="h-5 w-px bg-ink-800" aria-hidden />
      <button type="button" className={toolButtonClass(swapped)} aria-pressed={swapped} onClick={() => a.setSwapped((w) => !w)} title="Frequency across or up (s)">
        Swap axes
      </button>
      <span className="h-5 w-px bg-ink-800" aria-hidden />
      <button type="button" className={toolButtonClass()} aria-label="Zoom in" title="Zoom in (+)" onClick={() => a.zoom(1 / 1.5)}>
        +
      </button>
      <button type="button" className={toolButtonClass()} aria-label="Zoom out" title="Zoom out (−)" onClick={() => a.zoom(1.5)}>
        −
      </button>
      <button
        type="button"
        className={toolButtonClass(mode === 'box')}
        aria-pressed={mode === 'box'}
        title="Drag a box to zoom into (or hold Shift while dragging)"
        onClick={() => a.setMode(mode === 'box' ? 'pan' : 'box')}
      >
        Box zoom
      </button>
      <button
        type="button"
        className={toolButtonClass(mode === 'mark')}
        aria-pressed={mode === 'mark'}
        title="Click the map for a point mark, Shift-drag for a box (m)"
        onClick={() => a.setMode(mode === 'mark' ? 'pan' : 'mark')}
      >
        Add mark
      </button>
      <button type="button" className={toolButtonClass()} onClick={onReset} title="The whole map (0)">
        Reset view
      </button>
      <ViewRange view={view} against={against} />
      {after}
    </div>
  );
}
