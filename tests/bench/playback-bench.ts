/**
 * Listening (workers/dsp/playback-filter.ts): a 20 s run-up at 51.2 kHz processed in playback blocks, with
 * 3 ticked lines (two carrier families and an order, far apart) and with 4 (an order crossing a family,
 * so a coupled solve near the crossing), at the narrowest (5 Hz, the longest padding) and the default
 * (10 Hz) bandwidths. Measures the time to process the first block (the time to first sound: target
 * < 0.5 s), at the run's start and in mid-run (padding both sides), and the real-time factor (seconds of
 * audio per second of compute over the whole run: target > 1.5). Best of 3, one thread.
 */
import { synthesiseDrive } from '../../seeds/synthetic-drive';
import { filterBlock, PLAYBACK_BLOCK_S, type PlaybackLine } from '../../workers/dsp/playback-filter';
import { frameTimeS, stftLayout } from '../../workers/dsp/stft';

export interface PlaybackBenchResult {
  /** Worst over the cases of the best first-block time, s */
  firstBlockS: number;
  /** Worst over the cases of the best real-time factor */
  realTimeFactor: number;
}

export function runPlaybackBench(log: (line: string) => void): PlaybackBenchResult {
  const FS = 51_200;
  const T = 20;
  const P = 4;
  const rpm = (t: number) => 1000 + 200 * t; // 1000 → 5000 rpm
  const x = synthesiseDrive({
    fsHz: FS,
    durationS: T,
    rpm,
    polePairs: P,
    carrierHz: () => 8000,
    orders: [{ order: 8, amplitude: 0.05 }, { order: 96, amplitude: 0.02 }],
    families: [{ m: 1, n: -2, amplitude: 0.02 }, { m: 1, n: 2, amplitude: 0.02 }, { m: 1, n: -3, amplitude: 0.01 }],
    noiseRms: 0.002,
    seed: 11,
  });
  const layout = stftLayout(x.length, FS, { blockSize: 8192, overlap: 0.75, window: 'hann' });
  const ctx = {
    rpm: Float64Array.from({ length: layout.frames }, (_, f) => rpm(frameTimeS(layout, f))),
    carrierHz: new Float64Array(layout.frames).fill(8000),
    polePairs: P,
  };
  const family = (m: number, n: number): PlaybackLine => ({ guide: { kind: 'family', m, n, per: 'electrical' }, ctx });
  const order = (k: number): PlaybackLine => ({ guide: { kind: 'order', order: k }, ctx });
  const cases = [
    { name: '3 lines (fc−2fe, fc+2fe, 8·fr)', lines: [family(1, -2), family(1, 2), order(8)] },
    // 96·fr crosses fc − 3fe at 4444 rpm (t = 17.2 s)
    { name: '4 lines, a crossing (fc−3fe, fc+2fe, 96·fr, 8·fr)', lines: [family(1, -3), family(1, 2), order(96), order(8)] },
  ];
  const step = Math.round(PLAYBACK_BLOCK_S * FS);
  let firstBlockS = 0;
  let realTimeFactor = Infinity;
  for (const c of cases) {
    for (const bandwidthHz of [5, 10]) {
      const opts = { bandwidthHz, processing: 'remove' as const };
      const time = (from: number, to: number) => {
        const t0 = performance.now();
        filterBlock(x, FS, c.lines, layout, from, to, opts);
        return (performance.now() - t0) / 1000;
      };
      const start: number[] = [];
      const mid: number[] = [];
      const whole: number[] = [];
      for (let r = 0; r < 3; r++) {
        start.push(time(0, step));
        const m = Math.round((17.2 * FS) / step) * step; // at the crossing, for the 4-line case
        mid.push(time(m, m + step));
        let s = 0;
        for (let a = 0; a < x.length; a += step) s += time(a, Math.min(x.length, a + step));
        whole.push(s);
      }
      const first = Math.max(Math.min(...start), Math.min(...mid));
      const rtf = T / Math.min(...whole);
      firstBlockS = Math.max(firstBlockS, first);
      realTimeFactor = Math.min(realTimeFactor, rtf);
      log(
        `${c.name}, B ${bandwidthHz} Hz, ${PLAYBACK_BLOCK_S} s blocks: first block ${(Math.min(...start) * 1000).toFixed(0)} ms at the start, ` +
          `${(Math.min(...mid) * 1000).toFixed(0)} ms in mid-run; whole run ${Math.min(...whole).toFixed(2)} s for ${T} s of audio, ${rtf.toFixed(1)}× real time`,
      );
    }
  }
  return { firstBlockS, realTimeFactor };
}

if (import.meta.url === `file://${process.argv[1]}`) runPlaybackBench((l) => console.log(`  ${l}`));
