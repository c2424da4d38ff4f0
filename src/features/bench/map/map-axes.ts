import type { AxisTicks } from '../../../components/plot/map-axes';
import { niceStep, stepDecimals, ticks } from '../../../lib/plot/axis-ticks';
import type { Range, Viewport } from './viewport';

export type AxisKind = 'time' | 'speed' | 'frequency';

/** Ticks of one axis over a visible range; `at` is the fraction from its low end. */
export function axisTicks(kind: AxisKind, [lo, hi]: Range, target: number): AxisTicks {
  const from = Math.max(0, lo);
  if (!(hi > lo)) return { title: '', items: [] };
  const k = kind === 'frequency' && hi >= 2000 ? 1000 : 1;
  const step = niceStep((hi - from) / k, target);
  const decimals = stepDecimals(step);
  const title = kind === 'frequency' ? (k === 1000 ? 'Frequency (kHz)' : 'Frequency (Hz)') : kind === 'speed' ? 'Speed (rpm)' : 'Time (s)';
  return {
    title,
    items: ticks(from / k, hi / k, target).map((v) => ({ at: (v * k - lo) / (hi - lo), label: v.toFixed(decimals) })),
  };
}

/** The two axes of a view: which quantity runs across and which up. */
export function mapAxes(view: Viewport | null, against: 'time' | 'speed', swapped: boolean) {
  if (!view) return { left: null, bottom: null };
  const x = axisTicks(against, view.x, swapped ? 6 : 8);
  const f = axisTicks('frequency', view.f, swapped ? 8 : 6);
  return swapped ? { left: x, bottom: f } : { left: f, bottom: x };
}

