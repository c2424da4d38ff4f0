/**
 * `npm run -s analyze -- compare …` as a user runs it, on a generated pair of run-ups of one drive with
 * known differences (invented for the test): after the change the family fc + fe is 6 dB higher (twice
 * the amplitude: 20·lg 2 = 6.02 dB), the order 8 is 3 dB lower (amplitude × 10^(−3/20)), and the carrier
 * steps from 8 to 12 kHz at 6000 rpm instead of 5000 rpm. A target on fc + fe falls from 10 dB above the
 * baseline's level at 3000 rpm to 10 dB below it at 5000 rpm, so the baseline exceeds it from 4000 rpm and
 * the changed run (6 dB higher) from 3400 rpm (linear interpolation of the target).
 */
import { execFile } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { promisify } from 'node:util';
import { describe, expect, it } from 'vitest';
import { synthesiseDrive, synthesiseTacho } from '../../../seeds/synthetic-drive';
import { PROJECT_ROOT } from '../../../server/config';
import { writeWav } from '../../../workers/io/wav-writer';
import { analyzeCli } from '../../support/run-analyze';

const run = promisify(execFile);
const FS = 51200;
const T = 8;
const rpm = (t: number) => 1000 + 1000 * t; // 1000 → 9000 rpm
const dir = mkdtempSync(path.join(tmpdir(), 'fanlight-cli-compare-'));
const A_FAMILY = 0.02;
const A_ORDER = 0.05;
const familyDb = 20 * Math.log10(A_FAMILY / Math.SQRT2);

function writeRun(file: string, shiftRpm: number, familyGain: number, orderGain: number, seed: number) {
  const x = synthesiseDrive({
    fsHz: FS,
    durationS: T,
    rpm,
    polePairs: 4,
    carrierHz: (t) => (rpm(t) < shiftRpm ? 8000 : 12000),
    orders: [{ order: 8, amplitude: A_ORDER * orderGain }],
    families: [
      { m: 1, n: 1, amplitude: A_FAMILY * familyGain },
      { m: 1, n: -1, amplitude: A_FAMILY },
      { m: 2, n: 2, amplitude: 0.008 },
      { m: 2, n: -2, amplitude: 0.008 },
    ],
    noiseRms: 0.002,
    seed,
  });
  writeFileSync(file, writeWav([x, synthesiseTacho(FS, T, rpm, 60)], { sampleRateHz: FS, bits: 32, float: true }));
}

const before = path.join(dir, 'before.wav');
const after = path.join(dir, 'after.wav');
writeRun(before, 5000, 1, 1, 21);
writeRun(after, 6000, 2, 10 ** (-3 / 20), 22);
const target = path.join(dir, 'target.csv');
writeFileSync(target, `track,rpm,db\nfamily:1:1,1000,${familyDb + 10}\nfamily:1:1,3000,${familyDb + 10}\nfamily:1:1,5000,${familyDb - 10}\nfamily:1:1,9000,${familyDb - 10}\n`);

const analyze = async (...args: string[]) => (await analyzeCli(...args)).json;

const median = (xs: number[]) => {
  const s = xs.filter(Number.isFinite).sort((a, b) => a - b);
  return s[s.length >> 1];
};

describe('analyze compare', async () => {
  const r = await analyze('compare', before, after, '--channel', '0', '--tacho', '1', '--ppr', '60', '--orders', '8', '--families', '1:1,1:-1', '--pole-pairs', '4', '--target', target);
  const track = (name: string) => r.tracks.find((t: { track: string }) => t.track === name);

  it('prints the grid, the runs, the tracks with their deltas and the exceedances in the fixed shape', () => {
    expect(Object.keys(r).sort()).toEqual(['exceedances', 'ref', 'rpm', 'runs', 'tracks', 'weighting']);
    expect(r.runs.map((x: { file: string }) => x.file)).toEqual(['before.wav', 'after.wav']);
    expect(r.tracks.map((t: { track: string }) => t.track)).toEqual(['order:8', 'family:1:1', 'family:1:-1', 'overall']);
    for (const t of r.tracks) {
      expect(t.rms).toHaveLength(2);
      expect(t.deltaDb).toHaveLength(2);
      expect(t.rms[0]).toHaveLength(r.rpm.length);
      expect(t.deltaDb[0].filter((v: number | null) => v !== null).every((v: number) => v === 0)).toBe(true);
    }
    expect(r.runs[0].carrier.hz).toHaveLength(r.rpm.length);
  });

  it('finds the family 6 dB up, the order 3 dB down and the untouched family unchanged, within 0.5 dB', () => {
    const within = (name: string, expected: number) => {
      const d = (track(name).deltaDb[1] as (number | null)[]).filter((v): v is number => v !== null);
      expect(d.length).toBeGreaterThan(r.rpm.length / 2);
      expect(Math.abs(median(d) - expected)).toBeLessThan(0.5);
    };
    within('family:1:1', 20 * Math.log10(2));
    within('order:8', -3);
    within('family:1:-1', 0);
  });

  it('finds each run’s carrier shift at its own speed, within 2 %', () => {
    expect(Math.abs(r.runs[0].carrierShifts[0].rpm - 5000) / 5000).toBeLessThan(0.02);
    expect(Math.abs(r.runs[1].carrierShifts[0].rpm - 6000) / 6000).toBeLessThan(0.02);
  });

  it('says where each run starts to exceed the target, within 3 %', () => {
    const first = (run: number) => r.exceedances.find((e: { run: number; track: string }) => e.run === run && e.track === 'family:1:1');
    expect(Math.abs(first(0).fromRpm - 4000) / 4000).toBeLessThan(0.03);
    expect(Math.abs(first(1).fromRpm - 3400) / 3400).toBeLessThan(0.03);
    expect(first(1).maxExcessDb).toBeGreaterThan(first(0).maxExcessDb);
  });

  it('refuses a target file with a bad row, naming the line and the field', async () => {
    const bad = path.join(dir, 'bad-target.csv');
    writeFileSync(bad, 'track,rpm,db\nfamily:1:1,1000,-20\nfamily:1:1,fast,-30\n');
    const out = await run('npm', ['run', '-s', 'analyze', '--', 'compare', before, after, '--channel', '0', '--tacho', '1', '--ppr', '60', '--target', bad], { cwd: PROJECT_ROOT }).then(
      () => null,
      (e: { code: number; stderr: string }) => e,
    );
    expect(out?.code).toBe(2);
    expect(out?.stderr).toContain('line 3: rpm');
  });
});
