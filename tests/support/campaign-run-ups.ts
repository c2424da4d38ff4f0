/**
 * Short inverter run-ups for campaign tests and the campaign bench: the line-to-line voltage of a
 * naturally sampled sine-triangle PWM inverter (workers/dsp/pwm-simulation.ts) whose fundamental follows
 * a speed ramp, with a speed channel of 1 V per 1000 rpm, written as 2-channel float WAVs. Each file's
 * carrier is known by construction, so a campaign's results can be checked file by file.
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { simulateTwoLevelPwm } from '../../workers/dsp/pwm-simulation';
import { writeWav } from '../../workers/io/wav-writer';

export const RUN_UP_FS = 25_600;
export const RUN_UP_POLE_PAIRS = 4;

/** The preset that reads these files (the inverter command's options as PRESET.json holds them). */
export const RUN_UP_PRESET = { channel: 0, speedChannel: 1, speedCal: 1000, quantity: 'voltage', polePairs: RUN_UP_POLE_PAIRS, block: 2048 };

export function writeRunUp(file: string, carrierHz: number, durationS = 4): void {
  const rpm = (t: number) => 600 + (2400 * t) / durationS; // 600 → 3000 rpm
  const { vab } = simulateTwoLevelPwm({
    fsHz: RUN_UP_FS,
    durationS,
    carrierHz,
    fundamentalHz: (t) => (RUN_UP_POLE_PAIRS * rpm(t)) / 60,
    modulationIndex: 0.8,
    vdc: 400,
    oversample: 8,
  });
  const speed = Float32Array.from({ length: vab.length }, (_, i) => rpm(i / RUN_UP_FS) / 1000);
  mkdirSync(path.dirname(file), { recursive: true });
  writeFileSync(file, writeWav([vab, speed], { sampleRateHz: RUN_UP_FS, bits: 32, float: true }));
}

/** The median of a carrier track's finite values (Hz). */
export function medianCarrier(hz: (number | null)[]): number {
  const v = hz.filter((h): h is number => h !== null && Number.isFinite(h)).sort((a, b) => a - b);
  return v[v.length >> 1];
}
