/**
 * ECMA-418-2 hearing-model tonality (workers/dsp/hearing-model): a 20 s run-up at 51.2 kHz (the
 * synthetic drive: orders, carrier families, noise) through hearingModelTonality in one thread.
 * Target: under 20 s (issue #16's brief: 10–20 s in Node). Best of 2.
 */
import { synthesiseDrive } from '../../seeds/synthetic-drive';
import { hearingModelTonality } from '../../workers/dsp/hearing-model/tonality';

export function runHearingModelBench(log: (line: string) => void): { bestS: number } {
  const FS = 51_200;
  const x = synthesiseDrive({
    fsHz: FS,
    durationS: 20,
    rpm: (t) => 1000 + 200 * t,
    polePairs: 4,
    carrierHz: () => 8000,
    orders: [{ order: 8, amplitude: 0.05 }, { order: 96, amplitude: 0.02 }],
    families: [{ m: 1, n: -2, amplitude: 0.02 }, { m: 1, n: 2, amplitude: 0.02 }],
    noiseRms: 0.002,
    seed: 11,
  });
  let bestS = Infinity;
  for (let run = 0; run < 2; run++) {
    const t0 = performance.now();
    const r = hearingModelTonality(x, FS);
    const s = (performance.now() - t0) / 1000;
    bestS = Math.min(bestS, s);
    log(`tonality of 20 s at 51.2 kHz: ${s.toFixed(2)} s (average ${r.averageTu.toFixed(2)} tu_HMS at ${r.averageTonalHz.toFixed(0)} Hz)`);
  }
  return { bestS };
}
