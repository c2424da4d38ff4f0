import { useEffect, useRef, useState, type PointerEvent } from 'react';
import { paintColumns, type MapRaster } from '../map/map-raster';

export interface MapProbe {
  timeS: number;
  frequencyHz: number;
  levelDb: number;
  /** Pointer position as fractions of the canvas, x from the left, y from the top */
  x: number;
  y: number;
}

interface View {
  raster: MapRaster;
  image: ImageData;
  buffer: HTMLCanvasElement;
  lut: Uint8Array;
  topDb: number;
  rangeDb: number;
}

/**
 * The map's pixels: the raster painted through the colour lookup into an image no larger than the
 * canvas (each pixel the maximum of the cells it covers), then drawn to the canvas scaled up with
 * smoothing off. New chunks repaint only their columns; React renders none of it.
 */
export function MapCanvas({
  raster,
  lut,
  topDb,
  rangeDb,
  onProbe,
}: {
  raster: MapRaster | null;
  lut: Uint8Array;
  topDb: number;
  rangeDb: number;
  onProbe: (probe: MapProbe | null) => void;
}) {
  const canvasRef = useRef<HTMLCanvasElement>(null);
  const view = useRef<View | null>(null);
  const frame = useRef<number | null>(null);
  const dirty = useRef<[number, number] | null>(null);
  const [size, setSize] = useState<{ width: number; height: number } | null>(null);

  // The canvas's backing store follows its box, in device pixels.
  useEffect(() => {
    const canvas = canvasRef.current;
    if (!canvas) return;
    const measure = () => {
      const dpr = window.devicePixelRatio || 1;
      const width = Math.max(1, Math.round(canvas.clientWidth * dpr));
      const height = Math.max(1, Math.round(canvas.clientHeight * dpr));
      setSize((s) => (s && s.width === width && s.height === height ? s : { width, height }));
    };
    measure();
    const observer = new ResizeObserver(measure);
    observer.observe(canvas);
    return () => observer.disconnect();
  }, []);

  // Draws the dirty columns of the image onto the canvas, once per animation frame.
  const schedule = (x0: number, x1: number) => {
    dirty.current = dirty.current ? [Math.min(dirty.current[0], x0), Math.max(dirty.current[1], x1)] : [x0, x1];
    if (frame.current !== null) return;
    frame.current = requestAnimationFrame(() => {
      frame.current = null;
      const v = view.current;
      const canvas = canvasRef.current;
      const d = dirty.current;
      dirty.current = null;
      if (!v || !canvas || !d) return;
      const ctx = canvas.getContext('2d');
      const bctx = v.buffer.getContext('2d');
      if (!ctx || !bctx) return;
      bctx.putImageData(v.image, 0, 0, d[0], 0, d[1] - d[0], v.image.height);
      ctx.clearRect(0, 0, canvas.width, canvas.height);
      ctx.imageSmoothingEnabled = false;
      ctx.drawImage(v.buffer, 0, 0, v.image.width, v.image.height, 0, 0, canvas.width, canvas.height);
    });
  };

  useEffect(
    () => () => {
      if (frame.current !== null) cancelAnimationFrame(frame.current);
    },
    [],
  );

  // A new raster, size, colour scale or level range: paint the whole image again.
  useEffect(() => {
    const canvas = canvasRef.current;
    if (!canvas || !size) return;
    if (canvas.width !== size.width) canvas.width = size.width;
    if (canvas.height !== size.height) canvas.height = size.height;
    if (!raster) {
      view.current = null;
      canvas.getContext('2d')?.clearRect(0, 0, size.width, size.height);
      return;
    }
    const width = Math.min(raster.columns, size.width);
    const height = Math.min(raster.rows, size.height);
    const previous = view.current;
    const reuse = previous && previous.image.width === width && previous.image.height === height;
    const image = reuse ? previous.image : new ImageData(width, height);
    const buffer = reuse ? previous.buffer : document.createElement('canvas');
    if (!reuse) {
      buffer.width = width;
      buffer.height = height;
    }
    const v: View = { raster, image, buffer, lut, topDb, rangeDb };
    view.current = v;
    paintColumns(raster, image.data, width, height, lut, topDb, rangeDb, 0, width);
    schedule(0, width);
    return raster.subscribe((c0, c1) => {
      const x0 = Math.floor((c0 * width) / raster.columns);
      const x1 = Math.min(width, Math.ceil((c1 * width) / raster.columns));
      paintColumns(raster, image.data, width, height, v.lut, v.topDb, v.rangeDb, x0, x1);
      schedule(x0, x1);
    });
  }, [raster, size, lut, topDb, rangeDb]);

  const probe = (e: PointerEvent<HTMLCanvasElement>) => {
    if (!raster) return onProbe(null);
    const rect = e.currentTarget.getBoundingClientRect();
    const x = (e.clientX - rect.left) / rect.width;
    const y = (e.clientY - rect.top) / rect.height;
    const hit = raster.probe(x, 1 - y);
    onProbe(hit ? { ...hit, x, y } : null);
  };

  return (
    <canvas
      ref={canvasRef}
      data-testid="map-canvas"
      aria-label="Map: time across, frequency up, level as colour"
      className="block h-full w-full cursor-crosshair touch-none"
      onPointerMove={probe}
      onPointerDown={probe}
      onPointerLeave={() => onProbe(null)}
    />
  );
}
