import { useEffect, useLayoutEffect, useRef, type PointerEvent as ReactPointerEvent } from 'react';
import { ticks } from '../map/axis-ticks';
import { linePoints, type GuideLine } from '../map/guides';
import { MapImage } from '../map/map-image';
import type { MapRaster } from '../map/map-raster';
import { boxed, dragged, fullView, geometry, zoomAbout, type Extents, type Viewport } from '../map/viewport';
import type { BenchPointer, BenchStores } from '../session/live-stores';
import type { MapMode, MarkPlace } from '../session/use-view-model';
import type { BenchMark } from '../view-state/view-snapshot';

export const GUIDE_COLOURS = {
  selected: '#f0a93e',
  order: '#7fa7d4',
  family: '#aab4c4',
} as const;

const FONT = '"JetBrains Mono", ui-monospace, monospace';

interface Props {
  raster: MapRaster | null;
  lut: Uint8Array;
  topDb: number;
  rangeDb: number;
  extents: Extents | null;
  swapped: boolean;
  against: 'time' | 'speed';
  lines: GuideLine[];
  frameTimes: Float64Array | null;
  frameRpm: Float64Array | null;
  pinnedX: number | null;
  mode: MapMode;
  stores: BenchStores;
  /** Marks fanlight:map-painted when this raster is painted to its last column */
  markPainted: boolean;
  probe: (x: number, f: number) => BenchPointer | null;
  onPick: (fHz: number) => void;
  onPin: (x: number) => void;
  /** Marks waiting for the view to be saved, drawn over the map */
  marks: BenchMark[];
  onMark: (place: MarkPlace) => void;
  label: string;
}

interface Drag {
  start: [number, number];
  at: [number, number];
  view: Viewport;
  box: boolean;
  moved: boolean;
}

let redraws = 0;

/**
 * The map's three layers: the painted levels (drawn from a MapImage level by source rectangle, so
 * pan and zoom never repaint pixels), the guides with their labels and the grid, and the cursor
 * (crosshair, pinned time, zoom box). React renders none of their pixels; everything is drawn once
 * per animation frame from the latest props and stores.
 */
