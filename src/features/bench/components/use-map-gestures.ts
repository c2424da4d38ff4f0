import { useEffect, useRef, type PointerEvent as ReactPointerEvent, type RefObject } from 'react';
import type { DrawScheduler } from '../map/draw-scheduler';
import { boxed, dragged, fullView, geometry, zoomAbout, type Extents, type Viewport } from '../map/viewport';
import type { BenchPointer, BenchStores } from '../session/live-stores';
import type { MapMode, MarkPlace } from '../session/use-view-model';

/** What the gestures read at the moment they act (kept in a ref, so handlers never go stale). */
export interface GestureProps {
  extents: Extents | null;
  swapped: boolean;
  mode: MapMode;
  probe: (x: number, f: number) => BenchPointer | null;
  onPick: (fHz: number) => void;
  onPin: (x: number) => void;
  onMark: (place: MarkPlace) => void;
}

export interface Drag {
  start: [number, number];
  at: [number, number];
  view: Viewport;
  box: boolean;
  moved: boolean;
}

/**
 * The map's gestures: drag to pan, wheel to zoom about the pointer, Shift-drag (or the box mode) for a
 * zoom box or a box mark, click to pin, pick a carrier or place a point mark, double-click for the
 * whole map. The pointer store follows the hand.
 */
export function useMapGestures(
  canvasRef: RefObject<HTMLCanvasElement | null>,
  boxRef: RefObject<HTMLDivElement | null>,
  stores: BenchStores,
  props: GestureProps,
  scheduler: DrawScheduler,
) {
  const latest = useRef(props);
  latest.current = props;
  const drag = useRef<Drag | null>(null);

  const local = (e: { clientX: number; clientY: number }): [number, number] => {
    const rect = canvasRef.current!.getBoundingClientRect();
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
  // the wheel's listener is added once; it reads the latest helpers through this ref
  const helpers = useRef({ local, domainAt, updatePointer });
  helpers.current = { local, domainAt, updatePointer };

  // Wheel zoom needs a listener that may cancel the page's scroll.
  useEffect(() => {
    const el = canvasRef.current;
    if (!el) return;
    const onWheel = (e: WheelEvent) => {
      const p = latest.current;
      const view = stores.viewport.get();
      if (!p.extents || !view) return;
      e.preventDefault();
      const dy = e.deltaMode === 1 ? e.deltaY * 16 : e.deltaMode === 2 ? e.deltaY * 400 : e.deltaY;
      const h = helpers.current;
      const [px, py] = h.local(e);
      const at = h.domainAt(px, py);
      if (!at) return;
      stores.viewport.set(zoomAbout(view, p.extents, Math.exp(Math.max(-1, Math.min(1, dy * 0.0015))), at));
      h.updatePointer(px, py);
    };
    el.addEventListener('wheel', onWheel, { passive: false });
    return () => el.removeEventListener('wheel', onWheel);
  }, [stores, canvasRef]);

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
      if (d.box) scheduler.request({ cursor: true });
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
    scheduler.request({ cursor: true });
  };

  const handlers = {
    onPointerDown,
    onPointerMove,
    onPointerUp,
    onPointerCancel: () => {
      drag.current = null;
      scheduler.request({ cursor: true });
    },
    onPointerLeave: () => {
      if (!drag.current) stores.pointer.set(null);
    },
    onDoubleClick: () => {
      const p = latest.current;
      if (p.extents) stores.viewport.set(fullView(p.extents));
    },
  };
  return { handlers, drag };
}
