/**
 * The demo's recordings, synthesised deterministically for the invented scenario: the Corvale Drives
 * CA-7 e-axle (4 pole pairs, 48 stator slots, silicon-carbide inverter) on a dynamometer. Every level
 * is invented, chosen to look like what such a drive shows. `npm start` writes them into .data/ once.
 */
import { existsSync, mkdirSync, readFileSync, renameSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import type { Quantity } from '../workers/io/channel-setup';
import { writeWav } from '../workers/io/wav-writer';
import { synthesiseDrive, synthesiseTacho, type DriveSignalOptions } from './synthetic-drive';

export interface DemoChannel {
  name: string;
  quantity: Quantity;
  unit: string;
  /** Units per full scale of the file */
  factor: number;
}

export interface DemoRecording {
  file: string;
  title: string;
  description: string;
  channels: DemoChannel[];
  /** The demo recording this one is the changed run of (the Bench offers the comparison in one click) */
  comparesWith?: string;
}

const FS = 51200;
const POLE_PAIRS = 4;
const VERSION = 2;

const ACC_FULL_SCALE_G = 10;
const MIC_FULL_SCALE_PA = 2;

const channels: DemoChannel[] = [
  { name: 'acc inverter housing', quantity: 'acceleration', unit: 'g', factor: ACC_FULL_SCALE_G },
  { name: 'mic 1 m', quantity: 'sound-pressure', unit: 'Pa', factor: MIC_FULL_SCALE_PA },
  { name: 'tacho 60 ppr', quantity: 'tacho', unit: 'V', factor: 1 },
];

export const demoRecordings: DemoRecording[] = [
  {
    file: 'ca7-run-up-30s.wav',
    title: 'CA-7 run-up, 500 → 12 000 rpm in 30 s',
    description:
      'Full-load run-up. Accelerometer on the inverter housing (±10 g full scale), microphone at 1 m (±2 Pa), ' +
      '60-pulse tacho. Carrier 8 kHz, switching to 12 kHz at 6000 rpm.',
    channels,
  },
  {
    file: 'ca7-run-up-30s-firmware-b.wav',
    title: 'CA-7 run-up after the firmware change, 500 → 12 000 rpm in 30 s',
    description:
      'The same run-up with inverter firmware B: a new carrier schedule, 10 kHz switching to 12 kHz at 7000 rpm, ' +
      'and a modulation that lowers the first sidebands (fc ± fe). Same sensors; compare it with the first run-up.',
    channels,
    comparesWith: 'ca7-run-up-30s.wav',
  },
  {
    file: 'ca7-coast-down-spread-carrier.wav',
    title: 'CA-7 coast-down with a spread carrier, 9000 → 1000 rpm in 20 s',
    description:
      'Coast-down with the inverter in its spread-spectrum mode: the 10 kHz carrier swept over ±600 Hz. Same sensors.',
    channels,
  },
];

/** Sideband levels grow with the modulation index, i.e. with speed (common practice). */
const withSpeed = (base: number, maxRpm: number) => (rpm: number) => base * (0.35 + 0.65 * Math.min(1, rpm / maxRpm));

/** How a firmware changes the carrier families: a gain per family, 1 where it leaves one alone. */
type FamilyGains = (m: number, n: number) => number;
const unchanged: FamilyGains = () => 1;

function drive(rpm: (t: number) => number, durationS: number, carrierHz: (t: number) => number, spread?: DriveSignalOptions['spread'], gains: FamilyGains = unchanged) {
  const common = { fsHz: FS, durationS, rpm, polePairs: POLE_PAIRS, carrierHz, spread };
  const scaled = (fs: { m: number; n: number; amplitude: number | ((rpm: number) => number) }[]) =>
    fs.map((f) => {
      const g = gains(f.m, f.n);
      const a = f.amplitude;
      return { ...f, amplitude: typeof a === 'number' ? a * g : (r: number) => a(r) * g };
    });
  // Accelerometer, g: orders 8 (pole-pair order ×2), 16, 48 (slot order); force-driven carrier
  // families m + n even: fc ± fe, fc ± 3fe, 2fc, 2fc ± 2fe.
  const acc = synthesiseDrive({
    ...common,
    orders: [
      { order: 8, amplitude: withSpeed(0.06, 12000) },
      { order: 16, amplitude: 0.025 },
      { order: 48, amplitude: withSpeed(0.09, 12000) },
    ],
    families: scaled([
      { m: 1, n: 1, amplitude: withSpeed(0.18, 12000) },
      { m: 1, n: -1, amplitude: withSpeed(0.16, 12000) },
      { m: 1, n: 3, amplitude: withSpeed(0.06, 12000) },
      { m: 1, n: -3, amplitude: withSpeed(0.055, 12000) },
      { m: 2, n: 0, amplitude: 0.05 },
      { m: 2, n: 2, amplitude: withSpeed(0.035, 12000) },
      { m: 2, n: -2, amplitude: withSpeed(0.03, 12000) },
    ]),
    noiseRms: 0.012,
    seed: 101,
  });
  // Microphone, Pa: the same sources, radiated
  const mic = synthesiseDrive({
    ...common,
    orders: [
      { order: 8, amplitude: withSpeed(0.012, 12000) },
      { order: 48, amplitude: withSpeed(0.03, 12000) },
    ],
    families: scaled([
      { m: 1, n: 1, amplitude: withSpeed(0.025, 12000) },
      { m: 1, n: -1, amplitude: withSpeed(0.022, 12000) },
      { m: 1, n: 3, amplitude: withSpeed(0.008, 12000) },
      { m: 1, n: -3, amplitude: withSpeed(0.007, 12000) },
      { m: 2, n: 0, amplitude: 0.004 },
    ]),
    noiseRms: 0.004,
    seed: 202,
  });
  const tacho = synthesiseTacho(FS, durationS, rpm, 60);
  for (let i = 0; i < acc.length; i++) {
    acc[i] /= ACC_FULL_SCALE_G;
    mic[i] /= MIC_FULL_SCALE_PA;
    tacho[i] *= 0.8;
  }
  return writeWav([acc, mic, tacho], { sampleRateHz: FS, bits: 24 });
}

function synthesise(r: DemoRecording): Uint8Array {
  if (r.file === 'ca7-run-up-30s.wav') {
    const rpm = (t: number) => 500 + (11500 * t) / 30;
    return drive(rpm, 30, (t) => (rpm(t) < 6000 ? 8000 : 12000));
  }
  if (r.file === 'ca7-run-up-30s-firmware-b.wav') {
    const rpm = (t: number) => 500 + (11500 * t) / 30;
    // firmware B: fc ± fe 5 dB lower, fc ± 3fe 2 dB higher (invented for the demo)
    const firmwareB: FamilyGains = (m, n) => (m === 1 && Math.abs(n) === 1 ? 10 ** (-5 / 20) : m === 1 && Math.abs(n) === 3 ? 10 ** (2 / 20) : 1);
    return drive(rpm, 30, (t) => (rpm(t) < 7000 ? 10000 : 12000), undefined, firmwareB);
  }
  const rpm = (t: number) => 9000 - (8000 * t) / 20;
  return drive(rpm, 20, () => 10000, { widthHz: 1200, rateHz: 150 });
}

/** Writes the demo recordings into `dir` unless this version is there already; returns their paths. */
export function ensureDemoRecordings(dir: string): string[] {
  mkdirSync(dir, { recursive: true });
  const manifest = path.join(dir, 'manifest.json');
  const current = existsSync(manifest) ? (JSON.parse(readFileSync(manifest, 'utf8')) as { version?: number }).version : undefined;
  const files = demoRecordings.map((r) => path.join(dir, r.file));
  if (current === VERSION && files.every((f) => existsSync(f))) return files;
  for (const r of demoRecordings) {
    const file = path.join(dir, r.file);
    writeFileSync(`${file}.tmp`, synthesise(r));
    renameSync(`${file}.tmp`, file);
  }
  writeFileSync(manifest, JSON.stringify({ version: VERSION, recordings: demoRecordings }, null, 2));
  return files;
}
