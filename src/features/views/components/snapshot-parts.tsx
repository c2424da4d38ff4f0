import { markDash, overlay } from '../../../lib/plot/overlay';
import type { ViewState } from '../../../../server/schemas/views';
import { lutCss } from '../../../lib/plot/colour-scales';
import { ticks } from '../../../lib/plot/axis-ticks';
import type { AxisSpec } from '../snapshot/axes';
import { lineForGuide, type Polyline } from '../snapshot/guide-lines';
import type { PendingPlace } from './snapshot-figure';

const ACCENT = overlay.mark;
const HALO = overlay.halo;

/** A mark's number beside it, on the dark halo. */
export function MarkNumber({ x, y, n, colour }: { x: number; y: number; n: number; colour: string }) {
  return (
    <text x={x} y={y} fontSize={11} fontWeight={600} fill={colour} stroke={HALO} strokeWidth={3} paintOrder="stroke" className="font-mono">
      {n}
    </text>
  );
}

/** A mark being placed, dashed until it has its text. */
export function PendingShape({
  pending,
  px,
  state,
  axes,
  polyPath,
}: {
  pending: PendingPlace;
  px: (x: number, y: number) => [number, number];
  state: ViewState;
  axes: { x: AxisSpec; y: AxisSpec };
  polyPath: (line: Polyline) => string;
}) {
  const dash = markDash(false).join(' ');
  if (pending.kind === 'point') {
    const [x, y] = px(pending.geometry.x, pending.geometry.y);
    return <circle cx={x} cy={y} r={9} fill="none" stroke={ACCENT} strokeWidth={2} strokeDasharray={dash} data-testid="pending-mark" />;
  }
  if (pending.kind === 'box') {
    const g = pending.geometry;
    const [x0, y1] = px(g.x0, g.y1);
    const [x1, y0] = px(g.x1, g.y0);
    return (
      <rect x={x0} y={y1} width={x1 - x0} height={y0 - y1} fill="none" stroke={ACCENT} strokeWidth={2} strokeDasharray={dash} data-testid="pending-mark" />
    );
  }
  const line = lineForGuide(pending.geometry.guide, state, axes);
  return (
    <g data-testid="pending-mark">
      {line.polylines.map((pl, i) => (
        <path key={i} d={polyPath(pl)} fill="none" stroke={ACCENT} strokeWidth={2} strokeDasharray={dash} />
      ))}
    </g>
  );
}

/** The colour bar: the scale from the floor of the range to its top, in dB. */
export function ScaleBar({ lut, topDb, rangeDb, weighting }: { lut: Uint8Array; topDb: number; rangeDb: number; weighting: 'A' | 'C' | 'Z' }) {
  const stops = Array.from({ length: 17 }, (_, i) => `${lutCss(lut, Math.round((i * 255) / 16))} ${(i * 100) / 16}%`);
  const floorDb = topDb - rangeDb;
  return (
    <div className="flex flex-col pl-3" data-testid="snapshot-scale">
      <div className="flex flex-1 gap-1.5">
        <div
          className="w-3 rounded-sm ring-1 ring-ink-700"
          style={{ background: `linear-gradient(to top, ${stops.join(', ')})` }}
          aria-hidden
        />
        <div className="relative flex-1">
          {ticks(floorDb, topDb, 6).map((v) => (
            <span
              key={v}
              className="absolute left-0 flex -translate-y-1/2 items-center gap-1 font-mono text-[11px] leading-none text-mist-300"
              style={{ top: `${((topDb - v) / rangeDb) * 100}%` }}
            >
              <span className="h-px w-1 bg-ink-600" />
              {Number.isInteger(v) ? v : v.toFixed(1)}
            </span>
          ))}
        </div>
      </div>
      <p className="pt-1 text-[11px] text-mist-500">
        <span className="font-mono text-mist-300">{weighting === 'Z' ? 'dB' : `dB(${weighting})`}</span>
      </p>
    </div>
  );
}
