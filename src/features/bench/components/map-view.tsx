import { useEffect, useLayoutEffect, useRef, useState } from 'react';
import { createDrawScheduler, type Layers } from '../map/draw-scheduler';
import type { GuideLine } from '../map/guides';
import { MapImage } from '../map/map-image';
import type { MapRaster } from '../map/map-raster';
import { paintCursor } from '../map/paint-cursor';
import { paintGuides, type TonalLine } from '../map/paint-guides';
import { paintLevels } from '../map/paint-levels';
import type { Extents } from '../map/viewport';
import type { BenchStores } from '../session/live-stores';
import type { BenchMark } from '../view-state/view-snapshot';
import { useListenIfAny } from '../listen/listen-context';
import type { PlayHead } from '../listen/listen-controller';
import { useMapDetail } from './use-map-detail';
import { useMapGestures, type GestureProps } from './use-map-gestures';

interface Props extends GestureProps {
  raster: MapRaster | null;
  lut: Uint8Array;
  topDb: number;
  rangeDb: number;
  extents: Extents | null;
  against: 'time' | 'speed';
  lines: GuideLine[];
  frameTimes: Float64Array | null;
  frameRpm: Float64Array | null;
  pinnedX: number | null;
  stores: BenchStores;
  /** Marks fanlight:map-painted when this raster is painted to its last column */
  markPainted: boolean;
  /** Marks drawn over the map: the saved view's and those waiting to be saved */
  marks: BenchMark[];
  label: string;
  /** The hearing model's strongest tonal frequency, drawn over the guides */
  tonal?: TonalLine | null;
  /** The run this map shows (the play head is drawn on it when that run is heard, or at its speed against speed) */
  runId?: string;
}

let redraws = 0;
/** While a map fills, its newly arrived columns are painted at most this often, ms. */
const CHUNK_PAINT_MS = 150;

