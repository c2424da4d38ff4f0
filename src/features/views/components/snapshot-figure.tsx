import { useEffect, useMemo, useRef, useState, type KeyboardEvent, type PointerEvent as ReactPointerEvent, type RefObject } from 'react';
import { guideColour, guideDash, markDash, overlay } from '../../../lib/plot/overlay';
import type { GuideRef, Mark, ViewState } from '../../../../server/schemas/views';
import { levelOfByte } from '../../../../workers/io/snapshot-codec';
import { colourLut, type ColourScaleName } from '../../../lib/plot/colour-scales';
import { BottomAxis, LeftAxis } from '../../../components/plot/map-axes';
import type { DecodedSnapshot } from '../api/snapshot';
import { axisTicks, axisTitle, formatAxisValue, fractionOf, valueAt, type AxisSpec } from '../snapshot/axes';
import { lineForGuide, sameGuide, type GuideLine, type Polyline } from '../snapshot/guide-lines';
import { byteAt, mapPixels } from '../snapshot/paint';
import { MarkNumber, PendingShape, ScaleBar } from './snapshot-parts';

/** A mark being placed: where it goes, before it has a text. */
export type PendingPlace =
  | { kind: 'point'; geometry: { x: number; y: number } }
  | { kind: 'box'; geometry: { x0: number; x1: number; y0: number; y1: number } }
  | { kind: 'guide'; geometry: { guide: GuideRef } };

const ACCENT = overlay.mark;
const MIST = overlay.text;
const HALO = overlay.halo;

interface SnapshotFigureProps {
  snapshot: DecodedSnapshot;
  state: ViewState;
  colourScale: ColourScaleName;
  guides: GuideLine[];
  marks: Mark[];
  selectedMarkId: number | null;
  onSelectMark?: (id: number) => void;
  pending?: PendingPlace | null;
  /** Given: a click on the map places a point, a Shift-drag a box. */
  onPick?: (place: PendingPlace) => void;
  highlightedFinding?: number | null;
}

function useSize(ref: RefObject<HTMLElement | null>) {
  const [size, setSize] = useState({ w: 0, h: 0 });
  useEffect(() => {
    const el = ref.current;
    if (!el) return;
    const observer = new ResizeObserver(([entry]) => setSize({ w: entry.contentRect.width, h: entry.contentRect.height }));
    observer.observe(el);
    return () => observer.disconnect();
  }, [ref]);
  return size;
}

/** Liang–Barsky clipping of a segment to the plot [0, w] × [0, h]. */
function clip(x0: number, y0: number, x1: number, y1: number, w: number, h: number): [number, number, number, number] | null {
  let t0 = 0;
  let t1 = 1;
  const dx = x1 - x0;
  const dy = y1 - y0;
  const edges: [number, number][] = [
    [-dx, x0],
    [dx, w - x0],
    [-dy, y0],
    [dy, h - y0],
  ];
  for (const [p, q] of edges) {
    if (p === 0) {
      if (q < 0) return null;
    } else {
      const r = q / p;
      if (p < 0) t0 = Math.max(t0, r);
      else t1 = Math.min(t1, r);
      if (t0 > t1) return null;
    }
  }
  return [x0 + t0 * dx, y0 + t0 * dy, x0 + t1 * dx, y0 + t1 * dy];
}

