import { useEffect, useId, useState, type ReactNode } from 'react';
import { MAX_BLOCK, MIN_BLOCK, stftLayout } from '../../../../workers/dsp/stft';
import { windowNames, type WindowName } from '../../../../workers/dsp/window';
import type { Weighting } from '../../../../workers/dsp/weighting';
import type { ChannelSetup } from '../../../../workers/io/channel-setup';
import { colourScaleLabel, colourScaleNames, type ColourScaleName } from '../map/colour-scales';
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

const DEFAULT_BLOCK = 8192;
const DEFAULT_OVERLAP = 0.75;
export const DEFAULT_RANGE_DB = 80;
const MIN_FRAMES = 8;

const framesOf = (samples: number, blockSize: number, overlap: number) =>
  samples >= blockSize ? stftLayout(samples, 1, { blockSize, overlap, window: 'hann' }).frames : 0;

/** 8192, or the largest smaller block that still gives the map at least 8 frames. */
function defaultBlockSize(samples: number): number {
  for (let n = DEFAULT_BLOCK; n > MIN_BLOCK; n /= 2) if (framesOf(samples, n, DEFAULT_OVERLAP) >= MIN_FRAMES) return n;
  return MIN_BLOCK;
}

/** The first channel that carries a signal rather than a speed. */
function defaultChannel(setup: ChannelSetup[]): number {
  return (setup.find((c) => c.quantity !== 'tacho' && c.quantity !== 'speed') ?? setup[0])?.index ?? 0;
}

/** Settings a saved view brings along; the rest start at their defaults. */
export interface InitialMapSettings {
  channelIndex: number;
  window: WindowName;
  blockSize: number;
  overlap: number;
  weighting: Weighting;
  colours: ColourScaleName;
  topDb: number;
  rangeDb: number;
}

export function useMapSettings(frames: number, setup: ChannelSetup[], initial?: InitialMapSettings) {
  const [channel, setChannel] = useState(() => (initial && setup.some((c) => c.index === initial.channelIndex) ? initial.channelIndex : defaultChannel(setup)));
  const [windowName, setWindowName] = useState<WindowName>(initial?.window ?? 'hann');
  const [blockSize, setBlockSize] = useState(() => (initial && initial.blockSize <= Math.max(MIN_BLOCK, frames) ? initial.blockSize : defaultBlockSize(frames)));
  const [overlap, setOverlap] = useState(initial?.overlap ?? DEFAULT_OVERLAP);
  const [weighting, setWeighting] = useState<Weighting>(initial?.weighting ?? 'Z');
  // a saved view keeps its level range: its top is a typed one here
  const [topText, setTopText] = useState<string | null>(initial ? String(initial.topDb) : null);
  const [rangeText, setRangeText] = useState(String(initial?.rangeDb ?? DEFAULT_RANGE_DB));
  const [colours, setColours] = useState<ColourScaleName>(initial?.colours ?? 'ember');
  return {
    channel,
    setChannel,
    windowName,
    setWindowName,
    blockSize,
    setBlockSize,
    overlap,
    setOverlap,
    weighting,
    setWeighting,
    topText,
    setTopText,
    rangeText,
    setRangeText,
    colours,
    setColours,
  };
}

export type MapSettings = ReturnType<typeof useMapSettings>;

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

/**
 * The last value that passed `valid`, taken `delayMs` after it last changed (a number being typed);
 * at once when `key` changes (another channel).
 */
export function useSettledValue<T>(value: T, valid: (v: T) => boolean, delayMs: number, key: unknown): T {
  const [settled, setSettled] = useState({ value, key });
  const now = settled.key !== key && valid(value);
  if (now) setSettled({ value, key });
  useEffect(() => {
    if (!valid(value) || Object.is(value, settled.value)) return;
    const t = setTimeout(() => setSettled({ value, key }), delayMs);
    return () => clearTimeout(t);
  }, [value, valid, delayMs, settled, key]);
  return now ? value : settled.value;
}

export function MapSettingsBar({
  s,
  setup,
  frames,
  topDb,
  manualTop,
  rangeOk,
}: {
  s: MapSettings;
  setup: ChannelSetup[];
  frames: number;
  topDb: number;
  manualTop: boolean;
  rangeOk: boolean;
}) {
  return (
    <div className="flex flex-wrap items-end gap-x-2.5 gap-y-2" data-testid="map-settings">
      <Setting label="Map channel">
        {(id) => (
          <select id={id} className={`${smallSelectClass} max-w-44`} value={s.channel} onChange={(e) => s.setChannel(Number(e.target.value))}>
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
          <select id={id} className={smallSelectClass} value={s.windowName} onChange={(e) => s.setWindowName(e.target.value as WindowName)}>
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
          <select id={id} className={`${smallSelectClass} font-mono`} value={s.blockSize} onChange={(e) => s.setBlockSize(Number(e.target.value))}>
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
          <select id={id} className={`${smallSelectClass} font-mono`} value={s.overlap} onChange={(e) => s.setOverlap(Number(e.target.value))}>
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
          <select id={id} className={smallSelectClass} value={s.weighting} onChange={(e) => s.setWeighting(e.target.value as Weighting)}>
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
              onChange={(e) => s.setTopText(e.target.value)}
            />
            {s.topText !== null && (
              <button
                type="button"
                className="rounded-md px-1.5 py-1 text-xs text-mist-500 hover:bg-ink-800 hover:text-mist-100"
                title="Set the top to the highest level in the map, rounded up to 5 dB"
                onClick={() => s.setTopText(null)}
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
            onChange={(e) => s.setRangeText(e.target.value)}
          />
        )}
      </Setting>
      <Setting label="Colours">
        {(id) => (
          <select id={id} className={smallSelectClass} value={s.colours} onChange={(e) => s.setColours(e.target.value as ColourScaleName)}>
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
