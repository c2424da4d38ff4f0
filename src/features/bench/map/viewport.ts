/**
 * The visible part of the map and the geometry between it and the screen. `x` is time (s) or speed
 * (rpm), `f` frequency (Hz). Unswapped: x across, f up. Swapped: f across, x up. No DOM here.
 */

export type Range = [number, number];

export interface Viewport {
  x: Range;
  f: Range;
}

export interface Extents {
  x: Range;
  f: Range;
  /** Smallest spans one may zoom to (a few frames, a few bins) */
  minX: number;
  minF: number;
}

function clampRange([lo, hi]: Range, [min, max]: Range, minSpan: number): Range {
  const full = max - min;
  let span = Math.min(full, Math.max(minSpan, hi - lo));
  if (!(span > 0)) span = full;
  let a = (lo + hi) / 2 - span / 2;
  a = Math.min(max - span, Math.max(min, a));
  return [a, a + span];
}

export function clampViewport(v: Viewport, e: Extents): Viewport {
  return { x: clampRange(v.x, e.x, e.minX), f: clampRange(v.f, e.f, e.minF) };
}

export const fullView = (e: Extents): Viewport => ({ x: [...e.x], f: [...e.f] });

/** Zooms by `factor` (< 1 in, > 1 out) about a point, on both axes or one. */
export function zoomAbout(v: Viewport, e: Extents, factor: number, at: { x: number; f: number }, axes: 'both' | 'x' | 'f' = 'both'): Viewport {
  const scale = (r: Range, c: number): Range => [c + (r[0] - c) * factor, c + (r[1] - c) * factor];
  return clampViewport({ x: axes === 'f' ? v.x : scale(v.x, at.x), f: axes === 'x' ? v.f : scale(v.f, at.f) }, e);
}

export const centreOf = (v: Viewport) => ({ x: (v.x[0] + v.x[1]) / 2, f: (v.f[0] + v.f[1]) / 2 });

/** The view moved by a domain offset, kept inside the map. */
export function shift(v: Viewport, e: Extents, dx: number, df: number): Viewport {
  return clampViewport({ x: [v.x[0] + dx, v.x[1] + dx], f: [v.f[0] + df, v.f[1] + df] }, e);
}

/** Screen ↔ domain for a box of width × height pixels. */
export interface Geometry {
  width: number;
  height: number;
  swapped: boolean;
  toScreen(x: number, f: number): [number, number];
  fromScreen(px: number, py: number): { x: number; f: number };
}

export function geometry(v: Viewport, swapped: boolean, width: number, height: number): Geometry {
  const [x0, x1] = v.x;
  const [f0, f1] = v.f;
  const sx = x1 - x0;
  const sf = f1 - f0;
  if (!swapped) {
    return {
      width,
      height,
      swapped,
      toScreen: (x, f) => [((x - x0) / sx) * width, ((f1 - f) / sf) * height],
      fromScreen: (px, py) => ({ x: x0 + (px / width) * sx, f: f1 - (py / height) * sf }),
    };
  }
  return {
    width,
    height,
    swapped,
    toScreen: (x, f) => [((f - f0) / sf) * width, ((x1 - x) / sx) * height],
    fromScreen: (px, py) => ({ f: f0 + (px / width) * sf, x: x1 - (py / height) * sx }),
  };
}

/** The view that keeps the domain point under `from` under `to` (a drag). */
export function dragged(start: Viewport, e: Extents, swapped: boolean, width: number, height: number, from: [number, number], to: [number, number]): Viewport {
  const g = geometry(start, swapped, width, height);
  const a = g.fromScreen(from[0], from[1]);
  const b = g.fromScreen(to[0], to[1]);
  return shift(start, e, a.x - b.x, a.f - b.f);
}

/** The view of a box drawn between two screen points. */
export function boxed(v: Viewport, e: Extents, swapped: boolean, width: number, height: number, p: [number, number], q: [number, number]): Viewport {
  const g = geometry(v, swapped, width, height);
  const a = g.fromScreen(p[0], p[1]);
  const b = g.fromScreen(q[0], q[1]);
  return clampViewport({ x: [Math.min(a.x, b.x), Math.max(a.x, b.x)], f: [Math.min(a.f, b.f), Math.max(a.f, b.f)] }, e);
}

/** Pans by a fraction of the visible box in screen directions (arrow keys): +1 right / down. */
export function panScreen(v: Viewport, e: Extents, swapped: boolean, right: number, down: number): Viewport {
  const sx = v.x[1] - v.x[0];
  const sf = v.f[1] - v.f[0];
  return swapped ? shift(v, e, -down * sx, right * sf) : shift(v, e, right * sx, -down * sf);
}
