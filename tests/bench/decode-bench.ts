/**
 * Decode throughput and memory of the streaming readers (the same workers/io code the browser's
 * decode worker runs), reading real files from disk:
 * - a 60 s, 4-channel, 24-bit, 51.2 kHz WAV (about 37 MB): all channels, best of 7 runs;
 * - a 2 GB WAV: one channel asked for, with the peak resident memory above the baseline.
 * `FANLIGHT_BENCH_QUICK=1` skips the 2 GB file.
 */
import { closeSync, mkdtempSync, openSync, rmSync, writeSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { performance } from 'node:perf_hooks';
import { openFileSource } from '../../server/cli/node-file-source';
import { decodeRecording } from '../../workers/io/decode-recording';
import { encodeSamples, fmtChunkBody } from '../../workers/io/wav-writer';

const FS = 51200;
const CHANNELS = 4;
const BITS = 24;

/** Writes a WAV of `frames` frames of noisy sines, block by block (never the whole file in memory). */
function writeBigWav(file: string, frames: number): number {
  const opts = { sampleRateHz: FS, bits: BITS as 24 };
  const blockAlign = (CHANNELS * BITS) / 8;
  const dataBytes = frames * blockAlign;
  const fmt = fmtChunkBody(CHANNELS, opts);
  const head = new Uint8Array(12 + 8 + fmt.byteLength + 8);
  const dv = new DataView(head.buffer);
  head.set([0x52, 0x49, 0x46, 0x46]);
  dv.setUint32(4, 4 + 8 + fmt.byteLength + 8 + dataBytes, true);
  head.set([0x57, 0x41, 0x56, 0x45, 0x66, 0x6d, 0x74, 0x20], 8);
  dv.setUint32(16, fmt.byteLength, true);
  head.set(fmt, 20);
  head.set([0x64, 0x61, 0x74, 0x61], 20 + fmt.byteLength);
  dv.setUint32(24 + fmt.byteLength, dataBytes, true);
  const fd = openSync(file, 'w');
  writeSync(fd, head);
  const block = 1 << 18;
  const chs = Array.from({ length: CHANNELS }, (_, c) =>
    Float32Array.from({ length: block }, (_, i) => 0.3 * Math.sin((2 * Math.PI * 1000 * (c + 1) * i) / FS) + 0.05 * (Math.random() - 0.5)),
  );
  const encoded = encodeSamples(chs, opts);
  for (let done = 0; done < frames; done += block) {
    const n = Math.min(block, frames - done);
    writeSync(fd, n === block ? encoded : encoded.subarray(0, n * blockAlign));
  }
  closeSync(fd);
  return head.byteLength + dataBytes;
}

async function decodeFile(file: string, channels?: number[]) {
  const source = await openFileSource(file);
  try {
    return await decodeRecording(source, { channels });
  } finally {
    await source.close();
  }
}

export interface DecodeBenchResult {
  smallMB: number;
  smallBestS: number;
  smallMBps: number;
  bigMB?: number;
  bigS?: number;
  bigDecodedMB?: number;
  bigPeakAboveBaselineMB?: number;
  bigPeakRatio?: number;
}

export async function runDecodeBench(log: (line: string) => void): Promise<DecodeBenchResult> {
  const dir = mkdtempSync(path.join(tmpdir(), 'fanlight-bench-'));
  try {
    const small = path.join(dir, 'runup-60s.wav');
    const smallBytes = writeBigWav(small, 60 * FS);
    await decodeFile(small); // warm-up (JIT)
    const times: number[] = [];
    for (let i = 0; i < 7; i++) {
      const t0 = performance.now();
      const r = await decodeFile(small);
      times.push((performance.now() - t0) / 1000);
      if (r.samples.length !== CHANNELS) throw new Error('decode lost channels');
    }
    const best = Math.min(...times);
    const result: DecodeBenchResult = { smallMB: smallBytes / 1e6, smallBestS: best, smallMBps: smallBytes / 1e6 / best };
    log(`decode 60 s × 4 ch × 24-bit × 51.2 kHz WAV (${result.smallMB.toFixed(1)} MB): best ${(best * 1000).toFixed(0)} ms of 7 (${result.smallMBps.toFixed(0)} MB/s)`);

    if (process.env.FANLIGHT_BENCH_QUICK) return result;
    const big = path.join(dir, 'long-2GB.wav');
    const frames = Math.floor(2e9 / ((CHANNELS * BITS) / 8));
    const bigBytes = writeBigWav(big, frames);
    global.gc?.();
    const baseline = process.memoryUsage().rss;
    let peak = baseline;
    const timer = setInterval(() => (peak = Math.max(peak, process.memoryUsage().rss)), 5);
    const t0 = performance.now();
    const r = await decodeFile(big, [1]);
    const seconds = (performance.now() - t0) / 1000;
    peak = Math.max(peak, process.memoryUsage().rss);
    clearInterval(timer);
    const decodedMB = r.samples[0].byteLength / 1e6;
    Object.assign(result, {
      bigMB: bigBytes / 1e6,
      bigS: seconds,
      bigDecodedMB: decodedMB,
      bigPeakAboveBaselineMB: (peak - baseline) / 1e6,
      bigPeakRatio: (peak - baseline) / 1e6 / decodedMB,
    });
    log(
      `stream 2 GB WAV (${result.bigMB!.toFixed(0)} MB), 1 of 4 channels: ${seconds.toFixed(2)} s (${(result.bigMB! / seconds).toFixed(0)} MB/s), ` +
        `decoded ${decodedMB.toFixed(0)} MB, peak memory ${result.bigPeakAboveBaselineMB!.toFixed(0)} MB above baseline = ${result.bigPeakRatio!.toFixed(2)}× the decoded size`,
    );
    return result;
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
