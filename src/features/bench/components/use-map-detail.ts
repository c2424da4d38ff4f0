import { useEffect, useRef, type RefObject } from 'react';
import { MapImage, MAX_WIDTH } from '../map/map-image';
import { rasterPart, type MapRaster } from '../map/map-raster';
import type { BenchStores } from '../session/live-stores';


/** After the view stops moving for this long, its part is painted finer. */
const SETTLE_MS = 120;

/**
 * The map's image pools columns beyond MAX_WIDTH (a long recording), so a zoomed-in view would show
 * pooled maxima. Once the view settles on at most MAX_WIDTH raster columns, their part is painted at
 * one pixel per column and drawn over the pooled image; zoomed out again, it goes. The part shares the
 * raster's levels: nothing is computed again but the colours of the columns shown.
 */
export function useMapDetail(
  raster: MapRaster | null,
  stores: BenchStores,
  look: { lut: Uint8Array; topDb: number; rangeDb: number },
  redraw: () => void,
  boxRef: RefObject<HTMLDivElement | null>,
): RefObject<MapImage | null> {
  // the image of the part in view (its `raster` is the part: columns of the map's own levels)
  const detail = useRef<MapImage | null>(null);
  const lookRef = useRef(look);
  lookRef.current = look;
  const redrawRef = useRef(redraw);
  redrawRef.current = redraw;

  useEffect(() => {
    detail.current = null;
    if (boxRef.current) boxRef.current.dataset.detail = '';
    if (!raster || raster.columns <= MAX_WIDTH) return;
    let timer: ReturnType<typeof setTimeout> | null = null;
    const settle = () => {
      timer = null;
      const view = stores.viewport.get();
      const [x0, x1] = raster.xSpan;
      const width = (x1 - x0) / raster.columns;
      const c0 = view ? Math.max(0, Math.floor((view.x[0] - x0) / width) - 1) : 0;
      const c1 = view ? Math.min(raster.columns, Math.ceil((view.x[1] - x0) / width) + 1) : raster.columns;
      const wanted = view !== null && raster.columnsDone >= raster.columns && c1 - c0 <= MAX_WIDTH && c1 > c0;
      const shown = detail.current;
      if (wanted && shown && shown.raster.xSpan[0] <= x0 + c0 * width && shown.raster.xSpan[1] >= x0 + c1 * width) return;
      if (!wanted && !shown) return;
      // a margin on each side, so a small pan stays within the part
      const margin = wanted ? Math.floor((MAX_WIDTH - (c1 - c0)) / 2) : 0;
      const a = Math.max(0, c0 - margin);
      const b = Math.min(raster.columns, c1 + margin);
      const { lut, topDb, rangeDb } = lookRef.current;
      detail.current = wanted ? new MapImage(rasterPart(raster, a, b), lut, topDb, rangeDb) : null;
      if (boxRef.current) boxRef.current.dataset.detail = wanted ? `${a}-${b}` : '';
      redrawRef.current();
    };
    const off = stores.viewport.subscribe(() => {
      if (timer) clearTimeout(timer);
      timer = setTimeout(settle, SETTLE_MS);
    });
    // a map that finishes while zoomed in gets its part too
    const offRaster = raster.subscribe(() => {
      if (raster.columnsDone >= raster.columns) {
        if (timer) clearTimeout(timer);
        timer = setTimeout(settle, SETTLE_MS);
      }
    });
    return () => {
      off();
      offRaster();
      if (timer) clearTimeout(timer);
      detail.current = null;
    };
  }, [raster, stores, boxRef]);

  useEffect(() => {
    detail.current?.setLut(look.lut);
  }, [look.lut]);
  useEffect(() => {
    detail.current?.setRange(look.topDb, look.rangeDb);
  }, [look.topDb, look.rangeDb]);

  return detail;
}