export function MapView(props: Props) {
  const { raster, lut, topDb, rangeDb, stores } = props;
  const boxRef = useRef<HTMLDivElement>(null);
  const mapRef = useRef<HTMLCanvasElement>(null);
  const guidesRef = useRef<HTMLCanvasElement>(null);
  const cursorRef = useRef<HTMLCanvasElement>(null);
  const imageRef = useRef<MapImage | null>(null);
  const latest = useRef(props);
  latest.current = props;
  const need = useRef({ map: false, guides: false, cursor: false });
  const frame = useRef<number | null>(null);
  const drag = useRef<Drag | null>(null);
  const size = useRef({ width: 1, height: 1, dpr: 1 });
  const painted = useRef(new WeakSet<MapRaster>());
  /** Raster columns that arrived since the last frame */
  const pending = useRef<[number, number] | null>(null);

  const request = (what: Partial<typeof need.current>) => {
    Object.assign(need.current, what);
    if (frame.current === null) frame.current = requestAnimationFrame(draw);
  };

  function draw() {
    frame.current = null;
    const n = need.current;
    need.current = { map: false, guides: false, cursor: false };
    const p = latest.current;
    const view = p.stores.viewport.get();
    // new chunks first: painting is not part of a redraw
    if (imageRef.current && pending.current) {
      imageRef.current.paintColumns(pending.current[0], pending.current[1]);
      pending.current = null;
    }
    const t0 = performance.now();
    if (n.map) drawMap(p, view);
    if (n.guides) drawGuides(p, view);
    if (n.cursor || n.guides) drawCursor(p, view);
    if (n.map || n.guides) {
      performance.measure('fanlight:redraw', { start: t0, end: performance.now() });
      if (++redraws % 2000 === 0) performance.clearMeasures('fanlight:redraw');
    }
  }

  function drawMap(p: Props, view: Viewport | null) {
    const canvas = mapRef.current;
    const ctx = canvas?.getContext('2d');
    const image = imageRef.current;
    if (!canvas || !ctx) return;
    ctx.setTransform(1, 0, 0, 1, 0, 0);
    ctx.clearRect(0, 0, canvas.width, canvas.height);
    if (!image || !view || !p.raster) return;
    const r = p.raster;
    const [X0, X1] = r.timeSpanS;
    const [F0, F1] = r.frequencySpanHz;
    const W = canvas.width;
    const H = canvas.height;
    const sx0 = ((view.x[0] - X0) / (X1 - X0)) * image.width;
    const sw0 = ((view.x[1] - view.x[0]) / (X1 - X0)) * image.width;
    const sy0 = ((F1 - view.f[1]) / (F1 - F0)) * image.height;
    const sh0 = ((view.f[1] - view.f[0]) / (F1 - F0)) * image.height;
    const [dw, dh] = p.swapped ? [H, W] : [W, H];
    const { canvas: src, sx: kx, sy: ky } = image.levelFor(sw0, sh0, dw, dh);
    const [sx, sy, sw, sh] = [sx0 / kx, sy0 / ky, sw0 / kx, sh0 / ky];
    // Smoothing only where a copy is shrunk (by less than 2, so no row is skipped); enlarged cells
    // stay sharp.
    ctx.imageSmoothingEnabled = sw > dw * 1.01 || sh > dh * 1.01;
    ctx.imageSmoothingQuality = 'low';
    if (p.swapped) ctx.setTransform(0, -1, -1, 0, W, H);
    ctx.drawImage(src, sx, sy, sw, sh, 0, 0, dw, dh);
    ctx.setTransform(1, 0, 0, 1, 0, 0);
    if (p.markPainted && r.columnsDone >= r.columns && !painted.current.has(r)) {
      painted.current.add(r);
      performance.mark('fanlight:map-painted');
    }
  }

  function drawGuides(p: Props, view: Viewport | null) {
    const canvas = guidesRef.current;
    const ctx = canvas?.getContext('2d');
    if (!canvas || !ctx) return;
    const { dpr } = size.current;
    ctx.setTransform(1, 0, 0, 1, 0, 0);
    ctx.clearRect(0, 0, canvas.width, canvas.height);
    if (!view || !p.raster) return;
    const W = canvas.width;
    const H = canvas.height;
    const g = geometry(view, p.swapped, W, H);
    // grid at the axis ticks
    ctx.strokeStyle = 'rgba(255,255,255,0.07)';
    ctx.lineWidth = 1;
    ctx.beginPath();
    for (const x of ticks(view.x[0], view.x[1], p.swapped ? 6 : 8)) {
      const [a, b] = g.toScreen(x, view.f[0]);
      const [c, d] = g.toScreen(x, view.f[1]);
      ctx.moveTo(Math.round(a) + 0.5, Math.round(b) + 0.5);
      ctx.lineTo(Math.round(c) + 0.5, Math.round(d) + 0.5);
    }
    for (const f of ticks(Math.max(0, view.f[0]), view.f[1], p.swapped ? 8 : 6)) {
      const [a, b] = g.toScreen(view.x[0], f);
      const [c, d] = g.toScreen(view.x[1], f);
      ctx.moveTo(Math.round(a) + 0.5, Math.round(b) + 0.5);
      ctx.lineTo(Math.round(c) + 0.5, Math.round(d) + 0.5);
    }
    ctx.stroke();
    if (!p.frameTimes) return;
    const labels: { x: number; y: number; text: string; colour: string }[] = [];
    // the unselected first, so the selected lie on top
    const ordered = [...p.lines].sort((a, b) => Number(a.selected) - Number(b.selected));
    for (const line of ordered) {
      const pts = linePoints(line, p.against, p.frameTimes, p.frameRpm, view.x);
      const colour = line.selected ? GUIDE_COLOURS.selected : line.kind === 'order' ? GUIDE_COLOURS.order : GUIDE_COLOURS.family;
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
      ctx.setLineDash(line.kind === 'family' ? [6 * dpr, 4 * dpr] : []);
      // a dark edge keeps a guide apart from the bright line it lies on, whatever the colour scale
      ctx.globalAlpha = 0.55;
      ctx.strokeStyle = '#0d1117';
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
    ctx.font = `${11 * dpr}px ${FONT}`;
    ctx.textBaseline = 'middle';
    // Labels sit at the line's last visible point; one that would cover another moves down (or up).
    const placed: { x: number; y: number; w: number; h: number }[] = [];
    const h = 15 * dpr;
    const hits = (r: { x: number; y: number; w: number }) => placed.some((q) => r.x < q.x + q.w && q.x < r.x + r.w && r.y < q.y + h && q.y < r.y + h);
    for (const l of labels.sort((a, b) => a.y - b.y)) {
      const w = ctx.measureText(l.text).width + 6 * dpr;
      const x = Math.min(W - w - 2 * dpr, Math.max(2 * dpr, l.x - w - 4 * dpr));
      let y = Math.min(H - h - 2 * dpr, Math.max(2 * dpr, l.y - h - 2 * dpr));
      for (let tries = 0; tries < 12 && hits({ x, y, w }); tries++) y = y + h + dpr > H - h ? y - (h + dpr) * (tries + 1) : y + h + dpr;
      placed.push({ x, y, w, h });
      ctx.fillStyle = 'rgba(13,17,23,0.78)';
      ctx.fillRect(x, y, w, h);
      ctx.fillStyle = l.colour;
      ctx.fillText(l.text, x + 3 * dpr, y + h / 2);
    }
  }

  function drawCursor(p: Props, view: Viewport | null) {
    const canvas = cursorRef.current;
    const ctx = canvas?.getContext('2d');
    if (!canvas || !ctx) return;
    const { dpr } = size.current;
    ctx.clearRect(0, 0, canvas.width, canvas.height);
    if (!view || !p.raster) return;
    const W = canvas.width;
    const H = canvas.height;
    const g = geometry(view, p.swapped, W, H);
    const line = (x0: number, y0: number, x1: number, y1: number) => {
      ctx.beginPath();
      ctx.moveTo(x0, y0);
      ctx.lineTo(x1, y1);
      ctx.stroke();
    };
    if (p.pinnedX !== null && p.pinnedX >= view.x[0] && p.pinnedX <= view.x[1]) {
      ctx.strokeStyle = 'rgba(240,169,62,0.7)';
      ctx.lineWidth = dpr;
      ctx.setLineDash([3 * dpr, 3 * dpr]);
      const [a, b] = g.toScreen(p.pinnedX, view.f[0]);
      const [c, d] = g.toScreen(p.pinnedX, view.f[1]);
      line(a, b, c, d);
      ctx.setLineDash([]);
    }
    const pointer = p.stores.pointer.get();
    if (pointer) {
      ctx.strokeStyle = 'rgba(232,237,244,0.35)';
      ctx.lineWidth = dpr;
      const [a, b] = g.toScreen(pointer.x, view.f[0]);
      const [c, d] = g.toScreen(pointer.x, view.f[1]);
      line(Math.round(a) + 0.5, Math.round(b) + 0.5, Math.round(c) + 0.5, Math.round(d) + 0.5);
      if (Number.isFinite(pointer.f)) {
        const [e, f] = g.toScreen(view.x[0], pointer.f);
        const [h, i] = g.toScreen(view.x[1], pointer.f);
        line(Math.round(e) + 0.5, Math.round(f) + 0.5, Math.round(h) + 0.5, Math.round(i) + 0.5);
      }
    }
    // marks: a ring or box with its number, dashed while waiting to be saved
    ctx.lineWidth = 1.75 * dpr;
    ctx.font = `600 ${11 * dpr}px ${FONT}`;
    ctx.textBaseline = 'alphabetic';
    p.marks.forEach((m, i) => {
      if (m.kind === 'guide') return; // a guide mark is on the whole line: listed, not drawn
      ctx.setLineDash(m.saved ? [] : [4 * dpr, 3 * dpr]);
      let labelAt: [number, number];
      if (m.kind === 'point') {
        const [x, y] = g.toScreen(m.x, m.f);
        ctx.strokeStyle = 'rgba(13,17,23,0.8)';
        ctx.lineWidth = 4 * dpr;
        ctx.beginPath();
        ctx.arc(x, y, 9 * dpr, 0, 2 * Math.PI);
        ctx.stroke();
        ctx.strokeStyle = '#f0a93e';
        ctx.lineWidth = 2 * dpr;
        ctx.stroke();
        labelAt = [x + 10 * dpr, y - 10 * dpr];
      } else {
        const [ax, ay] = g.toScreen(m.x0, m.f0);
        const [bx, by] = g.toScreen(m.x1, m.f1);
        const [x0, x1, y0, y1] = [Math.min(ax, bx), Math.max(ax, bx), Math.min(ay, by), Math.max(ay, by)];
        ctx.strokeStyle = 'rgba(13,17,23,0.8)';
        ctx.lineWidth = 4 * dpr;
        ctx.strokeRect(x0, y0, x1 - x0, y1 - y0);
        ctx.strokeStyle = '#f0a93e';
        ctx.lineWidth = 2 * dpr;
        ctx.strokeRect(x0, y0, x1 - x0, y1 - y0);
        labelAt = [x1 + 2 * dpr, y0 - 2 * dpr];
      }
      ctx.setLineDash([]);
      ctx.lineWidth = 3 * dpr;
      ctx.strokeStyle = '#0d1117';
      const label = String(m.number ?? i + 1);
      ctx.strokeText(label, labelAt[0], labelAt[1]);
      ctx.fillStyle = '#f0a93e';
      ctx.fillText(label, labelAt[0], labelAt[1]);
    });
    const d = drag.current;
    if (d && d.box && d.moved) {
      const [x0, y0] = [d.start[0] * dpr, d.start[1] * dpr];
      const [x1, y1] = [d.at[0] * dpr, d.at[1] * dpr];
      ctx.fillStyle = 'rgba(240,169,62,0.12)';
      ctx.strokeStyle = 'rgba(240,169,62,0.9)';
      ctx.lineWidth = dpr;
      ctx.fillRect(Math.min(x0, x1), Math.min(y0, y1), Math.abs(x1 - x0), Math.abs(y1 - y0));
      ctx.strokeRect(Math.min(x0, x1) + 0.5, Math.min(y0, y1) + 0.5, Math.abs(x1 - x0), Math.abs(y1 - y0));
    }
  }

  // Backing stores follow the box, in device pixels.
  useLayoutEffect(() => {
    const box = boxRef.current;
    if (!box) return;
    const measure = () => {
      const dpr = window.devicePixelRatio || 1;
      const width = Math.max(1, Math.round(box.clientWidth * dpr));
      const height = Math.max(1, Math.round(box.clientHeight * dpr));
      size.current = { width, height, dpr };
      for (const c of [mapRef.current, guidesRef.current, cursorRef.current]) {
        if (!c) continue;
        if (c.width !== width) c.width = width;
        if (c.height !== height) c.height = height;
      }
      request({ map: true, guides: true, cursor: true });
    };
    measure();
    const observer = new ResizeObserver(measure);
    observer.observe(box);
    return () => observer.disconnect();
  }, []);

  useEffect(
    () => () => {
      if (frame.current !== null) cancelAnimationFrame(frame.current);
      frame.current = null;
    },
    [],
  );

  // A new raster: a new image, painted as its chunks arrive.
  useEffect(() => {
    if (!raster) {
      imageRef.current = null;
      request({ map: true, guides: true });
      return;
    }
    const p = latest.current;
    const image = new MapImage(raster, p.lut, p.topDb, p.rangeDb);
    imageRef.current = image;
    request({ map: true, guides: true });
    // Chunks arriving within one frame are painted together, in that frame.
    const off = raster.subscribe((c0, c1) => {
      pending.current = pending.current ? [Math.min(pending.current[0], c0), Math.max(pending.current[1], c1)] : [c0, c1];
      request({ map: true });
    });
    return () => {
      off();
      pending.current = null;
      if (imageRef.current === image) imageRef.current = null;
    };
  }, [raster]);

  useEffect(() => {
    imageRef.current?.setLut(lut);
    request({ map: true });
  }, [lut]);

  useEffect(() => {
    imageRef.current?.setRange(topDb, rangeDb);
    request({ map: true });
  }, [topDb, rangeDb]);

  useEffect(() => {
    request({ map: true, guides: true, cursor: true });
  }, [props.swapped, props.against, props.extents]);

  useEffect(() => {
    request({ guides: true });
  }, [props.lines, props.frameTimes, props.frameRpm]);

  useEffect(() => {
    request({ cursor: true });
  }, [props.pinnedX, props.marks]);

  useEffect(() => {
    const offView = stores.viewport.subscribe(() => request({ map: true, guides: true, cursor: true }));
    const offPointer = stores.pointer.subscribe(() => request({ cursor: true }));
    return () => {
      offView();
      offPointer();
    };
  }, [stores]);

  const local = (e: { clientX: number; clientY: number }): [number, number] => {
    const rect = mapRef.current!.getBoundingClientRect();
    return [e.clientX - rect.left, e.clientY - rect.top];
  };

  const domainAt = (px: number, py: number) => {
    const view = stores.viewport.get();
    const box = boxRef.current;
    if (!view || !box) return null;
    return geometry(view, latest.current.swapped, box.clientWidth, box.clientHeight).fromScreen(px, py);
  };

  const updatePointer = (px: number, py: number) => {
    const at = domainAt(px, py);
    stores.pointer.set(at ? latest.current.probe(at.x, at.f) : null);
  };

  // Wheel zoom needs a listener that may cancel the page's scroll.
  useEffect(() => {
    const el = mapRef.current;
    if (!el) return;
    const onWheel = (e: WheelEvent) => {
      const p = latest.current;
      const view = stores.viewport.get();
      if (!p.extents || !view) return;
      e.preventDefault();
      const dy = e.deltaMode === 1 ? e.deltaY * 16 : e.deltaMode === 2 ? e.deltaY * 400 : e.deltaY;
      const [px, py] = local(e);
      const at = domainAt(px, py);
      if (!at) return;
      stores.viewport.set(zoomAbout(view, p.extents, Math.exp(Math.max(-1, Math.min(1, dy * 0.0015))), at));
      updatePointer(px, py);
    };
    el.addEventListener('wheel', onWheel, { passive: false });
    return () => el.removeEventListener('wheel', onWheel);
  }, [stores]);

  const onPointerDown = (e: ReactPointerEvent<HTMLCanvasElement>) => {
    const view = stores.viewport.get();
    if (e.button !== 0 || !view) return;
    e.currentTarget.setPointerCapture(e.pointerId);
    const at = local(e);
    drag.current = { start: at, at, view, box: e.shiftKey || latest.current.mode === 'box', moved: false };
  };

  const onPointerMove = (e: ReactPointerEvent<HTMLCanvasElement>) => {
    const at = local(e);
    const d = drag.current;
    const p = latest.current;
    if (d && p.extents) {
      d.at = at;
      if (!d.moved && Math.hypot(at[0] - d.start[0], at[1] - d.start[1]) > 3) d.moved = true;
      if (d.moved && !d.box && p.mode !== 'pick') {
        const box = boxRef.current!;
        stores.viewport.set(dragged(d.view, p.extents, p.swapped, box.clientWidth, box.clientHeight, d.start, at));
      }
      if (d.box) request({ cursor: true });
    }
    updatePointer(at[0], at[1]);
  };

  const onPointerUp = (e: ReactPointerEvent<HTMLCanvasElement>) => {
    const d = drag.current;
    drag.current = null;
    if (!d) return;
    const p = latest.current;
    const at = local(e);
    if (!d.moved) {
      const hit = domainAt(at[0], at[1]);
      if (hit && p.mode === 'pick') p.onPick(hit.f);
      else if (hit && p.mode === 'mark') p.onMark({ kind: 'point', x: hit.x, f: hit.f });
      else if (hit) p.onPin(hit.x);
    } else if (d.box && p.mode === 'mark') {
      const a = domainAt(d.start[0], d.start[1]);
      const b = domainAt(at[0], at[1]);
      if (a && b && Math.abs(at[0] - d.start[0]) > 3 && Math.abs(at[1] - d.start[1]) > 3) {
        p.onMark({ kind: 'box', x0: Math.min(a.x, b.x), x1: Math.max(a.x, b.x), f0: Math.min(a.f, b.f), f1: Math.max(a.f, b.f) });
      }
    } else if (d.box && p.extents) {
      const box = boxRef.current!;
      if (Math.abs(at[0] - d.start[0]) > 6 && Math.abs(at[1] - d.start[1]) > 6) {
        stores.viewport.set(boxed(d.view, p.extents, p.swapped, box.clientWidth, box.clientHeight, d.start, at));
      }
    }
    request({ cursor: true });
  };

  const cursor = props.mode === 'pick' || props.mode === 'mark' ? 'cursor-copy' : props.mode === 'box' ? 'cursor-zoom-in' : 'cursor-crosshair';

  return (
    <div ref={boxRef} className="absolute inset-0">
      <canvas
        ref={mapRef}
        data-testid="map-canvas"
        aria-label={props.label}
        className={`absolute inset-0 block h-full w-full touch-none ${cursor}`}
        onPointerDown={onPointerDown}
        onPointerMove={onPointerMove}
        onPointerUp={onPointerUp}
        onPointerCancel={() => {
          drag.current = null;
          request({ cursor: true });
        }}
        onPointerLeave={() => {
          if (!drag.current) stores.pointer.set(null);
        }}
        onDoubleClick={() => {
          const p = latest.current;
          if (p.extents) stores.viewport.set(fullView(p.extents));
        }}
      />
      {/* The overlays let the pointer through to the map canvas, which takes every gesture. */}
      <canvas ref={guidesRef} data-testid="map-guides" aria-hidden className="pointer-events-none absolute inset-0 block h-full w-full" />
      <canvas ref={cursorRef} aria-hidden className="pointer-events-none absolute inset-0 block h-full w-full" />
    </div>
  );
}
