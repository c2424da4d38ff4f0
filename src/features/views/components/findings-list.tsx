import type { SnapshotHeader } from '../../../../workers/io/snapshot-format';
import { formatAxisValue, type AxisSpec } from '../snapshot/axes';

const kindText = (kind: string) => {
  const words = kind.replace(/[-_]+/g, ' ').trim();
  return words.charAt(0).toUpperCase() + words.slice(1);
};

/** What the Bench found when the view was saved; a finding with a place is ringed on the map when chosen. */
export function FindingsList({
  findings,
  axes,
  highlighted,
  onHighlight,
}: {
  findings: NonNullable<SnapshotHeader['findings']>;
  axes: { x: AxisSpec; y: AxisSpec };
  highlighted: number | null;
  onHighlight: (index: number | null) => void;
}) {
  return (
    <ul className="flex flex-col gap-1.5 text-sm" data-testid="view-findings">
      {findings.map((f, i) => (
        <li key={i}>
          <button
            type="button"
            className={`w-full rounded-md px-2 py-1.5 text-left hover:bg-ink-800 ${highlighted === i ? 'bg-ink-800 ring-1 ring-accent/50' : ''}`}
            onClick={() => onHighlight(highlighted === i ? null : i)}
            aria-pressed={highlighted === i}
          >
            <span className="block text-xs text-mist-500">{kindText(f.kind)}</span>
            <span className="block text-mist-100">{f.summary}</span>
            {f.at && (
              <span className="block font-mono text-xs text-mist-300">
                {formatAxisValue(axes.x, f.at.x)} · {formatAxisValue(axes.y, f.at.y)}
              </span>
            )}
          </button>
        </li>
      ))}
    </ul>
  );
}
