/**
 * The batch map as a user runs it, whole process against an engineer's scipy script doing the same job:
 * `npm run -s analyze -- map FILE --channel 0 --block 8192 --overlap 0.75 --window hann --out X.npy` on a
 * 600 s, 51.2 kHz float32 WAV channel, and tests/bench/scipy_map_script.py (numpy memmap read, framing,
 * Hann, scipy.fft.rfft on 2 workers, dB, numpy.save) under /usr/bin/python3 with Debian's python3-scipy.
 * Each timed from spawn to exit, runs alternating, best of REPEATS. Also timed: our CLI started with node
 * directly (no npm), to show what npm's own start adds. Goal: ours at least 2× faster than the script.
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { performance } from 'node:perf_hooks';
import { PROJECT_ROOT } from '../../server/config';
import { writeWav } from '../../workers/io/wav-writer';

const FS = 51200;
const SECONDS = 600;
const REPEATS = 5;
const SCRIPT = path.join(PROJECT_ROOT, 'tests/bench/scipy_map_script.py');
const MAP_ARGS = ['--channel', '0', '--block', '8192', '--overlap', '0.75', '--window', 'hann'];

/** A tone sweeping 500 → 12 500 Hz in noise, as the map benchmark's signal. */
function signal(n: number): Float32Array {
  const x = new Float32Array(n);
  let s = 1;
  for (let i = 0; i < n; i++) {
    s = (s * 1664525 + 1013904223) >>> 0;
    x[i] = 0.5 * Math.sin((2 * Math.PI * (500 + 20 * (i / FS)) * i) / FS) + 0.1 * (s / 2 ** 32 - 0.5);
  }
  return x;
}

function timed(command: string, args: string[]): number {
  const t0 = performance.now();
  execFileSync(command, args, { cwd: PROJECT_ROOT, stdio: ['ignore', 'ignore', 'inherit'] });
  return (performance.now() - t0) / 1000;
}

export const scipyPresent = () => spawnSync('/usr/bin/python3', ['-c', 'import scipy.fft, scipy.signal'], { stdio: 'ignore' }).status === 0;

export function runBatchMapBench(log: (line: string) => void): { npmS: number; nodeS: number; scipyS?: number } {
  const dir = mkdtempSync(path.join(tmpdir(), 'fanlight-batch-map-bench-'));
  try {
    const wav = path.join(dir, 'sweep-600s.wav');
    writeFileSync(wav, writeWav([signal(SECONDS * FS)], { sampleRateHz: FS, bits: 32, float: true }));
    const ours = path.join(dir, 'ours.npy');
    const theirs = path.join(dir, 'scipy.npy');
    const npmRun = () => timed('npm', ['run', '-s', 'analyze', '--', 'map', wav, ...MAP_ARGS, '--out', ours]);
    const nodeRun = () => timed(process.execPath, ['server/cli/analyze-launch.mjs', 'map', wav, ...MAP_ARGS, '--out', ours]);
    const withScipy = scipyPresent();
    const scipyRun = () => timed('/usr/bin/python3', [SCRIPT, wav, '0', '8192', '0.75', theirs]);
    // warm-up: the CLI bundle (built if stale), the page cache, Python's byte code
    npmRun();
    if (withScipy) scipyRun();
    const times = { npm: [] as number[], node: [] as number[], scipy: [] as number[] };
    for (let r = 0; r < REPEATS; r++) {
      times.npm.push(npmRun());
      times.node.push(nodeRun());
      if (withScipy) times.scipy.push(scipyRun());
    }
    const best = (t: number[]) => Math.min(...t);
    const range = (t: number[]) => `best ${best(t).toFixed(2)} s (${t.map((v) => v.toFixed(2)).join(', ')})`;
    log(`analyze map of a ${SECONDS} s, 51.2 kHz float32 WAV channel, block 8192, 75 % overlap, Hann, .npy out, whole process:`);
    log(`  npm run -s analyze: ${range(times.npm)}`);
    log(`  node server/cli/analyze-launch.mjs (no npm): ${range(times.node)}`);
    if (!withScipy) {
      log('  scipy not found (apt-get install python3-scipy to compare): no ratio');
      return { npmS: best(times.npm), nodeS: best(times.node) };
    }
    log(`  scipy script (${path.relative(PROJECT_ROOT, SCRIPT)}): ${range(times.scipy)}`);
    log(`  ratio scipy / ours: ${(best(times.scipy) / best(times.npm)).toFixed(2)}× through npm, ${(best(times.scipy) / best(times.node)).toFixed(2)}× started with node`);
    return { npmS: best(times.npm), nodeS: best(times.node), scipyS: best(times.scipy) };
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
