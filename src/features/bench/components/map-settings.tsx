import { useId, type ReactNode } from 'react';
import { MAX_BLOCK, MIN_BLOCK } from '../../../../workers/dsp/stft';
import { windowNames, type WindowName } from '../../../../workers/dsp/window';
import type { Weighting } from '../../../../workers/dsp/weighting';
import { colourScaleLabel, colourScaleNames, type ColourScaleName } from '../../../lib/plot/colour-scales';
import { useBench, useBenchActions } from '../session/bench-session';
import { smallInputClass, smallSelectClass } from './bench-panel';

export const windowLabel: Record<WindowName, string> = {
  rect: 'Rectangular',
  hann: 'Hann',
  hamming: 'Hamming',
  'blackman-harris': 'Blackman-Harris',
  flattop: 'Flat-top',
};

const blockSizes: number[] = [];
for (let n = MIN_BLOCK; n <= MAX_BLOCK; n *= 2) blockSizes.push(n);

const overlaps = [0, 0.5, 0.75, 0.9];
const weightings: { value: Weighting; label: string }[] = [
  { value: 'A', label: 'A' },
  { value: 'C', label: 'C' },
  { value: 'Z', label: 'Z (none)' },
];

function Setting({ label, children }: { label: string; children: (id: string) => ReactNode }) {
  const id = useId();
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="text-[11px] font-medium text-mist-500">
        {label}
      </label>
      {children(id)}
    </div>
  );
}

/** The map's channel, window, block, overlap, weighting, level range and colours. */
export function MapSettingsBar() {
  const s = useBench((b) => b.settings);
  const set = useBenchActions();
  const setup = useBench((b) => b.setup);
  const frames = useBench((b) => b.recording.decoded.header.frames);
  const topDb = useBench((b) => b.topDb);
  const manualTop = useBench((b) => b.manualTop);
  const rangeOk = useBench((b) => b.rangeOk);
  return (
    <div className="flex flex-wrap items-end gap-x-2.5 gap-y-2" data-testid="map-settings">
      <Setting label="Map channel">
        {(id) => (
          <select id={id} className={`${smallSelectClass} max-w-44`} value={s.channel} onChange={(e) => set.setChannel(Number(e.target.value))}>
            {setup.map((c) => (
              <option key={c.index} value={c.index}>
                {c.index + 1} · {c.name.trim() || `ch${c.index + 1}`}
              </option>
            ))}
          </select>
        )}
      </Setting>
      <Setting label="Window">
        {(id) => (
          <select id={id} className={smallSelectClass} value={s.windowName} onChange={(e) => set.setWindowName(e.target.value as WindowName)}>
            {windowNames.map((w) => (
              <option key={w} value={w}>
                {windowLabel[w]}
              </option>
            ))}
          </select>
        )}
      </Setting>
      <Setting label="Block size">
        {(id) => (
          <select id={id} className={`${smallSelectClass} font-mono`} value={s.blockSize} onChange={(e) => set.setBlockSize(Number(e.target.value))}>
            {blockSizes.map((n) => (
              <option key={n} value={n} disabled={n > frames}>
                {n}
              </option>
            ))}
          </select>
        )}
      </Setting>
      <Setting label="Overlap">
        {(id) => (
          <select id={id} className={`${smallSelectClass} font-mono`} value={s.overlap} onChange={(e) => set.setOverlap(Number(e.target.value))}>
            {(overlaps.includes(s.overlap) ? overlaps : [...overlaps, s.overlap].sort((a, b) => a - b)).map((o) => (
              <option key={o} value={o}>
                {Math.round(o * 100)} %
              </option>
            ))}
          </select>
        )}
      </Setting>
      <Setting label="Weighting">
        {(id) => (
          <select id={id} className={smallSelectClass} value={s.weighting} onChange={(e) => set.setWeighting(e.target.value as Weighting)}>
            {weightings.map((w) => (
              <option key={w.value} value={w.value}>
                {w.label}
              </option>
            ))}
          </select>
        )}
      </Setting>
      <div className="h-7 w-px self-end bg-ink-800" aria-hidden />
      <Setting label="Top (dB)">
        {(id) => (
          <div className="flex items-center gap-1">
            <input
              id={id}
              type="number"
              step={5}
              className={`${smallInputClass(s.topText !== null && !manualTop)} w-16`}
              value={s.topText ?? String(topDb)}
              aria-invalid={s.topText !== null && !manualTop ? true : undefined}
              onChange={(e) => set.setTopText(e.target.value)}
            />
            {s.topText !== null && (
              <button
                type="button"
                className="rounded-md px-1.5 py-1 text-xs text-mist-500 hover:bg-ink-800 hover:text-mist-100"
                title="Set the top to the highest level in the map, rounded up to 5 dB"
                onClick={() => set.setTopText(null)}
              >
                Fit
              </button>
            )}
          </div>
        )}
      </Setting>
      <Setting label="Range (dB)">
        {(id) => (
          <input
            id={id}
            type="number"
            min={1}
            step={10}
            className={`${smallInputClass(!rangeOk)} w-16`}
            value={s.rangeText}
            aria-invalid={rangeOk ? undefined : true}
            onChange={(e) => set.setRangeText(e.target.value)}
          />
        )}
      </Setting>
      <Setting label="Colours">
        {(id) => (
          <select id={id} className={smallSelectClass} value={s.colours} onChange={(e) => set.setColours(e.target.value as ColourScaleName)}>
            {colourScaleNames.map((c) => (
              <option key={c} value={c}>
                {colourScaleLabel[c]}
              </option>
            ))}
          </select>
        )}
      </Setting>
    </div>
  );
}
