import { ticks } from '../../../lib/plot/axis-ticks';
import { guideColour, guideDash, overlay, OVERLAY_FONT } from '../../../lib/plot/overlay';
import { speedAtTimes } from '../../../../workers/dsp/hearing-curves';
import { linePoints, type GuideLine } from './guides';
import { geometry, type Viewport } from './viewport';

export interface GuidesScene {
  view: Viewport | null;
  swapped: boolean;
  hasMap: boolean;
  lines: GuideLine[];
  against: 'time' | 'speed';
  frameTimes: Float64Array | null;
  frameRpm: Float64Array | null;
  dpr: number;
  /** The hearing model's strongest tonal frequency against time, drawn dotted (null: not shown) */
  tonal?: TonalLine | null;
}

export interface TonalLine {
  t: Float64Array;
  hz: Float64Array;
}

interface Label {
  x: number;
  y: number;
  text: string;
  colour: string;
}

/** The grid at the axis ticks, the guide lines (the tracked ones on top), and their labels. */
export function paintGuides(canvas: HTMLCanvasElement, s: GuidesScene): void {
  const ctx = canvas.getContext('2d');
  if (!ctx) return;
  const { dpr, view } = s;
  ctx.setTransform(1, 0, 0, 1, 0, 0);
  ctx.clearRect(0, 0, canvas.width, canvas.height);
  if (!view || !s.hasMap) return;
  const W = canvas.width;
  const H = canvas.height;
  const g = geometry(view, s.swapped, W, H);
  ctx.strokeStyle = overlay.grid;
  ctx.lineWidth = 1;
  ctx.beginPath();
  for (const x of ticks(view.x[0], view.x[1], s.swapped ? 6 : 8)) {
    const [a, b] = g.toScreen(x, view.f[0]);
    const [c, d] = g.toScreen(x, view.f[1]);
    ctx.moveTo(Math.round(a) + 0.5, Math.round(b) + 0.5);
    ctx.lineTo(Math.round(c) + 0.5, Math.round(d) + 0.5);
  }
  for (const f of ticks(Math.max(0, view.f[0]), view.f[1], s.swapped ? 8 : 6)) {
    const [a, b] = g.toScreen(view.x[0], f);
    const [c, d] = g.toScreen(view.x[1], f);
    ctx.moveTo(Math.round(a) + 0.5, Math.round(b) + 0.5);
    ctx.lineTo(Math.round(c) + 0.5, Math.round(d) + 0.5);
  }
  ctx.stroke();
  if (!s.frameTimes) return;
  const labels: Label[] = [];
  // the unselected first, so the selected lie on top
  const ordered = [...s.lines].sort((a, b) => Number(a.selected) - Number(b.selected));
  for (const line of ordered) {
    const pts = linePoints(line, s.against, s.frameTimes, s.frameRpm, view.x);
    const colour = guideColour(line.kind, line.selected);
    const path = new Path2D();
    let open = false;
    let last: [number, number] | null = null;
    for (let i = 0; i < pts.length; i += 2) {
      const x = pts[i];
      const f = pts[i + 1];
      if (!Number.isFinite(x)) {
        open = false;
        continue;
      }
      const [sx, sy] = g.toScreen(x, f);
      if (open) path.lineTo(sx, sy);
      else path.moveTo(sx, sy);
      open = true;
      if (x >= view.x[0] && x <= view.x[1] && f >= view.f[0] && f <= view.f[1]) last = [sx, sy];
    }
    const width = (line.selected ? 1.75 : 1.1) * dpr;
    ctx.setLineDash(guideDash(line.kind).map((v) => v * dpr));
    ctx.globalAlpha = 0.55;
    ctx.strokeStyle = overlay.halo;
    ctx.lineWidth = width + 2 * dpr;
    ctx.stroke(path);
    ctx.globalAlpha = line.selected ? 1 : 0.85;
    ctx.strokeStyle = colour;
    ctx.lineWidth = width;
    ctx.stroke(path);
    if (last) labels.push({ x: last[0], y: last[1], text: line.label, colour });
  }
  ctx.setLineDash([]);
  ctx.globalAlpha = 1;
  if (s.tonal) paintTonal(ctx, s.tonal, s, g, labels);
  paintLabels(ctx, labels, W, H, dpr);
}

/** The tonal frequency as dots at its moments (against speed, at the speed the frames give them). */
function paintTonal(ctx: CanvasRenderingContext2D, tonal: TonalLine, s: GuidesScene, g: ReturnType<typeof geometry>, labels: Label[]) {
  const view = s.view!;
  const xs = s.against === 'time' || !s.frameTimes || !s.frameRpm ? tonal.t : speedAtTimes(tonal.t, s.frameTimes, s.frameRpm);
  const r = 1.6 * s.dpr;
  ctx.fillStyle = overlay.tonal;
  let last: [number, number] | null = null;
  for (let i = 0; i < xs.length; i++) {
    const x = xs[i];
    const f = tonal.hz[i];
    if (!Number.isFinite(x) || !Number.isFinite(f) || x < view.x[0] || x > view.x[1] || f < view.f[0] || f > view.f[1]) continue;
    const [sx, sy] = g.toScreen(x, f);
    ctx.fillRect(sx - r, sy - r, 2 * r, 2 * r);
    last = [sx, sy];
  }
  if (last) labels.push({ x: last[0], y: last[1], text: 'tonal (ECMA-418-2)', colour: overlay.tonal });
}

/** Labels sit at the line's last visible point; one that would cover another moves down (or up). */
function paintLabels(ctx: CanvasRenderingContext2D, labels: Label[], W: number, H: number, dpr: number) {
  ctx.font = `${11 * dpr}px ${OVERLAY_FONT}`;
  ctx.textBaseline = 'middle';
  const placed: { x: number; y: number; w: number; h: number }[] = [];
  const h = 15 * dpr;
  const hits = (r: { x: number; y: number; w: number }) => placed.some((q) => r.x < q.x + q.w && q.x < r.x + r.w && r.y < q.y + h && q.y < r.y + h);
  for (const l of labels.sort((a, b) => a.y - b.y)) {
    const w = ctx.measureText(l.text).width + 6 * dpr;
    const x = Math.min(W - w - 2 * dpr, Math.max(2 * dpr, l.x - w - 4 * dpr));
    let y = Math.min(H - h - 2 * dpr, Math.max(2 * dpr, l.y - h - 2 * dpr));
    for (let tries = 0; tries < 12 && hits({ x, y, w }); tries++) y = y + h + dpr > H - h ? y - (h + dpr) * (tries + 1) : y + h + dpr;
    placed.push({ x, y, w, h });
    ctx.fillStyle = overlay.labelBackground;
    ctx.fillRect(x, y, w, h);
    ctx.fillStyle = l.colour;
    ctx.fillText(l.text, x + 3 * dpr, y + h / 2);
  }
}
