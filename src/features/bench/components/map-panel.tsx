import { useEffect, useId, useMemo, useState, type ReactNode } from 'react';
import { MAX_BLOCK, MIN_BLOCK, stftLayout } from '../../../../workers/dsp/stft';
import { windowNames, type WindowName } from '../../../../workers/dsp/window';
import type { Weighting } from '../../../../workers/dsp/weighting';
import { calibrationProblem, unitsPerFileUnit, type ChannelSetup } from '../../../../workers/io/channel-setup';
import { Button } from '../../../components/ui/button';
import { Notice } from '../../../components/ui/notice';
import { Section } from '../../../components/ui/section';
import { compactSelectClass } from '../../../components/ui/styles';
import { useMapComputation } from '../hooks/use-map-computation';
import type { OpenRecording } from '../hooks/use-recording-reader';
import { colourLut, colourScaleLabel, colourScaleNames, type ColourScaleName } from '../map/colour-scales';
import { levelReference } from '../map/level-reference';
import { FrequencyAxis, MapGrid, TimeAxis } from './map-axes';
import { MapCanvas, type MapProbe } from './map-canvas';
import { MapScale } from './map-scale';

const windowLabel: Record<WindowName, string> = {
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
const DEFAULT_RANGE_DB = 80;
const MIN_FRAMES = 8;
/** A calibration being typed is taken a moment after the last key. */
const CALIBRATION_PAUSE_MS = 300;

// The map and the colour bar share this height so their edges line up.
const MAP_HEIGHT = 'h-[26rem]';

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

/**
 * The last value that passed `valid`, taken `delayMs` after it last changed (a number being typed);
 * at once when `key` changes (another channel).
 */
function useSettledValue<T>(value: T, valid: (v: T) => boolean, delayMs: number, key: unknown): T {
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

const validScale = (v: number) => Number.isFinite(v) && v !== 0;

function Setting({ label, children }: { label: string; children: (id: string) => ReactNode }) {
  const id = useId();
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="text-xs font-medium text-mist-500">
        {label}
      </label>
      {children(id)}
    </div>
  );
}

const numberInputClass = (invalid: boolean) =>
  `w-20 rounded-md border bg-ink-900 px-2 py-1 font-mono text-sm text-mist-100 focus:border-accent ${invalid ? 'border-danger' : 'border-ink-700'}`;

const fmt = (v: number, decimals: number) => v.toFixed(decimals);

/** The map of one channel of the open recording: settings, the map with its axes and colour bar, and a readout. */
export function MapPanel({ recording, setup }: { recording: OpenRecording; setup: ChannelSetup[] }) {
  const { header, samples: channelSamples, channelIndices } = recording.decoded;
  const fsHz = header.sampleRateHz;

  const [channel, setChannel] = useState(() => defaultChannel(setup));
  const [windowName, setWindowName] = useState<WindowName>('hann');
  const [blockSize, setBlockSize] = useState(() => defaultBlockSize(header.frames));
  const [overlap, setOverlap] = useState(DEFAULT_OVERLAP);
  const [weighting, setWeighting] = useState<Weighting>('Z');
  const [topText, setTopText] = useState<string | null>(null);
  const [rangeText, setRangeText] = useState(String(DEFAULT_RANGE_DB));
  const [colours, setColours] = useState<ColourScaleName>('ember');
  const [probe, setProbe] = useState<MapProbe | null>(null);

  const channelSetup = setup.find((c) => c.index === channel) ?? setup[0];
  const at = channelIndices.indexOf(channelSetup?.index ?? -1);
  const samples = at >= 0 ? channelSamples[at] : null;
  const calibrationBad = channelSetup ? calibrationProblem(channelSetup.calibration) !== null : false;
  const typedScale = channelSetup && !calibrationBad ? unitsPerFileUnit(channelSetup.calibration) : Number.NaN;
  const scale = useSettledValue(typedScale, validScale, CALIBRATION_PAUSE_MS, channel);
  const reference = levelReference(channelSetup ?? { quantity: 'other', unit: '' });

  const settings = useMemo(() => ({ blockSize, overlap, window: windowName }), [blockSize, overlap, windowName]);
  const tooShort = header.frames < MIN_BLOCK;
  const { raster, layout, status, peakTopDb, cancel, restart } = useMapComputation({
    samples: tooShort || !validScale(scale) ? null : samples,
    fsHz,
    settings,
    weighting,
    scale,
    refRms: reference.refRms,
  });

  const parsedTop = topText === null ? Number.NaN : Number(topText);
  const manualTop = topText !== null && Number.isFinite(parsedTop);
  const topDb = manualTop ? parsedTop : (peakTopDb ?? 0);
  const parsedRange = Number(rangeText);
  const rangeOk = Number.isFinite(parsedRange) && parsedRange > 0 && parsedRange <= 400;
  const rangeDb = rangeOk ? parsedRange : DEFAULT_RANGE_DB;
  const lut = colourLut(colours);

  const spanS = raster?.timeSpanS ?? null;
  const spanHz = raster?.frequencySpanHz ?? null;
  const percent = status.kind === 'computing' || status.kind === 'cancelled' ? Math.round(status.fraction * 100) : 0;

  return (
    <Section title="Map">
      <div className="flex flex-col gap-4">
        <div className="flex flex-wrap items-end gap-x-3 gap-y-3" data-testid="map-settings">
          <Setting label="Map channel">
            {(id) => (
              <select id={id} className={`${compactSelectClass} max-w-52`} value={channel} onChange={(e) => setChannel(Number(e.target.value))}>
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
              <select id={id} className={compactSelectClass} value={windowName} onChange={(e) => setWindowName(e.target.value as WindowName)}>
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
              <select id={id} className={`${compactSelectClass} font-mono`} value={blockSize} onChange={(e) => setBlockSize(Number(e.target.value))}>
                {blockSizes.map((n) => (
                  <option key={n} value={n} disabled={n > header.frames}>
                    {n}
                  </option>
                ))}
              </select>
            )}
          </Setting>
          <Setting label="Overlap">
            {(id) => (
              <select id={id} className={`${compactSelectClass} font-mono`} value={overlap} onChange={(e) => setOverlap(Number(e.target.value))}>
                {overlaps.map((o) => (
                  <option key={o} value={o}>
                    {Math.round(o * 100)} %
                  </option>
                ))}
              </select>
            )}
          </Setting>
          <Setting label="Weighting">
            {(id) => (
              <select id={id} className={compactSelectClass} value={weighting} onChange={(e) => setWeighting(e.target.value as Weighting)}>
                {weightings.map((w) => (
                  <option key={w.value} value={w.value}>
                    {w.label}
                  </option>
                ))}
              </select>
            )}
          </Setting>
          <div className="h-9 w-px self-end bg-ink-800" aria-hidden />
          <Setting label="Top (dB)">
            {(id) => (
              <div className="flex items-center gap-1">
                <input
                  id={id}
                  type="number"
                  step={5}
                  className={numberInputClass(topText !== null && !manualTop)}
                  value={topText ?? String(topDb)}
                  aria-invalid={topText !== null && !manualTop ? true : undefined}
                  onChange={(e) => setTopText(e.target.value)}
                />
                {topText !== null && (
                  <button
                    type="button"
                    className="rounded-md px-1.5 py-1 text-xs text-mist-500 hover:bg-ink-800 hover:text-mist-100"
                    title="Set the top to the highest level in the map, rounded up to 5 dB"
                    onClick={() => setTopText(null)}
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
                className={numberInputClass(!rangeOk)}
                value={rangeText}
                aria-invalid={rangeOk ? undefined : true}
                onChange={(e) => setRangeText(e.target.value)}
              />
            )}
          </Setting>
          <Setting label="Colours">
            {(id) => (
              <select id={id} className={compactSelectClass} value={colours} onChange={(e) => setColours(e.target.value as ColourScaleName)}>
                {colourScaleNames.map((c) => (
                  <option key={c} value={c}>
                    {colourScaleLabel[c]}
                  </option>
                ))}
              </select>
            )}
          </Setting>
        </div>

        {tooShort && (
          <Notice>
            The recording is shorter than the smallest block ({MIN_BLOCK} samples), so it has no map.
          </Notice>
        )}
        {calibrationBad && (
          <Notice tone="error">
            The calibration of channel {channel + 1} is not usable; the map keeps the last one that was.
          </Notice>
        )}

        <div className="flex">
          <div className="flex w-16 shrink-0 flex-col">
            <div className="h-8" />
            <div className={MAP_HEIGHT}>
              <FrequencyAxis spanHz={spanHz} />
            </div>
          </div>
          <div className="min-w-0 flex-1 pl-2">
            <div className="flex h-8 items-end justify-between gap-3 pb-1.5 text-xs">
              <p className="truncate font-mono text-mist-500" data-testid="map-resolution">
                {layout && layout.frames > 0
                  ? `Δf ${fmt(layout.binHz, layout.binHz < 10 ? 2 : 1)} Hz · hop ${fmt(layout.hopS * 1000, 1)} ms · ${layout.frames} frames × ${layout.bins} bins`
                  : ''}
              </p>
              <Readout probe={probe} binHz={layout?.binHz ?? 1} weighting={weighting} />
            </div>
            <div className={`relative overflow-hidden rounded-sm bg-ink-950 ring-1 ring-ink-800 ${MAP_HEIGHT}`}>
              <MapCanvas raster={raster} lut={lut} topDb={topDb} rangeDb={rangeDb} onProbe={setProbe} />
              <MapGrid spanS={spanS} spanHz={spanHz} />
              {probe && (
                <div className="pointer-events-none absolute inset-0" aria-hidden>
                  <span className="absolute inset-y-0 w-px bg-mist-100/30" style={{ left: `${probe.x * 100}%` }} />
                  <span className="absolute inset-x-0 h-px bg-mist-100/30" style={{ top: `${probe.y * 100}%` }} />
                </div>
              )}
            </div>
            <div className="pt-1">
              <TimeAxis spanS={spanS} />
            </div>
          </div>
          <MapScale
            lut={lut}
            topDb={topDb}
            rangeDb={rangeDb}
            reference={reference.label}
            unit={reference.unit}
            weighting={weighting}
            heightClass={MAP_HEIGHT}
          />
        </div>

        <div className="flex min-h-9 flex-wrap items-center gap-3 pl-[4.5rem]">
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
              <Button type="button" variant="quiet" className="px-2.5 py-1" onClick={cancel}>
                Cancel
              </Button>
            </>
          )}
          {status.kind === 'cancelled' && (
            <>
              <p className="text-sm text-mist-300" role="status">
                Stopped at <span className="font-mono">{percent} %</span>.
              </p>
              <Button type="button" variant="quiet" className="px-2.5 py-1" onClick={restart}>
                Compute again
              </Button>
            </>
          )}
          {status.kind === 'done' && layout && (
            <p className="text-xs text-mist-500" data-testid="map-done">
              {layout.frames} spectra of {fmt(layout.blockSize / fsHz, 3)} s, {windowLabel[windowName]} window.
            </p>
          )}
        </div>
        {status.kind === 'error' && <Notice tone="error">{status.message}</Notice>}
      </div>
    </Section>
  );
}

function Readout({ probe, binHz, weighting }: { probe: MapProbe | null; binHz: number; weighting: Weighting }) {
  const dB = weighting === 'Z' ? 'dB' : `dB(${weighting})`;
  const fDecimals = binHz < 1 ? 2 : binHz < 10 ? 1 : 0;
  return (
    <p className="flex shrink-0 gap-4 text-mist-500" data-testid="map-readout" aria-live="off">
      <span>
        t <span className="inline-block w-20 text-right font-mono text-mist-100">{probe ? `${fmt(probe.timeS, 3)} s` : '—'}</span>
      </span>
      <span>
        f <span className="inline-block w-24 text-right font-mono text-mist-100">{probe ? `${fmt(probe.frequencyHz, fDecimals)} Hz` : '—'}</span>
      </span>
      <span>
        L{' '}
        <span className="inline-block w-24 text-right font-mono text-accent">
          {probe ? (Number.isFinite(probe.levelDb) ? `${fmt(probe.levelDb, 1)} ${dB}` : `−∞ ${dB}`) : '—'}
        </span>
      </span>
    </p>
  );
}
