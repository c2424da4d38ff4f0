import { useEffect, useLayoutEffect, useRef } from 'react';
import uPlot from 'uplot';
import 'uplot/dist/uPlot.min.css';
import { palette, seriesColours } from '../../../config/theme';

export const plotAxis = (label: string, extra: Partial<uPlot.Axis> = {}): uPlot.Axis => ({
  label,
  stroke: palette.mist[300],
  font: '11px "JetBrains Mono", ui-monospace, monospace',
  labelFont: '12px Inter, system-ui, sans-serif',
  labelSize: 20,
  grid: { stroke: 'rgba(255,255,255,0.06)', width: 1 },
  ticks: { stroke: palette.ink[600], width: 1, size: 4 },
  ...extra,
});

/** Series colours for tracks: the accent first, then quiet ones that stay apart on the dark ground. */
export const SERIES_COLOURS = seriesColours;

/**
 * A uPlot chart that fills its box (its legend is the caller's own, in React): made once per `options` (the caller memoises them), fed new data
 * with setData, resized with its box. `onChart` hands the instance out (cursor syncing, exports).
 */
export function UPlotChart({
  options,
  data,
  onChart,
  testId,
  label,
}: {
  options: Omit<uPlot.Options, 'width' | 'height'>;
  data: uPlot.AlignedData;
  onChart?: (u: uPlot | null) => void;
  testId?: string;
  label: string;
}) {
  const boxRef = useRef<HTMLDivElement>(null);
  const plotRef = useRef<uPlot | null>(null);
  const dataRef = useRef(data);
  dataRef.current = data;
  const onChartRef = useRef(onChart);
  onChartRef.current = onChart;

  useLayoutEffect(() => {
    const box = boxRef.current;
    if (!box) return;
    const size = () => ({ width: Math.max(120, box.clientWidth), height: Math.max(80, box.clientHeight) });
    const u = new uPlot({ ...options, legend: { show: false }, ...size() }, dataRef.current, box);
    plotRef.current = u;
    onChartRef.current?.(u);
    const observer = new ResizeObserver(() => u.setSize(size()));
    observer.observe(box);
    return () => {
      observer.disconnect();
      onChartRef.current?.(null);
      plotRef.current = null;
      u.destroy();
    };
  }, [options]);

  useEffect(() => {
    plotRef.current?.setData(data);
  }, [data]);

  return <div ref={boxRef} className="fanlight-plot h-full w-full" data-testid={testId} role="img" aria-label={label} />;
}
