import { useMemo } from 'react';
import type uPlot from 'uplot';
import { baseName, csvText, downloadCsv, round } from '../analysis/export';
import { alignTracks } from '../analysis/spectra';
import { uniqueLabels } from '../map/guides';
import { dbUnit } from '../map/level-reference';
import { useBench } from '../session/bench-session';
import { BenchPanel } from './bench-panel';
import { useCursorSync } from './cursor-sync';
import { usePlayHeadOnPlot } from '../listen/use-play-head-on-plot';
import { CsvButton, PLOT_HEIGHT, useDockInputs } from './dock-inputs';
import { plotAxis, SERIES_COLOURS, UPlotChart } from './uplot-chart';
import { themeColour } from '../../../config/theme';
import { useThemeShown } from '../../../lib/theme-preference';

/** The tracks of the ticked guides (the session computes them in a worker), against time or speed. */
export function TracksPanel() {
  const p = useDockInputs();
  const selected = useBench((s) => s.selected);
  const computed = useBench((s) => s.tracks);
  const unit = `${dbUnit(p.weighting)} re ${p.reference.label}`;
  const against = p.against;
  useThemeShown(); // re-render on a theme switch, so the markers take its colour
  const markerFill = themeColour((c) => c.ink[900]);
  const tracks = useMemo(() => {
    if (!p.ready || computed.kind !== 'done' || selected.length === 0) return null;
    const byId = new Map(selected.map((l) => [l.id, l]));
    const series = computed.value.flatMap((t) => {
      const line = byId.get(t.id);
      return line ? [{ ...t, line }] : [];
    });
    if (series.length === 0) return null;
    return { series, aligned: alignTracks(series, against, p.rpmStep), names: uniqueLabels(selected) };
  }, [p.ready, computed, selected, against, p.rpmStep]);

  const options = useMemo((): Omit<uPlot.Options, 'width' | 'height'> | null => {
    if (!tracks) return null;
    return {
      scales: { x: { time: false } },
      axes: [plotAxis(against === 'time' ? 'Time (s)' : 'Speed (rpm)', { values: (_u, splits) => splits.map((v) => String(Number(v.toPrecision(6)))) }), plotAxis(unit, { size: 48 })],
      cursor: { drag: { x: false, y: false }, points: { size: 6 } },
      series: [
        {},
        ...tracks.series.map((s, i) => {
          const colour = SERIES_COLOURS[i % SERIES_COLOURS.length];
          // a sum where another guide is inside the band and the filter did not separate them
          const summed = tracks.aligned.crossing[i].map((c, j) => c && !tracks.aligned.filtered[i][j]);
          return {
            label: tracks.names.get(s.line.id) ?? s.line.label,
            stroke: colour,
            width: 1.5,
            spanGaps: false,
            points: {
              show: true,
              size: 6,
              width: 1.25,
              stroke: colour,
              fill: markerFill,
              // hollow markers only where another guide falls inside the band
              filter: () => summed.flatMap((c, j) => (c ? [j] : [])),
            },
          } satisfies uPlot.Series;
        }),
      ],
    };
  }, [tracks, against, unit, markerFill]);

  const data = useMemo((): uPlot.AlignedData => (tracks ? [tracks.aligned.x, ...tracks.aligned.rows] : [[]]), [tracks]);
  const syncCursor = useCursorSync(p.stores, against, p.frameTimes, p.frameRpm);
  const showPlayHead = usePlayHeadOnPlot(against);
  const onChart = (u: uPlot | null) => {
    syncCursor(u);
    showPlayHead(u);
  };

  const exportCsv = () => {
    if (!tracks) return;
    const { x, rows, crossing, filtered } = tracks.aligned;
    const header = [against === 'time' ? 'time (s)' : 'speed (rpm)', ...(against === 'time' && p.frameRpm ? ['speed (rpm)'] : [])];
    for (const s of tracks.series) {
      const name = tracks.names.get(s.line.id) ?? s.line.label;
      header.push(`${name} level (${unit})`, `${name} crossing`, `${name} filtered`);
    }
    const out = x.map((xv, j) => {
      const row: (string | number | null)[] = [round(xv, against === 'time' ? 4 : 1)];
      if (against === 'time' && p.frameRpm) row.push(round(p.frameRpm[j], 1));
      rows.forEach((r, i) => row.push(r[j] === null ? null : round(r[j]!, 2), crossing[i][j] ? 1 : 0, filtered[i][j] ? 1 : 0));
      return row;
    });
    downloadCsv(csvText(header, out), `${baseName(p.recordingName)}-tracks.csv`);
  };

  const crossings = tracks ? tracks.aligned.crossing.some((c, i) => c.some((v, j) => v && !tracks.aligned.filtered[i][j])) : false;
  const separated = tracks ? tracks.aligned.filtered.some((c) => c.some(Boolean)) : false;
  return (
    <BenchPanel
      title="Tracks"
      actions={
        <CsvButton testId="export-tracks-csv" disabled={!tracks} onClick={exportCsv} />
      }
    >
      {options && tracks ? (
        <div className={PLOT_HEIGHT}>
          <UPlotChart options={options} data={data} onChart={onChart} label={`Tracks against ${against}`} testId="tracks-plot" />
        </div>
      ) : (
        <p className="flex h-16 items-center justify-center px-6 text-center text-xs text-mist-500">
          {!p.ready
            ? 'The tracks come once the map is complete.'
            : computed.kind === 'error'
              ? computed.message
              : selected.length > 0
                ? 'Tracking the ticked guides…'
                : 'Tick guides in the guides panel (or add an order with g) to track their level here.'}
        </p>
      )}
      {tracks && (
        <div className="mt-2 flex flex-wrap items-center gap-x-4 gap-y-1 text-[11px]" data-testid="tracks-legend">
          {tracks.series.map((s, i) => (
            <span key={s.line.id} className="flex items-center gap-1.5">
              <span className="inline-block h-0.5 w-4 rounded" style={{ background: SERIES_COLOURS[i % SERIES_COLOURS.length] }} aria-hidden />
              <span className="font-mono text-mist-100">{tracks.names.get(s.line.id) ?? s.line.label}</span>
              <span className="font-mono text-mist-500">{s.line.detail}</span>
            </span>
          ))}
          {crossings && (
            <span className="ml-auto text-mist-500">
              <span className="mr-1 inline-block h-2 w-2 rounded-full border border-mist-300 align-middle" aria-hidden />
              another guide inside the band: the level is a sum there
            </span>
          )}
          {separated && (
            <span className={`${crossings ? '' : 'ml-auto '}text-mist-500`} data-testid="tracks-filtered">
              where guides cross, each level is separated by the Vold–Kalman filter
            </span>
          )}
        </div>
      )}
    </BenchPanel>
  );
}

