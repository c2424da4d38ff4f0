/**
 * Map throughput: a Hann map of 60 s and 600 s of one 51.2 kHz channel, block 8192, 75 % overlap, on
 * the CLI's worker threads (one per core), and — where /usr/bin/python3 has scipy (Debian's
 * python3-scipy) — scipy on the same samples in the same run: scipy.fft.rfft batched in float32 over
 * the windowed frames, and the whole map (framing, window, rfft, power).
 */
import { execFileSync } from 'node:child_process';
import { existsSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { performance } from 'node:perf_hooks';
import { fileURLToPath } from 'node:url';
import { MapThreadPool } from '../../server/cli/thread-pool';

const FS = 51200;
const BLOCK = 8192;
const HOP = BLOCK / 4;

/** The channel in shared memory, where the CLI decodes a recording (recording-input.ts), so the pool copies nothing. */
function signal(seconds: number): Float32Array {
  const n = seconds * FS;
  const x = new Float32Array(new SharedArrayBuffer(n * 4));
  let s = 1;
  for (let i = 0; i < n; i++) {
    s = (s * 1664525 + 1013904223) >>> 0;
    x[i] = 0.5 * Math.sin((2 * Math.PI * (500 + 20 * (i / FS)) * i) / FS) + 0.1 * (s / 2 ** 32 - 0.5);
  }
  return x;
}

function scipyTimes(file: string, repeats: number): { rfftS: number; mapS: number; scipy: string } | null {
  if (!existsSync('/usr/bin/python3')) return null;
  const script = path.join(path.dirname(fileURLToPath(import.meta.url)), 'scipy_map_bench.py');
  try {
    const out = execFileSync('/usr/bin/python3', [script, file, String(FS), String(BLOCK), String(HOP), String(repeats)], { encoding: 'utf8' });
    return JSON.parse(out);
  } catch {
    return null; // no scipy here
  }
}

export async function runMapBench(log: (line: string) => void): Promise<Record<string, number>> {
  const pool = new MapThreadPool();
  const dir = mkdtempSync(path.join(tmpdir(), 'fanlight-map-bench-'));
  const figures: Record<string, number> = {};
  try {
    for (const [seconds, repeats] of [
      [60, 15],
      [600, 3],
    ] as const) {
      const x = signal(seconds);
      await pool.map(x.subarray(0, FS * 10), FS, { blockSize: BLOCK, overlap: 0.75, window: 'hann' }); // warm-up
      let best = Infinity;
      let frames = 0;
      for (let r = 0; r < repeats; r++) {
        const t0 = performance.now();
        const m = await pool.map(x, FS, { blockSize: BLOCK, overlap: 0.75, window: 'hann' });
        best = Math.min(best, (performance.now() - t0) / 1000);
        frames = m.layout.frames;
      }
      figures[`fanlight${seconds}S`] = best;
      let line = `map ${seconds} s × 51.2 kHz, block 8192, 75 % overlap (${frames} frames): Fanlight ${(best * 1000).toFixed(0)} ms on ${pool.size} threads (${((seconds * FS) / best / 1e6).toFixed(1)} M samples/s)`;
      const file = path.join(dir, `x${seconds}.f32`);
      writeFileSync(file, new Uint8Array(x.buffer));
      const sp = scipyTimes(file, repeats);
      if (sp) {
        figures[`scipyRfft${seconds}S`] = sp.rfftS;
        figures[`scipyMap${seconds}S`] = sp.mapS;
        line += `; scipy ${sp.scipy}: rfft alone ${(sp.rfftS * 1000).toFixed(0)} ms (${(sp.rfftS / best).toFixed(2)}×), whole map ${(sp.mapS * 1000).toFixed(0)} ms (${(sp.mapS / best).toFixed(2)}×)`;
      } else line += '; scipy not found (apt-get install python3-scipy to compare)';
      log(line);
    }
  } finally {
    await pool.close();
    rmSync(dir, { recursive: true, force: true });
  }
  return figures;
}
