import { useEffect, useMemo, useState } from 'react';
import { MIN_BLOCK, stftLayout } from '../../../../workers/dsp/stft';
import type { WindowName } from '../../../../workers/dsp/window';
import type { Weighting } from '../../../../workers/dsp/weighting';
import type { ChannelSetup } from '../../../../workers/io/channel-setup';
import type { ColourScaleName } from '../../../lib/plot/colour-scales';

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

/** The map's settings: a saved view's, else the defaults for this recording. */
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
  // one object while nothing changes, so what reads it re-renders only for a change
  const settings = useMemo(
    () => ({ channel, windowName, blockSize, overlap, weighting, topText, rangeText, colours }),
    [channel, windowName, blockSize, overlap, weighting, topText, rangeText, colours],
  );
  return {
    settings,
    setters: { setChannel, setWindowName, setBlockSize, setOverlap, setWeighting, setTopText, setRangeText, setColours },
  };
}

/** The map's settings as the engineer has them (the level range as typed). */
export type MapSettings = ReturnType<typeof useMapSettings>['settings'];
export type MapSettingsSetters = ReturnType<typeof useMapSettings>['setters'];


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

