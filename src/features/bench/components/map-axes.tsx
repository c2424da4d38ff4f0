import { niceStep, stepDecimals, ticks } from '../map/axis-ticks';
import type { Range, Viewport } from '../map/viewport';

export type AxisKind = 'time' | 'speed' | 'frequency';

export interface AxisTicks {
  title: string;
  items: { at: number; label: string }[];
}

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

/** Labels up the left of the map, with the axis title turned on its side. */
export function LeftAxis({ axis, testId }: { axis: AxisTicks | null; testId: string }) {
  return (
    <div className="relative flex h-full select-none" data-testid={testId}>
      <span className="mr-1 self-center whitespace-nowrap text-xs text-mist-500 [transform:rotate(180deg)] [writing-mode:vertical-rl]">
        {axis?.title ?? ''}
      </span>
      <div className="relative h-full flex-1">
        {axis?.items.map(({ at, label }) => (
          <span
            key={label}
            className="absolute right-0 flex translate-y-1/2 items-center gap-1 font-mono text-[11px] leading-none text-mist-300"
            style={{ bottom: `${at * 100}%` }}
          >
            {label}
            <span className="h-px w-1.5 bg-ink-600" />
          </span>
        ))}
      </div>
    </div>
  );
}

/** Labels along the bottom of the map. */
export function BottomAxis({ axis, testId }: { axis: AxisTicks | null; testId: string }) {
  return (
    <div className="select-none" data-testid={testId}>
      <div className="relative h-5">
        {axis?.items.map(({ at, label }) => (
          <span
            key={label}
            className="absolute top-0 flex -translate-x-1/2 flex-col items-center font-mono text-[11px] leading-none text-mist-300"
            style={{ left: `${at * 100}%` }}
          >
            <span className="mb-1 h-1.5 w-px bg-ink-600" />
            {label}
          </span>
        ))}
      </div>
      <p className="text-center text-xs text-mist-500">{axis?.title ?? ''}</p>
    </div>
  );
}
