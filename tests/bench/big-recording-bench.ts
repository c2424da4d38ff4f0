/**
 * A long, wide recording on the Bench: a 4 GB WAV of 32 channels, 24-bit at 51.2 kHz (about 13.5 min),
 * dropped from disk in headless Chromium. Measured: drop → first map columns painted, drop → whole map
 * painted (performance marks), and the peak memory of all of Chromium's processes (the sum of their
 * proportional set sizes, sampled every 250 ms). The file is made once by a script here (channel 1 a
 * synthesised run-up, the others scaled copies with noise) and kept in .data/bench-big.
 */
import { closeSync, existsSync, mkdirSync, openSync, readFileSync, readdirSync, renameSync, statSync, writeSync } from 'node:fs';
import path from 'node:path';
import { DATA_DIR } from '../../server/config';
import { synthesiseDrive } from '../../seeds/synthetic-drive';
import { encodeSamples, fmtChunkBody } from '../../workers/io/wav-writer';
import { openBenchApp, signedInPage } from './browser-bench';

const FS = 51200;
const CHANNELS = 32;
const BITS = 24;
const TARGET_BYTES = 4_000_000_000;

export interface BigRecordingResult {
  fileBytes: number;
  firstColumnsMs: number;
  wholeMapMs: number;
  peakChromiumGb: number;
}

function riffHeader(dataBytes: number): Uint8Array {
  const fmt = fmtChunkBody(CHANNELS, { sampleRateHz: FS, bits: BITS });
  const out = new Uint8Array(12 + 8 + fmt.byteLength + 8);
  const dv = new DataView(out.buffer);
  out.set([0x52, 0x49, 0x46, 0x46], 0); // RIFF
  dv.setUint32(4, out.byteLength - 8 + dataBytes, true);
  out.set([0x57, 0x41, 0x56, 0x45, 0x66, 0x6d, 0x74, 0x20], 8); // WAVEfmt␠
  dv.setUint32(16, fmt.byteLength, true);
  out.set(fmt, 20);
  out.set([0x64, 0x61, 0x74, 0x61], 20 + fmt.byteLength); // data
  dv.setUint32(24 + fmt.byteLength, dataBytes, true);
  return out;
}

/** Writes the file block by block (never all of it in memory); returns its path. */
export function ensureBigRecording(log: (line: string) => void): string {
  const dir = path.join(DATA_DIR, 'bench-big');
  const file = path.join(dir, `drive-${CHANNELS}ch-${BITS}bit.wav`);
  const frameBytes = CHANNELS * (BITS / 8);
  const frames = Math.floor((TARGET_BYTES - 100) / frameBytes);
  const dataBytes = frames * frameBytes;
  const header = riffHeader(dataBytes);
  if (existsSync(file) && statSync(file).size === header.byteLength + dataBytes) return file;
  mkdirSync(dir, { recursive: true });
  const t0 = performance.now();
  const durationS = frames / FS;
  const drive = synthesiseDrive({
    fsHz: FS,
    durationS,
    rpm: (t) => 600 + (11_400 * t) / durationS,
    polePairs: 4,
    carrierHz: () => 10_000,
    orders: [{ order: 8, amplitude: 0.05 }, { order: 24, amplitude: 0.02 }],
    families: [{ m: 1, n: 1, amplitude: 0.02 }, { m: 1, n: -1, amplitude: 0.02 }, { m: 2, n: 1, amplitude: 0.01 }],
    noiseRms: 0.002,
    seed: 7,
  });
  const partial = `${file}.partial`;
  const fd = openSync(partial, 'w');
  try {
    writeSync(fd, header);
    const block = 262_144;
    const chans = Array.from({ length: CHANNELS }, () => new Float32Array(block));
    let seed = 12345;
    for (let start = 0; start < frames; start += block) {
      const n = Math.min(block, frames - start);
      for (let c = 0; c < CHANNELS; c++) {
        const gain = 1 / (1 + 0.15 * c);
        const dst = chans[c];
        for (let i = 0; i < n; i++) {
          seed = (seed * 1103515245 + 12345) >>> 0;
          dst[i] = gain * drive[start + i] + ((seed / 4294967296) - 0.5) * 0.004;
        }
      }
      writeSync(fd, encodeSamples(chans, { sampleRateHz: FS, bits: BITS }, 0, n));
    }
  } finally {
    closeSync(fd);
  }
  renameSync(partial, file);
  log(`made ${file} (${(statSync(file).size / 1e9).toFixed(2)} GB, ${CHANNELS} channels, ${durationS.toFixed(0)} s) in ${((performance.now() - t0) / 1000).toFixed(0)} s`);
  return file;
}

