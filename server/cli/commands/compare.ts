/**
 * `compare FILE_A FILE_B [FILE…] --channel I (--tacho J --ppr N | --speed-channel J [--speed-cal K])
 * [--pole-pairs P] [--orders 8,48] [--families 1:2,1:-2] [--rpm-step R] [--target FILE.csv] [--ref R]
 * [--weighting A|Z]`: the runs on one speed grid (the first file is the baseline). Each run's carrier
 * against speed, its shifts and pole pairs; each track (the orders, the families, the overall level) on
 * the grid in every run, its level in dB re --ref and its difference from the baseline; and every speed
 * interval where a run's track lies above its target. Without --families, the baseline's four strongest
 * families (those its pattern explains) are compared.
 */
import { readFile } from 'node:fs/promises';
import { deltaDb, exceedances, levelsDb, medianOnSpeedGrid, onSpeedGrid, speedGrid, speedRange } from '../../../workers/dsp/compare';
import { guideFrequencyHz } from '../../../workers/dsp/guide-formula';
import { weightingDb, type Weighting } from '../../../workers/dsp/weighting';
import { parseTargetCsv, targetAt, trackKeyText, type TargetCurve, type TrackKey } from '../../../workers/io/target-csv';
import type { Options } from '../options';
import { UsageError } from '../options';
import { MapThreadPool } from '../thread-pool';
import { analyseFile, inverterOptions, type FileAnalysis } from './inverter';

const STRONGEST = 4;
const round = (x: number, digits = 6) => (Number.isFinite(x) ? Number(x.toPrecision(digits)) : null);
const listOf = (a: Float64Array, digits = 6) => Array.from(a, (v) => round(v, digits));

async function readTargets(file: string): Promise<TargetCurve[]> {
  let text: string;
  try {
    text = await readFile(file, 'utf8');
  } catch {
    throw new UsageError(`--target: ${file} cannot be read.`);
  }
  const parsed = parseTargetCsv(text);
  if (!parsed.ok) {
    const e = parsed.errors[0];
    const more = parsed.errors.length > 1 ? ` (and ${parsed.errors.length - 1} more)` : '';
    throw new UsageError(`--target ${file}${e.row ? ` line ${e.row}` : ''}: ${e.field}: ${e.message}${more}`);
  }
  return parsed.targets;
}

interface TrackOnGrid {
  key: TrackKey;
  /** RMS per run on the grid (NaN outside its speed range) */
  rms: Float64Array[];
  /** dB re the reference, weighted */
  db: Float64Array[];
}

/** The per-frame overall RMS of a run's map (Parseval over the bins above DC, ENBW-corrected), weighted. */
function overallPerFrame(run: FileAnalysis, weighting: Weighting): Float64Array {
  const { layout, power, enbwBins } = run;
  const gains = Float64Array.from({ length: layout.bins }, (_, k) => (weighting === 'Z' ? 1 : 10 ** (weightingDb(weighting, k * layout.binHz) / 10)));
  return Float64Array.from({ length: layout.frames }, (_, f) => {
    let sum = 0;
    const row = f * layout.bins;
    for (let k = 1; k < layout.bins; k++) sum += power[row + k] * gains[k];
    return Math.sqrt(sum / enbwBins);
  });
}

