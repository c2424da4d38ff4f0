/** The snapshot's axes: ticks, titles and the values under the pointer, in each axis's own unit. No DOM. */
import { niceStep, stepDecimals, ticks } from '../../../lib/plot/axis-ticks';

export type AxisKind = 'time' | 'speed' | 'frequency';

export interface AxisSpec {
  kind: AxisKind;
  from: number;
  to: number;
  unit: string;
}

const kindName: Record<AxisKind, string> = { time: 'Time', speed: 'Speed', frequency: 'Frequency' };

// Frequencies in Hz read better in kHz once the axis reaches 2 kHz.
const inKilo = (a: AxisSpec) => a.kind === 'frequency' && a.unit.toLowerCase() === 'hz' && a.to >= 2000;

export function axisTitle(a: AxisSpec): string {
  const unit = inKilo(a) ? 'kHz' : a.unit;
  return unit ? `${kindName[a.kind]} (${unit})` : kindName[a.kind];
}

/** Ticks over the axis; `at` is the fraction from its `from` end. */
export function axisTicks(a: AxisSpec, target: number): { at: number; label: string }[] {
  if (!(a.to > a.from)) return [];
  const k = inKilo(a) ? 1000 : 1;
  const step = niceStep((a.to - a.from) / k, target);
  const decimals = stepDecimals(step);
  return ticks(a.from / k, a.to / k, target).map((v) => ({ at: (v * k - a.from) / (a.to - a.from), label: v.toFixed(decimals) }));
}

/** A value of the axis as text with its unit, precise enough for a readout. */
export function formatAxisValue(a: AxisSpec, v: number): string {
  if (inKilo(a)) return `${(v / 1000).toFixed(v < 10_000 ? 3 : 2)} kHz`;
  const span = a.to - a.from;
  const decimals = span >= 1000 ? 0 : span >= 10 ? 1 : span >= 1 ? 2 : 3;
  return `${v.toFixed(decimals)}${a.unit ? ` ${a.unit}` : ''}`;
}

/** The fraction of the axis at a value (0 at `from`, 1 at `to`). */
export const fractionOf = (a: AxisSpec, v: number) => (v - a.from) / (a.to - a.from);

export const valueAt = (a: AxisSpec, fraction: number) => a.from + fraction * (a.to - a.from);
