/**
 * `inverter FILE --channel I (--tacho J --ppr N | --speed-channel J [--speed-cal K]) [--pole-pairs P]
 * [--orders 8,48] [--families 1:2,1:-2,2:1] [--cal K] [--block N] [--at S] [--sound-pressure]
 * [--quantity Q]`: carrier, shifts, spread, pole pairs, the order and family tracks against speed, and the
 * carrier tones' tonality at S (ECMA-418-1; with --sound-pressure, in Pa, against the ISO 389-7
 * threshold). --quantity (acceleration, velocity, sound-pressure, voltage, other) says which family
 * pattern the channel carries, to settle pole pairs that one sideband pair leaves between two answers.
 */
import { analyseInverter, patternOfQuantity, type InverterAnalysisInput, type InverterReport } from '../../../workers/dsp/inverter-analysis';
import { rpmAtTimes } from '../../../workers/dsp/speed';
import { frameTimeS, type StftLayout } from '../../../workers/dsp/stft';
import { makeWindow } from '../../../workers/dsp/window';
import type { Options } from '../options';
import { UsageError } from '../options';
import { calibrationFactor, channelIndex, readChannels, scaled } from '../recording-input';
import { MapThreadPool } from '../thread-pool';
import { speedCurveFrom } from './speed';

function parseList<T>(o: Options, key: string, parse: (s: string) => T | null): T[] | undefined {
  if (!o.has(key)) return undefined;
  return o
    .string(key)
    .split(',')
    .map((s) => {
      const v = parse(s.trim());
      if (v === null) throw new UsageError(`--${key}: "${s.trim()}" is not valid.`);
      return v;
    });
}

/** The inverter options every command that analyses a file takes (`inverter`, `compare`). */
export function inverterOptions(o: Options) {
  const polePairs = o.has('pole-pairs') ? o.integer('pole-pairs', undefined, 1) : undefined;
  const orders = parseList(o, 'orders', (s) => (Number.isFinite(Number(s)) && Number(s) > 0 ? Number(s) : null));
  const families = parseList(o, 'families', (s) => {
    const m = /^(\d+):(-?\d+)$/.exec(s);
    return m && Number(m[1]) >= 1 ? { m: Number(m[1]), n: Number(m[2]) } : null;
  });
  const quantity = o.choice('quantity', ['acceleration', 'velocity', 'sound-pressure', 'voltage', 'other'] as const, o.has('sound-pressure') ? 'sound-pressure' : 'other');
  return { block: o.integer('block', 8192, 256), polePairs, orders, families, expectedPattern: patternOfQuantity(quantity) ?? undefined };
}

export interface FileAnalysis {
  fileName: string;
  layout: StftLayout;
  /** The map's mean squares, frames × bins, and the window's ENBW in bins */
  power: Float32Array;
  enbwBins: number;
  frameRpm: Float64Array;
  report: InverterReport;
}

/**
 * One file through the inverter analysis as the Bench does it: the channel (calibrated), the speed, a
 * Hann map on the pool's threads, then analyseInverter with the samples (crossings filtered).
 */
export async function analyseFile(file: string, o: Options, pool: MapThreadPool, extra: Partial<InverterAnalysisInput> = {}): Promise<FileAnalysis> {
  const channel = channelIndex(o);
  const opts = inverterOptions(o);
  const curve = await speedCurveFrom(file, o, 'speed-cal');
  const rec = await readChannels(file, [channel]);
  const x = scaled(rec.samples[0], calibrationFactor(o));
  const settings = { window: 'hann' as const, blockSize: opts.block, overlap: 0.75 };
  const { layout, power } = await pool.map(x, rec.header.sampleRateHz, settings);
  if (layout.frames < 8) throw new UsageError(`${rec.header.fileName} is too short for blocks of ${opts.block}: it gives ${layout.frames} frames; use a smaller --block.`);
  const times = Float64Array.from({ length: layout.frames }, (_, f) => frameTimeS(layout, f));
  const frameRpm = rpmAtTimes(curve, times);
  const enbwBins = makeWindow('hann', opts.block).enbwBins;
  const report = analyseInverter({
    power,
    layout,
    window: 'hann',
    enbwBins,
    frameRpm,
    polePairs: opts.polePairs,
    orders: opts.orders ?? [],
    families: opts.families,
    tonalityAtS: o.has('at') ? o.number('at') : undefined,
    soundPressure: o.has('sound-pressure'),
    expectedPattern: opts.expectedPattern,
    samples: x,
    ...extra,
  });
  return { fileName: rec.header.fileName, layout, power, enbwBins, frameRpm, report };
}

/** With `pool` given (a campaign worker's one map thread) the map runs there; else on a pool of its own. */
export async function inverterCommand(file: string, o: Options, given?: MapThreadPool): Promise<Omit<InverterReport, 'families'> & { families: unknown[] }> {
  const pool = given ?? new MapThreadPool();
  try {
    const { report } = await analyseFile(file, o, pool);
    return {
      ...report,
      orders: report.orders.map(({ order, rpm, rms, crossing, filtered }) => ({ order, rpm, rms, crossing, filtered })),
      families: report.families.map(({ m, n, rpm, hz, rms, crossing, filtered, explained }) => ({ m, n, rpm, hz, rms, crossing, filtered, explained })),
    };
  } finally {
    if (!given) await pool.close();
  }
}
