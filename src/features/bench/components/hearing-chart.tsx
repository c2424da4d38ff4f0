import { useMemo } from 'react';
import type uPlot from 'uplot';
import { speedAtTimes } from '../../../../workers/dsp/hearing-curves';
import { usePlayHeadOnPlot } from '../listen/use-play-head-on-plot';
import type { BenchStores } from '../session/live-stores';
import { useCursorSync } from './cursor-sync';
import { plotAxis, SERIES_COLOURS, UPlotChart } from './uplot-chart';

export interface HearingSeries {
  t: Float64Array;
  v: Float64Array;
}

/**
 * One hearing figure (loudness in sone, tonality in tu) against time or speed. Against speed the
 * moments are placed at the speed the map's frames give them and sorted by it, drawn as points (a
 * run-up that pauses or turns back gives several values at one speed).
 */
export function HearingChart(props: {
  series: HearingSeries;
  unit: string;
  label: string;
  testId: string;
  against: 'time' | 'speed';
  frameTimes: Float64Array | null;
  frameRpm: Float64Array | null;
  stores: BenchStores;
  colour?: string;
}) {
  const { series, against, frameTimes, frameRpm } = props;
  const data = useMemo((): uPlot.AlignedData => {
    if (against === 'time' || !frameTimes || !frameRpm) return [series.t, series.v];
    const rpm = speedAtTimes(series.t, frameTimes, frameRpm);
    const order = Array.from(rpm.keys()).filter((i) => Number.isFinite(rpm[i])).sort((a, b) => rpm[a] - rpm[b]);
    return [Float64Array.from(order, (i) => rpm[i]), Float64Array.from(order, (i) => series.v[i])];
  }, [series, against, frameTimes, frameRpm]);

  const colour = props.colour ?? SERIES_COLOURS[0];
  const options = useMemo(
    (): Omit<uPlot.Options, 'width' | 'height'> => ({
      scales: { x: { time: false } },
      axes: [plotAxis(against === 'time' ? 'Time (s)' : 'Speed (rpm)'), plotAxis(props.unit, { size: 44 })],
      cursor: { drag: { x: false, y: false }, points: { size: 6 } },
      series: [
        {},
        against === 'time'
          ? { label: props.label, stroke: colour, width: 1.5 }
          : { label: props.label, stroke: colour, width: 0, points: { show: true, size: 3, fill: colour, stroke: colour } },
      ],
    }),
    [against, props.unit, props.label, colour],
  );
  const syncCursor = useCursorSync(props.stores, against, frameTimes, frameRpm);
  const showPlayHead = usePlayHeadOnPlot(against);
  const onChart = (u: uPlot | null) => {
    syncCursor(u);
    showPlayHead(u);
  };
  return (
    <div className="h-40">
      <UPlotChart options={options} data={data} onChart={onChart} label={`${props.label} against ${against}`} testId={props.testId} />
    </div>
  );
}
