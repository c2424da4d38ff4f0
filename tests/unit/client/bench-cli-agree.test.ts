/**
 * The same recording gives the same numbers on the Bench, on the view page and from the batch CLI: the
 * carrier tones' tonality (ECMA-418-1 TNR and PR, carrier-tonality.ts) and the guides' frequencies
 * (f = m·fc + n·fe, fe = p·rpm/60: Holmes & Lipo, Pulse Width Modulation for Power Converters, 2003,
 * eq. 3.33). The CLI runs as a user runs it; the Bench's side is the session's own request builders and
 * the dsp its workers call; the view page's side is the snapshot header and the guide lines it draws.
 */
import { execFile } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { promisify } from 'node:util';
import { describe, expect, it } from 'vitest';
import { synthesiseDrive, synthesiseTacho } from '../../../seeds/synthetic-drive';
import { PROJECT_ROOT } from '../../../server/config';
import { viewState, type ViewState } from '../../../server/schemas/views';
import { findingsRequest, tonalityAt } from '../../../src/features/bench/session/analysis-requests';
import { guidesReducer, initialGuides, lineHz, resolveLines } from '../../../src/features/bench/map/guides';
import { benchViewState, snapshotHeaderOf, type BenchViewInputs } from '../../../src/features/bench/view-state/view-snapshot';
import { guideLines } from '../../../src/features/views/snapshot/guide-lines';
import type { AxisSpec } from '../../../src/features/views/snapshot/axes';
import { speedTask } from '../../../workers/analysis.worker';
import { createRealFft } from '../../../workers/dsp/fft';
import { analyseInverter } from '../../../workers/dsp/inverter-analysis';
import { rpmAtTimes } from '../../../workers/dsp/speed';
import { computeFrames, frameTimeS, stftLayout } from '../../../workers/dsp/stft';
import { makeWindow } from '../../../workers/dsp/window';
import { writeWav } from '../../../workers/io/wav-writer';

const run = promisify(execFile);
const FS = 51200;
const T = 6;
const AT_S = 3;
const rpm = (t: number) => 1200 + 1000 * t; // 1200 → 7200 rpm
const x = synthesiseDrive({
  fsHz: FS,
  durationS: T,
  rpm,
  polePairs: 4,
  carrierHz: () => 10000,
  orders: [{ order: 8, amplitude: 0.04 }],
  families: [
    { m: 1, n: 1, amplitude: 0.03 },
    { m: 1, n: -1, amplitude: 0.03 },
    { m: 1, n: 3, amplitude: 0.01 },
    { m: 1, n: -3, amplitude: 0.01 },
    { m: 2, n: 0, amplitude: 0.01 },
    // (2, ±2) leaves only the force pattern with 4 pole pairs (with 2, n = ±4 would need m + n odd)
    { m: 2, n: 2, amplitude: 0.01 },
    { m: 2, n: -2, amplitude: 0.01 },
  ],
  noiseRms: 0.002,
  seed: 5,
});
const tacho = synthesiseTacho(FS, T, rpm, 60);
const dir = mkdtempSync(path.join(tmpdir(), 'fanlight-agree-'));
const file = path.join(dir, 'run-up.wav');
// 32-bit float: the CLI reads back exactly these samples
writeFileSync(file, writeWav([x, tacho], { sampleRateHz: FS, bits: 32, float: true }));

async function cli(...extra: string[]) {
  const { stdout } = await run('npm', ['run', '-s', 'analyze', '--', 'inverter', file, '--channel', '0', '--tacho', '1', '--ppr', '60', ...extra], {
    cwd: PROJECT_ROOT,
    maxBuffer: 64 << 20,
  });
  return JSON.parse(stdout);
}

/** The Bench's side: the map as its pool computes it (Hann, 8192, 75 %), the speed as its speed task does, the findings as its session asks. */
async function bench() {
  const blockSize = 8192;
  const layout = stftLayout(x.length, FS, { window: 'hann', blockSize, overlap: 0.75 });
  const win = makeWindow('hann', blockSize);
  const power = new Float32Array(layout.frames * layout.bins);
  computeFrames(x, 0, layout, win, await createRealFft(blockSize), 0, layout.frames, power);
  const times = Float64Array.from({ length: layout.frames }, (_, f) => frameTimeS(layout, f));
  const frameRpm = rpmAtTimes(speedTask({ kind: 'tacho', samples: tacho, fsHz: FS, ppr: 60 }), times);
  const opts = { window: 'hann' as const, enbwBins: win.enbwBins, frameRpm, polePairs: null, orders: [], expectedPattern: null, soundPressure: false };
  const report = analyseInverter({ ...findingsRequest(layout, opts), power });
  const detectedHz = Float64Array.from(report.carrier.hz);
  const pinned = tonalityAt({ power, layout, enbwBins: win.enbwBins, frameRpm, carrierHz: detectedHz, polePairs: report.polePairs.value, soundPressure: false }, AT_S);
  return { layout, power, frameRpm, report, detectedHz, pinned, enbwBins: win.enbwBins };
}

const [fromCli, fromCliPinned, onBench] = await Promise.all([cli(), cli('--at', String(AT_S)), bench()]);

