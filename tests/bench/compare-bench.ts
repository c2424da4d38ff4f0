/**
 * The batch `compare` command end to end (process start, two decodes, two maps on worker threads, both
 * runs' findings, the grid, deltas, JSON) on two 20 s, 51.2 kHz, 2-channel run-ups of one drive before
 * and after a change. Goal: under 6 s on this machine.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { performance } from 'node:perf_hooks';
import { synthesiseDrive, synthesiseTacho } from '../../seeds/synthetic-drive';
import { PROJECT_ROOT } from '../../server/config';
import { writeWav } from '../../workers/io/wav-writer';

export function runCompareBench(log: (line: string) => void): { bestS: number } {
  const FS = 51200;
  const T = 20;
  const rpm = (t: number) => 500 + (11500 * t) / T;
  const dir = mkdtempSync(path.join(tmpdir(), 'fanlight-compare-bench-'));
  try {
    const files = [
      { name: 'before.wav', shiftRpm: 6000, gain: 1 },
      { name: 'after.wav', shiftRpm: 7000, gain: 2 },
    ].map(({ name, shiftRpm, gain }) => {
      const vib = synthesiseDrive({
        fsHz: FS,
        durationS: T,
        rpm,
        polePairs: 4,
        carrierHz: (t) => (rpm(t) < shiftRpm ? 8000 : 12000),
        orders: [{ order: 8, amplitude: 0.05 }, { order: 48, amplitude: 0.03 }],
        families: [
          { m: 1, n: 1, amplitude: 0.02 * gain },
          { m: 1, n: -1, amplitude: 0.02 },
          { m: 2, n: 0, amplitude: 0.008 },
        ],
        noiseRms: 0.002,
        seed: gain,
      });
      const file = path.join(dir, name);
      writeFileSync(file, writeWav([vib, synthesiseTacho(FS, T, rpm, 60)], { sampleRateHz: FS, bits: 24 }));
      return file;
    });
    const times: number[] = [];
    for (let i = 0; i < 3; i++) {
      const t0 = performance.now();
      execFileSync(process.execPath, ['server/cli/analyze-launch.mjs', 'compare', ...files, '--channel', '0', '--tacho', '1', '--ppr', '60', '--orders', '8,48'], {
        cwd: PROJECT_ROOT,
        stdio: ['ignore', 'ignore', 'inherit'],
      });
      times.push((performance.now() - t0) / 1000);
    }
    const bestS = Math.min(...times);
    log(`analyze compare of two 20 s, 51.2 kHz, 2-channel run-ups (whole process): best ${bestS.toFixed(2)} s of 3`);
    return { bestS };
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
