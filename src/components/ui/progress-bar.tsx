/** A bar for work with a known end (a file read, a map computed): `percent` from 0 to 100. */
export function ProgressBar({ label, percent, className = 'h-1.5 w-64' }: { label: string; percent: number; className?: string }) {
  return (
    <div role="progressbar" aria-label={label} aria-valuemin={0} aria-valuemax={100} aria-valuenow={percent} className={`overflow-hidden rounded-full bg-ink-700 ${className}`}>
      <div className="h-full bg-accent transition-[width]" style={{ width: `${percent}%` }} />
    </div>
  );
}
