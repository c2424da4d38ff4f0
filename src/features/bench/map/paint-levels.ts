import type { MapImage } from './map-image';
import type { LevelColumns } from './map-raster';
import type { Viewport } from './viewport';

/**
 * The map's levels for a view: the visible part of the painted image drawn by source rectangle (from
 * the image's level of detail that fits), so pan and zoom never repaint pixels; turned a quarter when
 * the axes are swapped. With `over`, the image (a part of the map along x, drawn finer) goes on top of
 * what is there, over the part of the view it covers.
 */
export function paintLevels(
  canvas: HTMLCanvasElement,
  image: MapImage | null,
  raster: LevelColumns | null,
  view: Viewport | null,
  swapped: boolean,
  over = false,
): void {
  const ctx = canvas.getContext('2d');
  if (!ctx) return;
  ctx.setTransform(1, 0, 0, 1, 0, 0);
  if (!over) ctx.clearRect(0, 0, canvas.width, canvas.height);
  if (!image || !view || !raster) return;
  const [X0, X1] = raster.xSpan;
  const [F0, F1] = raster.frequencySpanHz;
  const W = canvas.width;
  const H = canvas.height;
  const [dw, dh] = swapped ? [H, W] : [W, H];
  // along x, the part of the view the image covers (all of it for the whole map)
  const vx0 = over ? Math.max(view.x[0], X0) : view.x[0];
  const vx1 = over ? Math.min(view.x[1], X1) : view.x[1];
  if (!(vx1 > vx0)) return;
  const dx0 = ((vx0 - view.x[0]) / (view.x[1] - view.x[0])) * dw;
  const dxw = ((vx1 - vx0) / (view.x[1] - view.x[0])) * dw;
  const sx0 = ((vx0 - X0) / (X1 - X0)) * image.width;
  const sw0 = ((vx1 - vx0) / (X1 - X0)) * image.width;
  const sy0 = ((F1 - view.f[1]) / (F1 - F0)) * image.height;
  const sh0 = ((view.f[1] - view.f[0]) / (F1 - F0)) * image.height;
  const { canvas: src, sx: kx, sy: ky } = image.levelFor(sw0, sh0, dxw, dh);
  const [sx, sy, sw, sh] = [sx0 / kx, sy0 / ky, sw0 / kx, sh0 / ky];
  // Smoothing only where a copy is shrunk (by less than 2, so no row is skipped); enlarged cells
  // stay sharp.
  ctx.imageSmoothingEnabled = sw > dxw * 1.01 || sh > dh * 1.01;
  ctx.imageSmoothingQuality = 'low';
  if (swapped) ctx.setTransform(0, -1, -1, 0, W, H);
  ctx.drawImage(src, sx, sy, sw, sh, dx0, 0, dxw, dh);
  ctx.setTransform(1, 0, 0, 1, 0, 0);
}
