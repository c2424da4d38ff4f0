import { markDash, overlay, OVERLAY_FONT } from '../../../lib/plot/overlay';
import type { BenchMark } from '../view-state/view-snapshot';
import { geometry, type Viewport } from './viewport';

export interface CursorScene {
  view: Viewport | null;
  swapped: boolean;
  hasMap: boolean;
  /** The pinned moment along x (time or speed) */
  pinnedX: number | null;
  /** The play head along x (time or speed), when this map's run is heard */
  playX: number | null;
  /** The pointer in the map's terms; f NaN when it is on a plot */
  pointer: { x: number; f: number } | null;
  marks: BenchMark[];
  /** A zoom or mark box being dragged, in CSS pixels */
  box: { start: [number, number]; at: [number, number] } | null;
  dpr: number;
}

/** What moves with the hand: the pinned moment, the crosshair, the marks with their numbers, a box being dragged. */
export function paintCursor(canvas: HTMLCanvasElement, s: CursorScene): void {
  const ctx = canvas.getContext('2d');
  if (!ctx) return;
  const { dpr, view } = s;
  ctx.clearRect(0, 0, canvas.width, canvas.height);
  if (!view || !s.hasMap) return;
  const g = geometry(view, s.swapped, canvas.width, canvas.height);
  const line = (x0: number, y0: number, x1: number, y1: number) => {
    ctx.beginPath();
    ctx.moveTo(x0, y0);
    ctx.lineTo(x1, y1);
    ctx.stroke();
  };
  if (s.pinnedX !== null && s.pinnedX >= view.x[0] && s.pinnedX <= view.x[1]) {
    ctx.strokeStyle = overlay.pinned;
    ctx.lineWidth = dpr;
    ctx.setLineDash([3 * dpr, 3 * dpr]);
    const [a, b] = g.toScreen(s.pinnedX, view.f[0]);
    const [c, d] = g.toScreen(s.pinnedX, view.f[1]);
    line(a, b, c, d);
    ctx.setLineDash([]);
  }
  if (s.playX !== null && s.playX >= view.x[0] && s.playX <= view.x[1]) {
    // the play head: a solid line with a small flag at the top of the frequency axis
    ctx.strokeStyle = overlay.playHead;
    ctx.lineWidth = 2 * dpr;
    const [a, b] = g.toScreen(s.playX, view.f[0]);
    const [c, d] = g.toScreen(s.playX, view.f[1]);
    line(a, b, c, d);
    ctx.fillStyle = overlay.playHead;
    ctx.beginPath();
    ctx.arc(c, d, 4 * dpr, 0, 2 * Math.PI);
    ctx.fill();
  }
  if (s.pointer) {
    ctx.strokeStyle = overlay.crosshair;
    ctx.lineWidth = dpr;
    const [a, b] = g.toScreen(s.pointer.x, view.f[0]);
    const [c, d] = g.toScreen(s.pointer.x, view.f[1]);
    line(Math.round(a) + 0.5, Math.round(b) + 0.5, Math.round(c) + 0.5, Math.round(d) + 0.5);
    if (Number.isFinite(s.pointer.f)) {
      const [e, f] = g.toScreen(view.x[0], s.pointer.f);
      const [h, i] = g.toScreen(view.x[1], s.pointer.f);
      line(Math.round(e) + 0.5, Math.round(f) + 0.5, Math.round(h) + 0.5, Math.round(i) + 0.5);
    }
  }
  // marks: a ring or box with its number, dashed while waiting to be saved
  ctx.lineWidth = 1.75 * dpr;
  ctx.font = `600 ${11 * dpr}px ${OVERLAY_FONT}`;
  ctx.textBaseline = 'alphabetic';
  s.marks.forEach((m, i) => {
    if (m.kind === 'guide') return; // a guide mark is on the whole line: listed, not drawn
    ctx.setLineDash(markDash(m.saved === true).map((v) => v * dpr));
    let labelAt: [number, number];
    if (m.kind === 'point') {
      const [x, y] = g.toScreen(m.x, m.f);
      ctx.strokeStyle = overlay.markHalo;
      ctx.lineWidth = 4 * dpr;
      ctx.beginPath();
      ctx.arc(x, y, 9 * dpr, 0, 2 * Math.PI);
      ctx.stroke();
      ctx.strokeStyle = overlay.mark;
      ctx.lineWidth = 2 * dpr;
      ctx.stroke();
      labelAt = [x + 10 * dpr, y - 10 * dpr];
    } else {
      const [ax, ay] = g.toScreen(m.x0, m.f0);
      const [bx, by] = g.toScreen(m.x1, m.f1);
      const [x0, x1, y0, y1] = [Math.min(ax, bx), Math.max(ax, bx), Math.min(ay, by), Math.max(ay, by)];
      ctx.strokeStyle = overlay.markHalo;
      ctx.lineWidth = 4 * dpr;
      ctx.strokeRect(x0, y0, x1 - x0, y1 - y0);
      ctx.strokeStyle = overlay.mark;
      ctx.lineWidth = 2 * dpr;
      ctx.strokeRect(x0, y0, x1 - x0, y1 - y0);
      labelAt = [x1 + 2 * dpr, y0 - 2 * dpr];
    }
    ctx.setLineDash([]);
    ctx.lineWidth = 3 * dpr;
    ctx.strokeStyle = overlay.halo;
    const label = String(m.number ?? i + 1);
    ctx.strokeText(label, labelAt[0], labelAt[1]);
    ctx.fillStyle = overlay.mark;
    ctx.fillText(label, labelAt[0], labelAt[1]);
  });
  if (s.box) {
    const [x0, y0] = [s.box.start[0] * dpr, s.box.start[1] * dpr];
    const [x1, y1] = [s.box.at[0] * dpr, s.box.at[1] * dpr];
    ctx.fillStyle = overlay.zoomBoxFill;
    ctx.strokeStyle = overlay.zoomBoxStroke;
    ctx.lineWidth = dpr;
    ctx.fillRect(Math.min(x0, x1), Math.min(y0, y1), Math.abs(x1 - x0), Math.abs(y1 - y0));
    ctx.strokeRect(Math.min(x0, x1) + 0.5, Math.min(y0, y1) + 0.5, Math.abs(x1 - x0), Math.abs(y1 - y0));
  }
}
