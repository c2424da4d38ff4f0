import { exceedances, type Exceedance } from '../../../../workers/dsp/compare';
import { targetAt, type TargetPoint } from '../../../../workers/io/target-csv';
import type { Target } from '../../../../server/schemas/targets';
import type { Weighting } from '../../../../workers/dsp/weighting';
import { db1 } from '../../../lib/tone-text';
import { groupDigits } from '../analysis/findings-text';
import type { GuideLine } from '../map/guides';
import type { TrackComparison } from './comparison';

/** The target key of a guide line (`order:48`, `family:1:2`), or null for one no target names (shaft-order families). */
export function trackKeyOf(line: GuideLine): string | null {
  const g = line.guide;
  if (g.kind === 'order') return `order:${g.order}`;
  return g.per === 'electrical' ? `family:${g.m}:${g.n}` : null;
}

/** The project's target for this line at this weighting, if there is one. */
export function targetFor(targets: Target[] | undefined, line: GuideLine | null, weighting: Weighting): Target | null {
  if (!targets || !line || weighting === 'C') return null;
  const key = trackKeyOf(line);
  return targets.find((t) => t.track === key && t.weighting === weighting) ?? null;
}

export const targetOnGrid = (grid: Float64Array, points: TargetPoint[]) => Float64Array.from(grid, (r) => targetAt(points, r));

export interface RunExceedance extends Exceedance {
  run: string;
}

/** Where each run's track lies above the target on the comparison's grid. */
export function runExceedances(names: string[], track: TrackComparison, target: Target): RunExceedance[] {
  return names.flatMap((run, i) => exceedances(track.grid, track.db[i], (r) => targetAt(target.points, r)).map((e) => ({ ...e, run })));
}

/** The exceedances as a list; each one shows its speed on the map when chosen. */
export function ExceedanceList({ items, targetName, onShow }: { items: RunExceedance[]; targetName: string; onShow: (e: RunExceedance) => void }) {
  if (items.length === 0) return <p className="text-mist-500" data-testid="compare-exceedances">No run exceeds the target for {targetName}.</p>;
  return (
    <ul className="flex flex-col gap-1" data-testid="compare-exceedances" aria-label="Exceedances">
      {items.map((e, i) => (
        <li key={i}>
          <button
            type="button"
            className="w-full rounded-md border border-ink-800 px-2.5 py-1.5 text-left font-mono hover:border-accent/60 hover:bg-ink-850"
            data-testid="compare-exceedance"
            data-from-rpm={Math.round(e.fromRpm)}
            onClick={() => onShow(e)}
          >
            <span className="text-mist-100">{e.run}</span>: {targetName} above its target from {groupDigits(e.fromRpm)} to {groupDigits(e.toRpm)} rpm, by up to{' '}
            <span className="text-danger">{db1(e.maxExcessDb)} dB</span> at {groupDigits(e.atRpm)} rpm
          </button>
        </li>
      ))}
    </ul>
  );
}
