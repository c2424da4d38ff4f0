import { useEffect, useLayoutEffect, useRef } from 'react';
import uPlot from 'uplot';
import 'uplot/dist/uPlot.min.css';
import { seriesColours, themeColour } from '../../../config/theme';
import { useThemeShown } from '../../../lib/theme-preference';


/** Axis colours in the theme shown now. */
const themedAxis = (a: uPlot.Axis): uPlot.Axis => ({
  ...a,
  stroke: themeColour((p) => p.mist[300]),
  grid: { ...a.grid, stroke: themeColour((p) => p.ink[800]) },
  ticks: { ...a.ticks, stroke: themeColour((p) => p.ink[600]) },
});

export const plotAxis = (label: string, extra: Partial<uPlot.Axis> = {}): uPlot.Axis => ({
  label,
  stroke: themeColour((p) => p.mist[300]),
  font: '11px "JetBrains Mono", ui-monospace, monospace',
  labelFont: '12px Inter, system-ui, sans-serif',
  labelSize: 20,
  grid: { stroke: themeColour((p) => p.ink[800]), width: 1 },
  ticks: { stroke: themeColour((p) => p.ink[600]), width: 1, size: 4 },
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
  // a chart is made again when the theme changes
  const theme = useThemeShown();

  useLayoutEffect(() => {
    const box = boxRef.current;
    if (!box) return;
    const size = () => ({ width: Math.max(120, box.clientWidth), height: Math.max(80, box.clientHeight) });
    const u = new uPlot({ ...options, axes: options.axes?.map(themedAxis), legend: { show: false }, ...size() }, dataRef.current, box);
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
  }, [options, theme]);

  useEffect(() => {
    plotRef.current?.setData(data);
  }, [data]);

  return <div ref={boxRef} className="fanlight-plot h-full w-full" data-testid={testId} role="img" aria-label={label} />;
}
