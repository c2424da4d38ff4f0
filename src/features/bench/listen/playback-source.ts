/**
 * What plays: one channel of one run of the workspace, scaled for playback, with its processed twin
 * (the ticked guides alone or taken out, in the listening worker) and its time ↔ speed relation.
 *
 * Levels: a sound-pressure channel in Pa plays calibrated — 1 Pa in the recording (94 dB SPL RMS) is
 * −26 dB re digital full scale before the playback gain (full scale is 20 Pa), so what is said on the
 * bar is a stated gain, not a guess. Any other channel plays normalised: its largest sample is full
 * scale before the gain. How loud full scale sounds depends on the headphones and the volume setting,
 * which the page cannot know.
 */
import { rpmAt, type SpeedCurve } from '../../../../workers/dsp/speed';
import { calibrationProblem, unitsPerFileUnit } from '../../../../workers/io/channel-setup';
import type { PlaybackFilterOptions } from '../../../../workers/dsp/playback-filter';
import type { PublishedRun } from '../workspace/workspace';
import { prepareChannel, processBlock, processRange } from './listen-worker';
import type { PlaybackSource } from './playback-engine';

/** Digital full scale of a calibrated sound-pressure channel, Pa. */
export const FULL_SCALE_PA = 20;

export type Processing = 'off' | PlaybackFilterOptions['processing'];

export interface SourceChoice {
  /** The channel's index in the file (null: the map's channel) */
  channel: number | null;
  processing: Processing;
  bandwidthHz: number;
}

export interface RunSource extends PlaybackSource {
  runId: string;
  runName: string;
  channelIndex: number;
  channelName: string;
  /** Playback units per channel unit (Pa, m/s², …) */
  playScale: number;
  /** Channel units per file unit */
  unitScale: number;
  unit: string;
  calibrated: boolean;
  speed: SpeedCurve | null;
  /** The lines processed (none when processing is off) */
  lineCount: number;
  /** Hands the channel to the listening worker ahead of the first block */
  prepare(): void;
  /** The processed samples of [from, to) in the channel's units (for an export) */
  processedRange: ((from: number, to: number) => Promise<Float32Array>) | null;
}

const peaks = new WeakMap<Float32Array, number>();
function peakOf(x: Float32Array): number {
  let p = peaks.get(x);
  if (p === undefined) {
    p = 0;
    for (let i = 0; i < x.length; i++) p = Math.max(p, Math.abs(x[i]));
    peaks.set(x, p);
  }
  return p;
}

const scaledCopy = (x: Float32Array, k: number) => {
  const out = new Float32Array(x.length);
  for (let i = 0; i < x.length; i++) out[i] = x[i] * k;
  return out;
};

/** The source for a run and the choice; null when the run has no such channel. */
export function runSource(run: PublishedRun, choice: SourceChoice): RunSource | null {
  const s = run.state;
  const { header, samples, channelIndices } = s.recording.decoded;
  const channelIndex = choice.channel ?? s.settings.channel;
  const at = channelIndices.indexOf(channelIndex);
  if (at < 0) return null;
  const raw = samples[at];
  const setup = s.setup.find((c) => c.index === channelIndex);
  const calibrated = setup ? calibrationProblem(setup.calibration) === null : false;
  const unitScale = setup && calibrated ? unitsPerFileUnit(setup.calibration) : 1;
  const pascal = calibrated && setup?.quantity === 'sound-pressure' && /^pa$/i.test(setup.unit);
  const peak = peakOf(raw) * Math.abs(unitScale);
  const playScale = pascal ? 1 / FULL_SCALE_PA : peak > 0 ? 1 / peak : 1;
  const toPlay = playScale * unitScale;
  const fsHz = header.sampleRateHz;
  const lines = s.selected.map((l) => ({ guide: l.guide, ctx: l.ctx }));
  const layout = s.map.layout;
  const id = `${run.id}:${channelIndex}`;
  const filtering = choice.processing !== 'off' && lines.length > 0 && layout !== null;
  const ask = (kind: 'block' | 'range', from: number, to: number) =>
    (kind === 'block' ? processBlock : processRange)({
      id,
      samples: raw,
      fsHz,
      from,
      to,
      lines,
      layout: layout!,
      options: { bandwidthHz: choice.bandwidthHz, processing: choice.processing as PlaybackFilterOptions['processing'] },
    });
  return {
    id: `${id}:${choice.processing}:${choice.bandwidthHz}`,
    runId: run.id,
    runName: run.name,
    fsHz,
    length: raw.length,
    channelIndex,
    channelName: setup?.name ?? `Channel ${channelIndex + 1}`,
    unit: setup?.unit ?? '',
    calibrated,
    playScale,
    unitScale,
    speed: s.speed.kind === 'done' ? s.speed.curve : null,
    lineCount: filtering ? lines.length : 0,
    prepare: () => (filtering ? prepareChannel(id, raw, fsHz) : undefined),
    original: (from, to) => scaledCopy(raw.subarray(from, to), toPlay),
    processed: filtering ? (from, to) => ask('block', from, to).then((x) => scaledCopy(x, toPlay)) : null,
    processedRange: filtering ? (from, to) => ask('range', from, to).then((x) => scaledCopy(x, unitScale)) : null,
  };
}

/** Speed at a sample of the source, rpm (NaN without a speed). */
export const rpmAtSample = (src: RunSource, sample: number) => (src.speed ? rpmAt(src.speed, sample / src.fsHz) : Number.NaN);

/** What the gain means, in words: "1 Pa (94 dB SPL) plays at −46 dBFS" or "the channel's peak plays at −20 dBFS". */
export function levelStatement(src: RunSource, gainDb: number): string {
  const dbfs = (v: number) => `${v <= 0 ? '−' : '+'}${Math.abs(v).toFixed(0)} dBFS`;
  if (src.calibrated && src.playScale === 1 / FULL_SCALE_PA) return `1 Pa (94 dB SPL) plays at ${dbfs(20 * Math.log10(1 / FULL_SCALE_PA) + gainDb)}`;
  return `The channel's peak plays at ${dbfs(gainDb)}`;
}
