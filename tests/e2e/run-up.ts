/**
 * The run-up the Bench's browser tests open: 1000 → 9000 rpm, 4 pole pairs, carrier 8 kHz stepping to
 * 10 kHz at 5000 rpm, orders 8 and 48, carrier families, and a 60-pulse tacho (invented test data).
 */
import { synthesiseDrive, synthesiseTacho, type FamilyComponent } from '../../seeds/synthetic-drive';
import { writeWav } from '../../workers/io/wav-writer';

export const FS_HZ = 51200;

export function runUpTimeline(durationS: number) {
  const rpmAt = (t: number) => 1000 + (8000 * t) / durationS;
  return {
    rpmAt,
    carrierAt: (t: number) => (rpmAt(t) < 5000 ? 8000 : 10000),
    shiftS: ((5000 - 1000) / 8000) * durationS,
  };
}

export function runUpWav(durationS: number, families: FamilyComponent[], seed: number): Uint8Array {
  const { rpmAt, carrierAt } = runUpTimeline(durationS);
  const vibration = synthesiseDrive({
    fsHz: FS_HZ,
    durationS,
    rpm: rpmAt,
    polePairs: 4,
    carrierHz: carrierAt,
    orders: [
      { order: 8, amplitude: 0.05 },
      { order: 48, amplitude: 0.03 },
    ],
    families,
    noiseRms: 0.002,
    seed,
  });
  const tacho = synthesiseTacho(FS_HZ, durationS, rpmAt, 60).map((v) => 0.9 * v);
  return writeWav([vibration, tacho], { sampleRateHz: FS_HZ, bits: 24 });
}
