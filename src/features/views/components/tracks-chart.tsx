import type { SnapshotHeader } from '../../../../workers/io/snapshot-format';
import { ticks } from '../../../lib/plot/axis-ticks';
import { axisTicks, axisTitle, fractionOf, type AxisSpec } from '../snapshot/axes';
import { palette, seriesColours } from '../../../config/theme';

const COLOURS = seriesColours;
const W = 600;
const H = 150;

type Track = NonNullable<SnapshotHeader['tracks']>[number];

/** The tracks saved with the snapshot: level against the map's x axis, gaps where a track has none. */
export function TracksChart({ tracks, xAxis, testId = 'view-tracks', label = 'Tracks', dashedLast = false }: { tracks: Track[]; xAxis: AxisSpec; testId?: string; label?: string; /** the last series is a limit (a target): dashed */ dashedLast?: boolean }) {
  const levels = tracks.flatMap((t) => t.points.map((p) => p[1]).filter((v): v is number => v !== null));
  if (levels.length === 0) return <p className="text-sm text-mist-500">The tracks hold no levels.</p>;
  let lo = Math.min(...levels);
  let hi = Math.max(...levels);
  if (hi - lo < 6) {
    const mid = (hi + lo) / 2;
    lo = mid - 3;
    hi = mid + 3;
  }
  const pad = (hi - lo) * 0.08;
  lo -= pad;
  hi += pad;
  const yOf = (v: number) => H - ((v - lo) / (hi - lo)) * H;
  const xOf = (v: number) => fractionOf(xAxis, v) * W;
  const path = (t: Track) => {
    let d = '';
    let pen = false;
    for (const [x, v] of t.points) {
      if (v === null) {
        pen = false;
        continue;
      }
      d += `${pen ? 'L' : 'M'}${xOf(x).toFixed(1)},${yOf(v).toFixed(1)} `;
      pen = true;
    }
    return d;
  };
  const unit = tracks[0]?.unit ?? 'dB';
  return (
    <div data-testid={testId}>
      <div className="grid grid-cols-[3rem_minmax(0,1fr)]">
        <div className="relative">
          {ticks(lo, hi, 4).map((v) => (
            <span
              key={v}
              className="absolute right-1.5 -translate-y-1/2 font-mono text-[11px] leading-none text-mist-300"
              style={{ top: `${((hi - v) / (hi - lo)) * 100}%` }}
            >
              {Number.isInteger(v) ? v : v.toFixed(1)}
            </span>
          ))}
        </div>
        <svg viewBox={`0 0 ${W} ${H}`} preserveAspectRatio="none" className="h-36 w-full rounded-sm bg-ink-950 ring-1 ring-ink-700" role="img" aria-label={label}>
          <clipPath id="tracks-clip">
            <rect x={0} y={0} width={W} height={H} />
          </clipPath>
          {ticks(lo, hi, 4).map((v) => (
            <line key={v} x1={0} x2={W} y1={yOf(v)} y2={yOf(v)} style={{ stroke: 'var(--c-ink-700)' }} vectorEffect="non-scaling-stroke" />
          ))}
          <g clipPath="url(#tracks-clip)">
            {tracks.map((t, i) => {
              const limit = dashedLast && i === tracks.length - 1;
              return (
                <path key={t.name} d={path(t)} fill="none" stroke={limit ? palette.danger : COLOURS[i % COLOURS.length]} strokeWidth={1.5} strokeDasharray={limit ? '6 4' : undefined} vectorEffect="non-scaling-stroke" />
              );
            })}
          </g>
        </svg>
        <div />
        <div className="relative h-4">
          {axisTicks(xAxis, 8).map(({ at, label }) => (
            <span key={label} className="absolute top-0.5 -translate-x-1/2 font-mono text-[11px] leading-none text-mist-300" style={{ left: `${at * 100}%` }}>
              {label}
            </span>
          ))}
        </div>
      </div>
      <div className="mt-1 flex flex-wrap items-center gap-x-4 gap-y-1 pl-12 text-xs text-mist-300">
        <span className="text-mist-500">
          {unit} against {axisTitle(xAxis).toLowerCase()}
        </span>
        {tracks.map((t, i) => (
          <span key={t.name} className="flex items-center gap-1.5">
            <span className="inline-block h-0.5 w-4" style={{ background: dashedLast && i === tracks.length - 1 ? palette.danger : COLOURS[i % COLOURS.length] }} />
            {t.name}
          </span>
        ))}
      </div>
    </div>
  );
}