describe('the Bench, the view page and the CLI on one recording', () => {
  it('find the same carrier and pole pairs', () => {
    expect(onBench.report.polePairs.value).toBe(4);
    expect(fromCli.polePairs.value).toBe(4);
    expect(onBench.report.carrier.hz).toEqual(fromCli.carrier.hz);
  });

  it('judge the same carrier tones at a pinned moment, to a hundredth of a dB', () => {
    const cliTones = fromCliPinned.tonality.tones as { m: number; n: number; hz: number; tnrDb: number; prDb: number }[];
    expect(fromCliPinned.tonality.atS).toBe(AT_S);
    expect(cliTones.length).toBeGreaterThan(0);
    expect(onBench.pinned.tones.map((t) => [t.m, t.n])).toEqual(cliTones.map((t) => [t.m, t.n]));
    onBench.pinned.tones.forEach((t, i) => {
      expect(t.hz).toBeCloseTo(cliTones[i].hz, 2);
      expect(t.tnrDb).toBeCloseTo(cliTones[i].tnrDb, 2);
      expect(t.prDb).toBeCloseTo(cliTones[i].prDb, 2);
    });
  });

  it('puts the findings’ own tonality in the saved view as the CLI prints it', () => {
    const r = onBench.report;
    const guides = guidesReducer(initialGuides, { type: 'add-carrier', source: 'detected', centreHz: 10000, families: [{ m: 1, n: 1 }, { m: 1, n: -3 }] });
    const lines = resolveLines(guides, { frames: onBench.layout.frames, frameRpm: onBench.frameRpm, polePairs: 4, detectedHz: onBench.detectedHz });
    const inputs: BenchViewInputs = {
      channelIndex: 0,
      window: 'hann',
      blockSize: 8192,
      overlap: 0.75,
      weighting: 'Z',
      refRms: 1e-6,
      against: 'speed',
      swapped: false,
      view: { x: [1500, 7000], f: [8000, 12000] },
      colourScale: 'ember',
      topDb: 100,
      rangeDb: 80,
      guides,
      lines,
      report: r,
      polePairs: 4,
      speedSource: { kind: 'tacho', channel: 1, ppr: 60, triggerLevel: null },
      polePairsSource: 'inferred',
      durationS: T,
      tracks: null,
    };
    const header = snapshotHeaderOf(inputs, { width: 100, height: 100 });
    const tones = (header.findings ?? []).filter((f) => f.kind === 'carrier-tone');
    const cliTones = fromCli.tonality.tones as { m: number; n: number; tnrDb: number; prDb: number }[];
    // the view page shows what the findings judged at their own moment (where the strongest family
    // peaks); the CLI without --at judges there too
    expect(r.tonality.atS).toBeCloseTo(fromCli.tonality.atS, 6);
    expect(cliTones.length).toBeGreaterThan(0);
    expect(tones).toHaveLength(cliTones.length);
    cliTones.forEach((t, i) => {
      expect(tones[i].summary).toContain(`at ${Math.round(r.tonality.tones[i].hz)} Hz`);
      const [tnr, pr] = [...tones[i].summary.matchAll(/(TNR|PR) ([−-]?[\d.]+) dB/g)].map((m) => Number(m[2].replace('−', '-')));
      expect(Math.abs(tnr - t.tnrDb)).toBeLessThanOrEqual(0.05 + 1e-9);
      expect(Math.abs(pr - t.prDb)).toBeLessThanOrEqual(0.05 + 1e-9);
    });

    // Guides: the Bench's line at each frame, the CLI's family track per speed bin, the view page's line
    const state = viewState.parse(benchViewState(inputs)) as ViewState;
    const drawn = guideLines(state, header.axes as { x: AxisSpec; y: AxisSpec });
    const family = (m: number, n: number) => (fromCli.families as { m: number; n: number; rpm: number[]; hz: number[] }[]).find((f) => f.m === m && f.n === n)!;
    for (const [m, n] of [
      [1, 1],
      [1, -3],
    ]) {
      const line = lines.find((l) => l.guide.kind === 'family' && l.guide.m === m && l.guide.n === n)!;
      const onPage = drawn.find((d) => d.guide.kind === 'family' && d.guide.m === m && d.guide.n === n)!;
      expect(onPage.reason).toBeNull();
      const [[r0, f0], [r1, f1]] = onPage.polylines[0];
      const cliFamily = family(m, n);
      cliFamily.rpm.forEach((binRpm, j) => {
        if (binRpm < 1500 || binRpm > 7000) return;
        // the CLI's point is the mean over the frames in its 50 rpm bin; so is the Bench's, from its lines
        const frames = [...onBench.frameRpm.keys()].filter((f) => Math.floor(onBench.frameRpm[f] / 50) === Math.floor(binRpm / 50));
        const benchHz = frames.reduce((s, f) => s + lineHz(line, f), 0) / frames.length;
        expect(Math.abs(benchHz - cliFamily.hz[j])).toBeLessThan(0.05);
        // the view page draws with the carrier of its schedule, rounded to whole hertz
        const pageHz = f0 + ((binRpm - r0) / (r1 - r0)) * (f1 - f0);
        expect(Math.abs(pageHz - cliFamily.hz[j])).toBeLessThan(1);
      });
    }
  });
});