export function SnapshotFigure({
  snapshot,
  state,
  colourScale,
  guides,
  marks,
  selectedMarkId,
  onSelectMark,
  pending,
  onPick,
  highlightedFinding = null,
}: SnapshotFigureProps) {
  const { header, map } = snapshot;
  const ax = header.axes as { x: AxisSpec; y: AxisSpec };
  const canvasRef = useRef<HTMLCanvasElement>(null);
  const plotRef = useRef<HTMLDivElement>(null);
  const { w, h } = useSize(plotRef);
  const lut = useMemo(() => colourLut(colourScale), [colourScale]);

  useEffect(() => {
    const canvas = canvasRef.current;
    const ctx = canvas?.getContext('2d');
    if (!canvas || !ctx) return;
    canvas.width = header.width;
    canvas.height = header.height;
    ctx.putImageData(new ImageData(mapPixels(map, header.width, header.height, lut), header.width, header.height), 0, 0);
  }, [header.width, header.height, map, lut]);

  const px = (x: number, y: number): [number, number] => [fractionOf(ax.x, x) * w, (1 - fractionOf(ax.y, y)) * h];
  const toData = (pxX: number, pxY: number) => ({ x: valueAt(ax.x, pxX / w), y: valueAt(ax.y, 1 - pxY / h) });

  // ---------------------------------------------------------------- pointer: readout and placing

  const drag = useRef<{ x: number; y: number; shift: boolean } | null>(null);
  const [band, setBand] = useState<{ x0: number; y0: number; x1: number; y1: number } | null>(null);
  const [pointer, setPointer] = useState<{ x: number; y: number } | null>(null);
  const local = (e: ReactPointerEvent) => {
    const r = e.currentTarget.getBoundingClientRect();
    return [e.clientX - r.left, e.clientY - r.top] as const;
  };
  const onPointerDown = (e: ReactPointerEvent<HTMLDivElement>) => {
    if (!onPick || e.button !== 0) return;
    const [x, y] = local(e);
    drag.current = { x, y, shift: e.shiftKey };
    e.currentTarget.setPointerCapture(e.pointerId);
  };
  const onPointerMove = (e: ReactPointerEvent<HTMLDivElement>) => {
    const [x, y] = local(e);
    setPointer({ x, y });
    const d = drag.current;
    if (d?.shift) setBand({ x0: Math.min(d.x, x), y0: Math.min(d.y, y), x1: Math.max(d.x, x), y1: Math.max(d.y, y) });
  };
  const onPointerUp = (e: ReactPointerEvent<HTMLDivElement>) => {
    const d = drag.current;
    drag.current = null;
    setBand(null);
    if (!d || !onPick || !(w > 0 && h > 0)) return;
    const [x, y] = local(e);
    if (d.shift && Math.abs(x - d.x) > 3 && Math.abs(y - d.y) > 3) {
      const a = toData(Math.min(x, d.x), Math.max(y, d.y));
      const b = toData(Math.max(x, d.x), Math.min(y, d.y));
      onPick({ kind: 'box', geometry: { x0: a.x, x1: b.x, y0: a.y, y1: b.y } });
    } else if (Math.abs(x - d.x) < 5 && Math.abs(y - d.y) < 5) {
      onPick({ kind: 'point', geometry: toData(x, y) });
    }
  };

  // ---------------------------------------------------------------- what the overlay draws

  const selected = marks.find((m) => m.id === selectedMarkId) ?? null;
  const selectedGuide = selected?.kind === 'guide' ? (selected.geometry as { guide: GuideRef }).guide : null;

  const polyPath = (line: Polyline) =>
    line
      .map(([x, y], i) => {
        const [a, b] = px(x, y);
        return `${i === 0 ? 'M' : 'L'}${a.toFixed(1)},${b.toFixed(1)}`;
      })
      .join(' ');

  /** Where a line's label sits: its clipped end toward the top right. */
  const labelAt = (polylines: Polyline[]): [number, number] | null => {
    let best: [number, number] | null = null;
    for (const line of polylines) {
      for (let i = 1; i < line.length; i++) {
        const [a0, b0] = px(...line[i - 1]);
        const [a1, b1] = px(...line[i]);
        const c = clip(a0, b0, a1, b1, w, h);
        if (!c) continue;
        for (const p of [
          [c[0], c[1]],
          [c[2], c[3]],
        ] as [number, number][]) {
          if (!best || p[0] - p[1] > best[0] - best[1]) best = p;
        }
      }
    }
    return best;
  };

  const drawLine = (line: GuideLine, stroke: string, width: number, dash: string | undefined, key: string) => {
    const at = labelAt(line.polylines);
    return (
      <g key={key}>
        {line.polylines.map((pl, i) => (
          <path key={i} d={polyPath(pl)} fill="none" stroke={stroke} strokeWidth={width} strokeDasharray={dash} />
        ))}
        {at && (
          <text
            x={Math.min(Math.max(at[0] - 4, 28), w - 4)}
            y={Math.min(Math.max(at[1] + 12, 12), h - 4)}
            textAnchor="end"
            className="font-mono"
            fontSize={10.5}
            fill={stroke}
            stroke={HALO}
            strokeWidth={3}
            paintOrder="stroke"
          >
            {line.label}
          </text>
        )}
      </g>
    );
  };

  const pointer01 = pointer && w > 0 ? { fx: pointer.x / w, fy: 1 - pointer.y / h } : null;
  const pointerByte = pointer01 ? byteAt(map, header.width, header.height, pointer01.fx, pointer01.fy) : null;

  return (
    <figure className="flex flex-col gap-1.5">
      <div className="grid grid-cols-[3.75rem_minmax(0,1fr)_4.75rem]">
        <LeftAxis axis={{ title: axisTitle(ax.y), items: axisTicks(ax.y, 6) }} testId="snapshot-axis-y" />
        <div
          ref={plotRef}
          className={`relative h-80 touch-none select-none overflow-hidden rounded-sm bg-ink-950 ring-1 ring-ink-700 lg:h-[26rem] ${onPick ? 'cursor-crosshair' : ''}`}
          onPointerDown={onPointerDown}
          onPointerMove={onPointerMove}
          onPointerUp={onPointerUp}
          onPointerLeave={() => setPointer(null)}
        >
          <canvas
            ref={canvasRef}
            data-testid="view-snapshot"
            className="absolute inset-0 h-full w-full"
            role="img"
            aria-label={`Map: ${axisTitle(ax.y)} against ${axisTitle(ax.x)}`}
          />
          {w > 0 && (
            <svg className="pointer-events-none absolute inset-0" width={w} height={h} data-testid="snapshot-overlay">
              {guides
                .filter((g) => g.visible && g.polylines.length > 0)
                .map((g) =>
                  drawLine(
                    g,
                    guideColour(g.guide.kind, !!selectedGuide && sameGuide(selectedGuide, g.guide)),
                    selectedGuide && sameGuide(selectedGuide, g.guide) ? 2 : 1,
                    guideDash(g.guide.kind).join(' ') || undefined,
                    `guide-${g.key}`,
                  ),
                )}

              {(header.findings ?? []).map((f, i) => {
                if (!f.at) return null;
                const [x, y] = px(f.at.x, f.at.y);
                const on = highlightedFinding === i;
                return (
                  <path
                    key={`finding-${i}`}
                    d={`M${x},${y - 6} L${x + 6},${y} L${x},${y + 6} L${x - 6},${y} Z`}
                    fill="none"
                    stroke={on ? ACCENT : MIST}
                    strokeOpacity={on ? 1 : 0.7}
                    strokeWidth={on ? 2 : 1.25}
                  />
                );
              })}

              {marks.map((m, i) => {
                const on = m.id === selectedMarkId;
                const colour = on ? ACCENT : MIST;
                const select = () => onSelectMark?.(m.id);
                const common = {
                  'data-testid': `mark-shape-${m.id}`,
                  role: onSelectMark ? 'button' : undefined,
                  tabIndex: onSelectMark ? 0 : undefined,
                  'aria-label': `Mark ${i + 1}${m.text ? `: ${m.text}` : ''}`,
                  style: { pointerEvents: 'auto' as const, cursor: onSelectMark ? 'pointer' : undefined },
                  onPointerDown: (e: ReactPointerEvent) => e.stopPropagation(),
                  onClick: select,
                  onKeyDown: (e: KeyboardEvent) => (e.key === 'Enter' || e.key === ' ') && select(),
                };
                if (m.kind === 'point') {
                  const g = m.geometry as { x: number; y: number };
                  const [x, y] = px(g.x, g.y);
                  return (
                    <g key={m.id} {...common}>
                      <circle cx={x} cy={y} r={9} fill="none" stroke={HALO} strokeWidth={4} />
                      <circle cx={x} cy={y} r={9} fill="transparent" stroke={colour} strokeWidth={on ? 2.5 : 1.75} />
                      <MarkNumber x={x + 10} y={y - 10} n={i + 1} colour={colour} />
                    </g>
                  );
                }
                if (m.kind === 'box') {
                  const g = m.geometry as { x0: number; x1: number; y0: number; y1: number };
                  const [x0, y1] = px(g.x0, g.y1);
                  const [x1, y0] = px(g.x1, g.y0);
                  return (
                    <g key={m.id} {...common}>
                      <rect x={x0} y={y1} width={x1 - x0} height={y0 - y1} fill="none" stroke={HALO} strokeWidth={4} />
                      <rect
                        x={x0}
                        y={y1}
                        width={x1 - x0}
                        height={y0 - y1}
                        fill={on ? 'rgb(240 169 62 / 0.08)' : 'rgb(232 237 244 / 0.04)'}
                        stroke={colour}
                        strokeWidth={on ? 2.5 : 1.75}
                      />
                      <MarkNumber x={x1 + 2} y={y1 - 2} n={i + 1} colour={colour} />
                    </g>
                  );
                }
                const line = lineForGuide((m.geometry as { guide: GuideRef }).guide, state, ax);
                if (line.polylines.length === 0) return null;
                const at = labelAt(line.polylines);
                return (
                  <g key={m.id} {...common}>
                    {line.polylines.map((pl, j) => (
                      <g key={j}>
                        <path d={polyPath(pl)} fill="none" stroke="transparent" strokeWidth={10} />
                        <path d={polyPath(pl)} fill="none" stroke={HALO} strokeWidth={4} />
                        <path d={polyPath(pl)} fill="none" stroke={colour} strokeWidth={on ? 2.5 : 1.75} />
                      </g>
                    ))}
                    {at && <MarkNumber x={Math.min(at[0] - 14, w - 16)} y={Math.max(at[1] + 14, 14)} n={i + 1} colour={colour} />}
                  </g>
                );
              })}

              {pending && <PendingShape pending={pending} px={px} state={state} axes={ax} polyPath={polyPath} />}
              {band && (
                <rect
                  x={band.x0}
                  y={band.y0}
                  width={band.x1 - band.x0}
                  height={band.y1 - band.y0}
                  fill="rgb(240 169 62 / 0.08)"
                  stroke={ACCENT}
                  strokeDasharray={markDash(false).join(' ')}
                />
              )}
            </svg>
          )}
        </div>
        <ScaleBar lut={lut} topDb={header.dbTop} rangeDb={header.dbRange} weighting={state.processing.weighting} />
        <div />
        <BottomAxis axis={{ title: axisTitle(ax.x), items: axisTicks(ax.x, 8) }} testId="snapshot-axis-x" />
        <div />
      </div>
      <figcaption className="ml-[3.75rem] flex min-h-5 flex-wrap gap-x-4 font-mono text-xs text-mist-300" data-testid="snapshot-readout">
        {pointer01 && pointer01.fx >= 0 && pointer01.fx <= 1 && pointer01.fy >= 0 && pointer01.fy <= 1 ? (
          <>
            <span>{formatAxisValue(ax.x, valueAt(ax.x, pointer01.fx))}</span>
            <span>{formatAxisValue(ax.y, valueAt(ax.y, pointer01.fy))}</span>
            {pointerByte !== null && (
              <span className="text-mist-100">{levelOfByte(pointerByte, header.dbTop, header.dbRange).toFixed(1)} dB</span>
            )}
          </>
        ) : (
          <span className="font-sans text-mist-500">Point at the map to read the level.</span>
        )}
      </figcaption>
    </figure>
  );
}