/** The process and all of its descendants, from /proc. */
function processTree(root: number): number[] {
  const children = new Map<number, number[]>();
  for (const name of readdirSync('/proc')) {
    if (!/^\d+$/.test(name)) continue;
    try {
      const stat = readFileSync(`/proc/${name}/stat`, 'utf8');
      const ppid = Number(stat.slice(stat.lastIndexOf(')') + 2).split(' ')[1]);
      const list = children.get(ppid) ?? [];
      list.push(Number(name));
      children.set(ppid, list);
    } catch {
      // gone meanwhile
    }
  }
  const out: number[] = [];
  const walk = (pid: number) => {
    out.push(pid);
    for (const c of children.get(pid) ?? []) walk(c);
  };
  walk(root);
  return out;
}

/** Sum of the proportional set sizes (shared pages split between sharers), in bytes. */
function pssBytes(pids: number[]): number {
  let kb = 0;
  for (const pid of pids) {
    try {
      const m = readFileSync(`/proc/${pid}/smaps_rollup`, 'utf8').match(/^Pss:\s+(\d+) kB/m);
      if (m) kb += Number(m[1]);
    } catch {
      // gone meanwhile
    }
  }
  return kb * 1024;
}

export async function runBigRecordingBench(log: (line: string) => void): Promise<BigRecordingResult> {
  const file = ensureBigRecording(log);
  const app = await openBenchApp();
  try {
    const page = await signedInPage(app, { width: 1920, height: 1080 });
    await page.goto(`${app.baseUrl}/bench`);
    let peak = 0;
    const sampler = setInterval(() => {
      // Chromium's processes among this one's descendants (MariaDB is one too, and is left out)
      const chromiumPids = processTree(process.pid).filter((pid) => {
        try {
          return readFileSync(`/proc/${pid}/cmdline`, 'utf8').includes('chromium');
        } catch {
          return false;
        }
      });
      peak = Math.max(peak, pssBytes(chromiumPids));
    }, 250);
    try {
      await page.evaluate(() => performance.clearMarks());
      // a path, not a buffer: the browser reads the file from disk as it would a dropped one
      await page.getByTestId('drop-zone-input').setInputFiles(file);
      await page.waitForFunction(() => performance.getEntriesByName('fanlight:map-painted').length > 0, null, { timeout: 300_000 });
      // a moment more for what follows the map (findings, speed map) to show in the memory figure
      await page.waitForTimeout(3000);
    } finally {
      clearInterval(sampler);
    }
    // no named functions inside: the page does not have the helpers the TypeScript loader adds to them
    const marks = await page.evaluate(() => {
      const t = ['fanlight:drop', 'fanlight:map-first-painted', 'fanlight:map-painted'].map((n) => performance.getEntriesByName(n).at(0)?.startTime ?? NaN);
      return { first: t[1] - t[0], whole: t[2] - t[0] };
    });
    const steps = await page.evaluate(() =>
      ['fanlight:decoded', 'fanlight:stored', 'fanlight:channels-read', 'fanlight:map-start', 'fanlight:map-first-chunk', 'fanlight:map-computed']
        .map((n) => `${n.slice(9)} ${((performance.getEntriesByName(n).at(0)?.startTime ?? NaN) - (performance.getEntriesByName('fanlight:drop').at(0)?.startTime ?? NaN)).toFixed(0)}`)
        .join(', '),
    );
    log(`  steps after the drop (ms): ${steps}`);
    const result = { fileBytes: statSync(file).size, firstColumnsMs: marks.first, wholeMapMs: marks.whole, peakChromiumGb: peak / 1e9 };
    log(
      `a ${(result.fileBytes / 1e9).toFixed(2)} GB WAV of ${CHANNELS} channels (24-bit, 51.2 kHz): first map columns ${result.firstColumnsMs.toFixed(0)} ms after the drop, ` +
        `whole map ${result.wholeMapMs.toFixed(0)} ms; Chromium at most ${result.peakChromiumGb.toFixed(2)} GB (all processes, PSS)`,
    );
    return result;
  } finally {
    await app.stop();
  }
}

if (import.meta.url === `file://${process.argv[1]}`) {
  await runBigRecordingBench((line) => console.log(`  ${line}`));
}
