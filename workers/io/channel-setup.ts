/**
 * What each channel measures and how its file values become engineering units. Pure: the Bench, the
 * server's schema and the batch CLI share it.
 */
import type { ChannelInfo } from './recording';

export const quantities = ['acceleration', 'velocity', 'sound-pressure', 'voltage', 'speed', 'tacho', 'other'] as const;
export type Quantity = (typeof quantities)[number];

export const defaultUnit: Record<Quantity, string> = {
  acceleration: 'm/s²',
  velocity: 'mm/s',
  'sound-pressure': 'Pa',
  voltage: 'V',
  speed: 'rpm',
  tacho: 'V',
  other: '',
};

/**
 * Either a transducer sensitivity (mV per unit, e.g. 100 mV/g, 50 mV/Pa) with the input range of the
 * acquisition channel in volts (the voltage that reads as full scale), or a plain factor (units per
 * full scale for WAV, or a multiplier of the file's values for CSV).
 */
export type Calibration =
  | { kind: 'sensitivity'; sensitivityMvPerUnit: number; inputRangeV: number }
  | { kind: 'scale'; factor: number };

export interface ChannelSetup {
  index: number;
  name: string;
  quantity: Quantity;
  unit: string;
  calibration: Calibration;
}

/**
 * Engineering units per file unit. Sensitivity: a full-scale sample (1.0) is inputRangeV volts, and
 * sensitivity S mV/unit gives units = V·1000 / S (the usual transducer chain, common practice).
 */
export function unitsPerFileUnit(c: Calibration): number {
  if (c.kind === 'scale') return c.factor;
  return (c.inputRangeV * 1000) / c.sensitivityMvPerUnit;
}

export function calibrationProblem(c: Calibration): string | null {
  if (c.kind === 'scale') return Number.isFinite(c.factor) && c.factor !== 0 ? null : 'The factor must be a number other than 0.';
  if (!(c.sensitivityMvPerUnit > 0)) return 'The sensitivity must be above 0 mV per unit.';
  if (!(c.inputRangeV > 0)) return 'The input range must be above 0 V.';
  return null;
}

const UNIT_QUANTITY: [RegExp, Quantity][] = [
  [/^(m\/s\^?2|m\/s²|g)$/i, 'acceleration'],
  [/^(mm\/s|m\/s|in\/s)$/i, 'velocity'],
  [/^(pa|mpa|db)$/i, 'sound-pressure'],
  [/^(rpm|1\/min|u\/min)$/i, 'speed'],
  [/^(v|mv)$/i, 'voltage'],
];
const NAME_QUANTITY: [RegExp, Quantity][] = [
  [/tacho|pulse|trigger|keyphas/i, 'tacho'],
  [/rpm|speed|drehzahl/i, 'speed'],
  [/mic|spl|sound|pressure/i, 'sound-pressure'],
  [/acc|accel|vib/i, 'acceleration'],
  [/volt|^u_?|dc.?link/i, 'voltage'],
];

/** A first guess from the channel's name and unit, for the engineer to confirm. */
export function guessQuantity(name: string, unit: string | null): Quantity {
  if (unit) for (const [re, q] of UNIT_QUANTITY) if (re.test(unit.trim())) return q;
  for (const [re, q] of NAME_QUANTITY) if (re.test(name)) return q;
  return 'other';
}

export function defaultSetup(channels: ChannelInfo[]): ChannelSetup[] {
  return channels.map((c) => {
    const quantity = guessQuantity(c.name, c.unit);
    return { index: c.index, name: c.name, quantity, unit: c.unit ?? defaultUnit[quantity], calibration: { kind: 'scale', factor: 1 } };
  });
}
