import { useState, type RefObject } from 'react';
import type { AxisTicks } from '../../../components/plot/map-axes';
import { errorMessage } from '../../../lib/error-message';
import { baseName, downloadBlob } from '../analysis/export';
import { canvasToPng, composeMap } from '../map/compose-png';

/** What the exported picture says beside the map: its colour bar and its title lines. */
export interface PngLegend {
  lut: Uint8Array;
  topDb: number;
  rangeDb: number;
  scaleLabel: string;
  title: string;
  subtitle: string;
}

/** The map as shown (levels, guides, axes, colour bar) composed into one PNG and downloaded. */
export function useMapPngExport(boxRef: RefObject<HTMLDivElement | null>, axes: { left: AxisTicks | null; bottom: AxisTicks | null }, legend: PngLegend) {
  const [exportSize, setExportSize] = useState<string | null>(null);
  const [exportError, setExportError] = useState<string | null>(null);
  const exportPng = async () => {
    setExportError(null);
    const map = boxRef.current?.querySelector<HTMLCanvasElement>('[data-testid="map-canvas"]');
    const guides = boxRef.current?.querySelector<HTMLCanvasElement>('[data-testid="map-guides"]');
    if (!map || !guides || !axes.left || !axes.bottom) return;
    const canvas = composeMap({ map, guides, left: axes.left, bottom: axes.bottom, ...legend, dpr: map.width / Math.max(1, map.clientWidth) });
    try {
      const blob = await canvasToPng(canvas);
      setExportSize(`${canvas.width}x${canvas.height}`);
      downloadBlob(blob, `${baseName(legend.title)}-map.png`);
    } catch (e) {
      setExportError(errorMessage(e));
    }
  };
  return { exportPng, exportSize, exportError };
}
