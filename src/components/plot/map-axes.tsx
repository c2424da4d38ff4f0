/** The axis labels beside a map or a snapshot: ticks placed as fractions of the axis, and its title. */
export interface AxisTicks {
  title: string;
  items: { at: number; label: string }[];
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