export async function compareCommand(files: string[], o: Options) {
  if (files.length < 2 || files.length > 6) throw new UsageError('compare takes 2 to 6 files: the baseline first.');
  const step = o.number('rpm-step', 50, (v) => (v > 0 && v <= 1000 ? null : 'must be above 0 and at most 1000 rpm.'));
  const ref = o.number('ref', 1, (v) => (v > 0 ? null : 'must be above 0.'));
  const weighting = o.choice('weighting', ['A', 'Z'] as const, 'Z');
  const opts = inverterOptions(o);
  const targets = o.has('target') ? await readTargets(o.string('target')) : [];

  // Every run with the same guides, all at once: one run's findings are worked out while the pool's
  // threads compute the next one's map.
  const pool = new MapThreadPool();
  let runs: FileAnalysis[];
  try {
    runs = await Promise.all(files.map((file) => analyseFile(file, o, pool, { rpmStep: step })));
  } finally {
    await pool.close();
  }
  const families =
    opts.families ??
    runs[0].report.strongestFamilies
      .filter((f) => f.explained !== false && f.peakRms > 0)
      .slice(0, STRONGEST)
      .map(({ m, n }) => ({ m, n }));

  const grid = speedGrid(
    runs.map((r) => speedRange(r.frameRpm, r.frameRpm)),
    step,
  );
  const weighted = (rms: Float64Array, hzAt: (k: number) => number) =>
    weighting === 'Z' ? rms : Float64Array.from(rms, (v, k) => v * 10 ** (weightingDb(weighting, hzAt(k)) / 20));

  const tracks: TrackOnGrid[] = [];
  for (const order of opts.orders ?? []) {
    const key: TrackKey = { kind: 'order', order };
    const rms = runs.map((r) => {
      const t = r.report.orders.find((x) => x.order === order)!;
      return onSpeedGrid(t.rpm, t.rms, grid, step);
    });
    const hz = (k: number) => guideFrequencyHz({ kind: 'order', order }, { rpm: grid[k], carrierHz: NaN, polePairs: NaN });
    tracks.push({ key, rms, db: rms.map((v) => levelsDb(weighted(v, hz), ref)) });
  }
  for (const { m, n } of families) {
    const key: TrackKey = { kind: 'family', m, n };
    const perRun = runs.map((r) => r.report.families.find((x) => x.m === m && x.n === n));
    const rms = perRun.map((t) => (t ? onSpeedGrid(t.rpm, t.rms, grid, step) : new Float64Array(grid.length).fill(NaN)));
    const db = perRun.map((t, i) => {
      const hzOnGrid = t ? onSpeedGrid(t.rpm, t.hz, grid, step) : new Float64Array(grid.length).fill(NaN);
      return levelsDb(weighted(rms[i], (k) => hzOnGrid[k]), ref);
    });
    tracks.push({ key, rms, db });
  }
  const overall = runs.map((r) => onSpeedGrid(r.frameRpm, overallPerFrame(r, weighting), grid, step));
  tracks.push({ key: { kind: 'overall' }, rms: overall, db: overall.map((v) => levelsDb(v, ref)) });

  const found: { run: number; track: string; fromRpm: number | null; toRpm: number | null; maxExcessDb: number | null; atRpm: number | null }[] = [];
  for (const target of targets) {
    const name = trackKeyText(target.track);
    const track = tracks.find((t) => trackKeyText(t.key) === name);
    if (!track) throw new UsageError(`--target: ${name} is not among the compared tracks; add it with --orders or --families.`);
    track.db.forEach((db, run) => {
      for (const e of exceedances(grid, db, (rpm) => targetAt(target.points, rpm))) {
        found.push({ run, track: name, fromRpm: round(e.fromRpm), toRpm: round(e.toRpm), maxExcessDb: round(e.maxExcessDb, 4), atRpm: round(e.atRpm) });
      }
    });
  }

  return {
    rpm: listOf(grid),
    weighting,
    ref,
    runs: runs.map((r) => ({
      file: r.fileName,
      carrier: { rpm: listOf(grid), hz: listOf(medianOnSpeedGrid(r.frameRpm, r.report.carrier.hz, grid, step)) },
      carrierShifts: r.report.carrierShifts,
      carrierSpreadHz: r.report.carrierSpreadHz,
      polePairs: r.report.polePairs,
    })),
    tracks: tracks.map((t) => ({
      ...(t.key.kind === 'order' ? { kind: 'order', order: t.key.order } : t.key.kind === 'family' ? { kind: 'family', m: t.key.m, n: t.key.n } : { kind: 'overall' }),
      track: trackKeyText(t.key),
      rms: t.rms.map((v) => listOf(v)),
      db: t.db.map((v) => listOf(v, 5)),
      deltaDb: t.db.map((v) => listOf(deltaDb(v, t.db[0]), 4)),
    })),
    exceedances: found,
  };
}
