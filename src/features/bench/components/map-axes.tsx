import { stepDecimals, ticks, niceStep } from '../map/axis-ticks';

const TIME_TICKS = 8;
const FREQUENCY_TICKS = 6;

export function frequencyTicks(f0: number, f1: number) {
  const kHz = f1 >= 2000;
  const k = kHz ? 1000 : 1;
  const values = ticks(Math.max(0, f0) / k, f1 / k, FREQUENCY_TICKS);
  const decimals = stepDecimals(niceStep((f1 - Math.max(0, f0)) / k, FREQUENCY_TICKS));
  return {
    title: kHz ? 'Frequency (kHz)' : 'Frequency (Hz)',
    items: values.map((v) => ({ at: (v * k - f0) / (f1 - f0), label: v.toFixed(decimals) })),
  };
}

export function timeTicks(t0: number, t1: number) {
  const values = ticks(Math.max(0, t0), t1, TIME_TICKS);
  const decimals = stepDecimals(niceStep(t1 - Math.max(0, t0), TIME_TICKS));
  return values.map((v) => ({ at: (v - t0) / (t1 - t0), label: v.toFixed(decimals) }));
}

/** Frequency labels up the left of the map, with the axis title turned on its side. */
export function FrequencyAxis({ spanHz }: { spanHz: [number, number] | null }) {
  const t = spanHz ? frequencyTicks(spanHz[0], spanHz[1]) : null;
  return (
    <div className="relative flex h-full select-none" data-testid="map-frequency-axis">
      <span className="mr-1 self-center text-xs text-mist-500 [transform:rotate(180deg)] [writing-mode:vertical-rl]">
        {t?.title ?? 'Frequency'}
      </span>
      <div className="relative h-full flex-1">
        {t?.items.map(({ at, label }) => (
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

/** Time labels along the bottom of the map. */
export function TimeAxis({ spanS }: { spanS: [number, number] | null }) {
  const items = spanS ? timeTicks(spanS[0], spanS[1]) : [];
  return (
    <div className="select-none" data-testid="map-time-axis">
      <div className="relative h-5">
        {items.map(({ at, label }) => (
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
      <p className="text-center text-xs text-mist-500">Time (s)</p>
    </div>
  );
}

/** Faint lines at the ticks, over the map, so a level can be read off against both axes. */
export function MapGrid({ spanS, spanHz }: { spanS: [number, number] | null; spanHz: [number, number] | null }) {
  if (!spanS || !spanHz) return null;
  return (
    <div className="pointer-events-none absolute inset-0 overflow-hidden" aria-hidden>
      {timeTicks(spanS[0], spanS[1]).map(({ at, label }) => (
        <span key={`t${label}`} className="absolute inset-y-0 w-px bg-white/[0.07]" style={{ left: `${at * 100}%` }} />
      ))}
      {frequencyTicks(spanHz[0], spanHz[1]).items.map(({ at, label }) => (
        <span key={`f${label}`} className="absolute inset-x-0 h-px bg-white/[0.07]" style={{ bottom: `${at * 100}%` }} />
      ))}
    </div>
  );
}
