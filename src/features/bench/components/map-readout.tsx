import type { Weighting } from '../../../../workers/dsp/weighting';
import { nearestLine } from '../map/guides';
import type { Viewport } from '../map/viewport';
import { useBench, useBenchLive } from '../session/bench-session';
import { createStore, useStore } from '../session/store';
import { useListenIfAny } from '../listen/listen-context';
import type { PlayHead } from '../listen/listen-controller';

const noPlayHead = createStore<PlayHead | null>(null);

const fmt = (v: number, decimals: number) => v.toFixed(decimals);

/** The visible span of the map, as numbers. */
export function ViewRange({ view, against }: { view: Viewport | null; against: 'time' | 'speed' }) {
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

/** What lies under the pointer on the map: time, speed, frequency, level, and the nearest guide. */
export function Readout() {
  const probe = useStore(useBenchLive().pointer);
  const lines = useBench((s) => s.lines);
  const binHz = useBench((s) => s.map.layout?.binHz ?? 1);
  const weighting: Weighting = useBench((s) => s.settings.weighting);
  const against = useBench((s) => s.against);
  const onMap = probe && probe.from === 'map' ? probe : null;
  // while the sound plays, the readout follows the play head wherever the pointer is not on the map
  const listen = useListenIfAny();
  const head = useStore(listen?.playHead ?? noPlayHead);
  const runId = useBench((s) => s.recording.entry.fingerprint);
  const playing = head && listen?.playing && head.runId === runId ? head : null;
  const at = onMap ?? playing;
  const dB = weighting === 'Z' ? 'dB' : `dB(${weighting})`;
  const fDecimals = binHz < 1 ? 2 : binHz < 10 ? 1 : 0;
  const near = onMap ? nearestLine(lines, onMap.frame, onMap.f, against === 'speed' ? onMap.rpm : null) : null;
  const cell = 'inline-block text-right font-mono text-mist-100';
  return (
    <div className="flex min-h-8 flex-wrap items-center gap-x-5 gap-y-1 rounded-md border border-ink-800 bg-ink-950/60 px-3 py-1.5 text-xs text-mist-500" data-testid="map-readout" aria-live="off">
      <span>
        {!onMap && playing ? (
          <span className="text-ok" aria-hidden>
            ▶{' '}
          </span>
        ) : null}
        t <span className={`${cell} w-20`}>{at ? `${fmt(at.timeS, 3)} s` : '—'}</span>
      </span>
      <span>
        n <span className={`${cell} w-20`}>{at && Number.isFinite(at.rpm) ? `${fmt(at.rpm, 0)} rpm` : '—'}</span>
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