/**
 * The map's three layers: the painted levels (paint-levels.ts), the guides with their labels and the
 * grid (paint-guides.ts), and the cursor, pinned moment and marks (paint-cursor.ts). React renders
 * none of their pixels; a scheduler draws the layers that changed once per animation frame, from the
 * latest props and stores. The gestures are use-map-gestures.ts.
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
  const dpr = useRef(1);
  const painted = useRef(new WeakSet<MapRaster>());
  const firstPainted = useRef(new WeakSet<MapRaster>());
  /** Raster columns that arrived since the last frame */
  const pending = useRef<[number, number] | null>(null);
  const draw = useRef<(layers: Layers) => void>(() => undefined);
  const [scheduler] = useState(() => createDrawScheduler((layers) => draw.current(layers)));
  const { handlers, drag } = useMapGestures(mapRef, boxRef, stores, props, scheduler);
  const listen = useListenIfAny();
  const detail = useMapDetail(raster, stores, { lut, topDb, rangeDb }, () => scheduler.request({ map: true }), boxRef);

  draw.current = (n: Layers) => {
    const p = latest.current;
    const view = p.stores.viewport.get();
    // new chunks first: painting is not part of a redraw
    if (imageRef.current && pending.current) {
      imageRef.current.paintColumns(pending.current[0], pending.current[1]);
      pending.current = null;
    }
    const t0 = performance.now();
    const hasMap = p.raster !== null;
    if (n.map && mapRef.current) {
      paintLevels(mapRef.current, imageRef.current, p.raster, view, p.swapped);
      // zoomed into a long map: its part at one pixel per column, over the pooled image
      const d = detail.current;
      if (d) paintLevels(mapRef.current, d, d.raster, view, p.swapped, true);
      const r = p.raster;
      if (r && imageRef.current && view && p.markPainted && r.columnsDone > 0 && !firstPainted.current.has(r)) {
        firstPainted.current.add(r);
        performance.mark('fanlight:map-first-painted');
      }
      if (r && imageRef.current && view && p.markPainted && r.columnsDone >= r.columns && !painted.current.has(r)) {
        painted.current.add(r);
        performance.mark('fanlight:map-painted');
      }
    }
    if (n.guides && guidesRef.current) {
      paintGuides(guidesRef.current, { view, swapped: p.swapped, hasMap, lines: p.lines, against: p.against, frameTimes: p.frameTimes, frameRpm: p.frameRpm, dpr: dpr.current, tonal: p.tonal });
    }
    if ((n.cursor || n.guides) && cursorRef.current) {
      const d = drag.current;
      const playX = playHeadX(listen?.playHead.get() ?? null, p.against, p.runId);
      if (boxRef.current) boxRef.current.dataset.playX = playX === null ? '' : String(playX);
      paintCursor(cursorRef.current, {
        view,
        swapped: p.swapped,
        hasMap,
        pinnedX: p.pinnedX,
        playX,
        pointer: p.stores.pointer.get(),
        marks: p.marks,
        box: d && d.box && d.moved ? d : null,
        dpr: dpr.current,
      });
    }
    if (n.map || n.guides) {
      performance.measure('fanlight:redraw', { start: t0, end: performance.now() });
      if (++redraws % 2000 === 0) performance.clearMeasures('fanlight:redraw');
    }
  };

  // Backing stores follow the box, in device pixels.
  useLayoutEffect(() => {
    const box = boxRef.current;
    if (!box) return;
    const measure = () => {
      dpr.current = window.devicePixelRatio || 1;
      const width = Math.max(1, Math.round(box.clientWidth * dpr.current));
      const height = Math.max(1, Math.round(box.clientHeight * dpr.current));
      for (const c of [mapRef.current, guidesRef.current, cursorRef.current]) {
        if (!c) continue;
        if (c.width !== width) c.width = width;
        if (c.height !== height) c.height = height;
      }
      scheduler.request({ map: true, guides: true, cursor: true });
    };
    measure();
    const observer = new ResizeObserver(measure);
    observer.observe(box);
    return () => observer.disconnect();
  }, [scheduler]);

  useEffect(() => () => scheduler.cancel(), [scheduler]);

  // A new raster: a new image, painted as its chunks arrive.
  useEffect(() => {
    if (!raster) {
      imageRef.current = null;
      scheduler.request({ map: true, guides: true });
      return;
    }
    const p = latest.current;
    const image = new MapImage(raster, p.lut, p.topDb, p.rangeDb);
    imageRef.current = image;
    scheduler.request({ map: true, guides: true });
    // Chunks arriving together are painted together: at most every CHUNK_PAINT_MS while the map fills
    // (each repaint of a large canvas costs the page tens of ms, and the pool waits for the page to hand
    // it the next chunk), and at once when the last one is in.
    let lastPaint = -Infinity;
    let timer: ReturnType<typeof setTimeout> | null = null;
    const paintNow = () => {
      timer = null;
      lastPaint = performance.now();
      scheduler.request({ map: true });
    };
    const off = raster.subscribe((c0, c1) => {
      pending.current = pending.current ? [Math.min(pending.current[0], c0), Math.max(pending.current[1], c1)] : [c0, c1];
      const wait = CHUNK_PAINT_MS - (performance.now() - lastPaint);
      if (raster.columnsDone >= raster.columns || wait <= 0) {
        if (timer) clearTimeout(timer);
        paintNow();
      } else timer ??= setTimeout(paintNow, wait);
    });
    return () => {
      if (timer) clearTimeout(timer);
      off();
      pending.current = null;
      if (imageRef.current === image) imageRef.current = null;
    };
  }, [raster, scheduler]);

  useEffect(() => {
    imageRef.current?.setLut(lut);
    scheduler.request({ map: true });
  }, [lut, scheduler]);

  useEffect(() => {
    imageRef.current?.setRange(topDb, rangeDb);
    scheduler.request({ map: true });
  }, [topDb, rangeDb, scheduler]);

  useEffect(() => {
    scheduler.request({ map: true, guides: true, cursor: true });
  }, [props.swapped, props.against, props.extents, scheduler]);

  useEffect(() => {
    scheduler.request({ guides: true });
  }, [props.lines, props.frameTimes, props.frameRpm, props.tonal, scheduler]);

  // how many tonal-frequency dots the map holds (for tests and tools): counted when they change, not per redraw
  useEffect(() => {
    if (boxRef.current) boxRef.current.dataset.tonalPoints = String(props.tonal ? props.tonal.hz.filter(Number.isFinite).length : 0);
  }, [props.tonal]);

  useEffect(() => {
    scheduler.request({ cursor: true });
  }, [props.pinnedX, props.marks, scheduler]);

  useEffect(() => {
    const offView = stores.viewport.subscribe(() => scheduler.request({ map: true, guides: true, cursor: true }));
    const offPointer = stores.pointer.subscribe(() => scheduler.request({ cursor: true }));
    const offPlay = listen?.playHead.subscribe(() => scheduler.request({ cursor: true }));
    return () => {
      offView();
      offPointer();
      offPlay?.();
    };
  }, [stores, scheduler, listen]);

  const cursor = props.mode === 'pick' || props.mode === 'mark' ? 'cursor-copy' : props.mode === 'box' ? 'cursor-zoom-in' : 'cursor-crosshair';

  return (
    <div ref={boxRef} className="absolute inset-0">
      <canvas ref={mapRef} data-testid="map-canvas" aria-label={props.label} className={`absolute inset-0 block h-full w-full touch-none ${cursor}`} {...handlers} />
      {/* The overlays let the pointer through to the map canvas, which takes every gesture. */}
      <canvas ref={guidesRef} data-testid="map-guides" aria-hidden className="pointer-events-none absolute inset-0 block h-full w-full" />
      <canvas ref={cursorRef} aria-hidden className="pointer-events-none absolute inset-0 block h-full w-full" />
    </div>
  );
}

/** The play head along a map's x: its speed against speed (any run), its time on the map of the run heard. */
function playHeadX(head: PlayHead | null, against: 'time' | 'speed', runId: string | undefined): number | null {
  if (!head) return null;
  if (against === 'speed') return Number.isFinite(head.rpm) ? head.rpm : null;
  return head.runId === runId ? head.timeS : null;
}
