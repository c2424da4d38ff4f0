import { memo, useEffect, useMemo, useRef, useState, type PointerEvent } from 'react';
import type uPlot from 'uplot';
import type { StftLayout } from '../../../../workers/dsp/stft';
import type { Weighting } from '../../../../workers/dsp/weighting';
import type { WindowName } from '../../../../workers/dsp/window';
import { alignTracks, averagedOver, bandLevels, binGains, computeTracks, frameAt, frameAtRpm, spectrumDb, type BandLevel } from '../analysis/spectra';
import { baseName, csvText, downloadCsv, round } from '../analysis/export';
import type { MapPower } from '../hooks/use-map-computation';
import { uniqueLabels, type GuideLine } from '../map/guides';
import { dbUnit, type LevelReference } from '../map/level-reference';
import type { SpeedRaster } from '../map/speed-raster';
import { ticks } from '../map/axis-ticks';
import type { BenchPointer, BenchStores } from '../state/bench-stores';
import { useStore } from '../state/store';
import { BenchPanel, toolButtonClass } from './bench-panel';
import { plotAxis, SERIES_COLOURS, UPlotChart } from './uplot-chart';

const PLOT_HEIGHT = 'h-56';

export interface DockProps {
  recordingName: string;
  power: MapPower | null;
  ready: boolean;
  layout: StftLayout | null;
  lines: GuideLine[];
  against: 'time' | 'speed';
  frameTimes: Float64Array | null;
  frameRpm: Float64Array | null;
  rpmStep: number;
  speedRaster: SpeedRaster | null;
  windowName: WindowName;
  enbwBins: number;
  weighting: Weighting;
  reference: LevelReference;
  topDb: number;
  rangeDb: number;
  stores: BenchStores;
  pinnedTimeS: number | null;
}


/** The dock below the map: tracks of the tracked guides, the spectrum slice at the pointer, the band levels. */
export const Dock = memo(function Dock(p: DockProps) {
  return (
    <div className="grid gap-4 @3xl:grid-cols-2 @[96rem]:grid-cols-[minmax(0,1.45fr)_minmax(0,1fr)_minmax(0,1fr)]" data-testid="dock">
      <div className="@3xl:col-span-2 @[96rem]:col-span-1">
        <TracksPanel {...p} />
      </div>
      <SlicePanel {...p} />
      <BandsPanel {...p} />
    </div>
  );
});

function TracksPanel(p: DockProps) {
  const selected = useMemo(() => p.lines.filter((l) => l.selected), [p.lines]);
  const unit = `${dbUnit(p.weighting)} re ${p.reference.label}`;
  const against = p.against === 'speed' && p.frameRpm ? 'speed' : 'time';
  const tracks = useMemo(() => {
    if (!p.ready || !p.power || selected.length === 0) return null;
    const series = computeTracks(selected, p.lines, p.power.power, p.power.layout, p.windowName, p.enbwBins, against, p.frameRpm, p.rpmStep, p.weighting, p.reference.refRms);
    return { series, aligned: alignTracks(series, against, p.rpmStep), names: uniqueLabels(selected) };
  }, [p.ready, p.power, selected, p.lines, p.windowName, p.enbwBins, against, p.frameRpm, p.rpmStep, p.weighting, p.reference.refRms]);

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
          const crossing = tracks.aligned.crossing[i];
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
              fill: '#121821',
              // hollow markers only where another guide falls inside the band
              filter: () => crossing.flatMap((c, j) => (c ? [j] : [])),
            },
          } satisfies uPlot.Series;
        }),
      ],
    };
  }, [tracks, against, unit]);

  const data = useMemo((): uPlot.AlignedData => (tracks ? [tracks.aligned.x, ...tracks.aligned.rows] : [[]]), [tracks]);
  const onChart = useCursorSync(p.stores, against, p.frameTimes, p.frameRpm);

  const exportCsv = () => {
    if (!tracks) return;
    const { x, rows, crossing } = tracks.aligned;
    const header = [against === 'time' ? 'time (s)' : 'speed (rpm)', ...(against === 'time' && p.frameRpm ? ['speed (rpm)'] : [])];
    for (const s of tracks.series) {
      const name = tracks.names.get(s.line.id) ?? s.line.label;
      header.push(`${name} level (${unit})`, `${name} crossing`);
    }
    const out = x.map((xv, j) => {
      const row: (string | number | null)[] = [round(xv, against === 'time' ? 4 : 1)];
      if (against === 'time' && p.frameRpm) row.push(round(p.frameRpm[j], 1));
      rows.forEach((r, i) => row.push(r[j] === null ? null : round(r[j]!, 2), crossing[i][j] ? 1 : 0));
      return row;
    });
    downloadCsv(csvText(header, out), `${baseName(p.recordingName)}-tracks.csv`);
  };

  const crossings = tracks ? tracks.aligned.crossing.some((c) => c.some(Boolean)) : false;
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
          {!p.ready ? 'The tracks come once the map is complete.' : 'Tick guides in the guides panel (or add an order with g) to track their level here.'}
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
        </div>
      )}
    </BenchPanel>
  );
}

/**
 * The plot's cursor follows the map's pointer; the plot's own cursor shows on the map as a line.
 * Returns the callback to hand the chart to.
 */
function useCursorSync(stores: BenchStores, against: 'time' | 'speed', frameTimes: Float64Array | null, frameRpm: Float64Array | null) {
  const chart = useRef<uPlot | null>(null);
  const ctx = useRef({ against, frameTimes, frameRpm });
  ctx.current = { against, frameTimes, frameRpm };

  useEffect(() => {
    const follow = () => {
      const u = chart.current;
      const ptr = stores.pointer.get();
      if (!u || (ptr && ptr.from !== 'map')) return;
      const x = ptr ? (ctx.current.against === 'time' ? ptr.timeS : ptr.rpm) : NaN;
      if (!Number.isFinite(x)) u.setCursor({ left: -10, top: -10 }, false);
      else u.setCursor({ left: u.valToPos(x, 'x'), top: u.over.clientHeight / 2 }, false);
    };
    return stores.pointer.subscribe(follow);
  }, [stores]);

  return (u: uPlot | null) => {
    chart.current = u;
    if (!u) return;
    let raf = 0;
    const onMove = () => {
      const { against: a, frameTimes: times, frameRpm: rpm } = ctx.current;
      const left = u.cursor.left ?? -1;
      if (!times || times.length === 0 || left < 0) return;
      const x = u.posToVal(left, 'x');
      const frame =
        a === 'time'
          ? Math.max(0, Math.min(times.length - 1, Math.round(((x - times[0]) / ((times[times.length - 1] - times[0]) / Math.max(1, times.length - 1) || 1)))))
          : rpm
            ? frameAtRpm(rpm, x)
            : 0;
      const ptr: BenchPointer = { x, f: NaN, timeS: times[frame], rpm: rpm?.[frame] ?? NaN, levelDb: NaN, frame, column: frame, from: 'plot' };
      stores.pointer.set(ptr);
    };
    u.over.addEventListener('mousemove', () => {
      cancelAnimationFrame(raf);
      raf = requestAnimationFrame(onMove);
    });
    u.over.addEventListener('mouseleave', () => {
      cancelAnimationFrame(raf);
      if (stores.pointer.get()?.from === 'plot') stores.pointer.set(null);
    });
  };
}

/** The frame the slice shows: under the pointer, else at the pinned time, else where the pointer last was, else mid-run. */
function usePointedFrame(p: DockProps) {
  const pointer = useStore(p.stores.pointer);
  const last = useRef<BenchPointer | null>(null);
  if (pointer) last.current = pointer;
  if (!p.layout) return null;
  if (pointer) return { frame: pointer.frame, column: pointer.column, timeS: pointer.timeS, rpm: pointer.rpm, from: 'pointer' };
  if (p.pinnedTimeS === null && last.current) {
    const l = last.current;
    return { frame: l.frame, column: l.column, timeS: l.timeS, rpm: l.rpm, from: 'last pointer' };
  }
  const t = p.pinnedTimeS ?? p.layout.t0S + ((p.layout.frames - 1) * p.layout.hopS) / 2;
  const frame = frameAt(p.layout, t);
  const rpm = p.frameRpm?.[frame] ?? NaN;
  const column = p.against === 'speed' && p.speedRaster && Number.isFinite(rpm) ? Math.floor((rpm - p.speedRaster.raster.timeSpanS[0]) / p.speedRaster.rpmStep) : frame;
  return { frame, column, timeS: p.layout.t0S + frame * p.layout.hopS, rpm, from: p.pinnedTimeS !== null ? 'pinned' : 'middle of the run' };
}

function SlicePanel(p: DockProps) {
  const at = usePointedFrame(p);
  const unit = `${dbUnit(p.weighting)} re ${p.reference.label}`;
  const layout = p.power?.layout ?? null;
  const freq = useMemo(() => (layout ? Float64Array.from({ length: layout.bins }, (_, k) => k * layout.binHz) : null), [layout]);
  const inSpeed = p.against === 'speed' && p.speedRaster;
  const key = at ? (inSpeed ? `s${at.column}` : `t${at.frame}`) : '';
  const levels = useMemo(() => {
    if (!at || !p.power || !layout) return null;
    const gains = binGains(layout, p.weighting);
    const bins = layout.bins;
    if (inSpeed && p.speedRaster) {
      const i = Math.max(0, Math.min(p.speedRaster.shown.length - 1, at.column));
      const row = p.speedRaster.shown[i];
      if (row < 0) return null;
      return spectrumDb(p.speedRaster.map.power.subarray(row * bins, (row + 1) * bins), gains, p.reference.refRms);
    }
    if (at.frame >= p.power.frames) return null;
    return spectrumDb(p.power.power.subarray(at.frame * bins, (at.frame + 1) * bins), gains, p.reference.refRms);
  }, [key, p.power, p.power?.frames, layout, p.weighting, p.reference.refRms, p.speedRaster, inSpeed]);

  const options = useMemo(
    (): Omit<uPlot.Options, 'width' | 'height'> => ({
      scales: {
        x: { time: false, auto: false },
        y: { auto: false, range: [p.topDb - p.rangeDb, p.topDb + 5] },
      },
      axes: [plotAxis('Frequency (Hz)', { values: (_u, splits) => splits.map((v) => (Math.abs(v) >= 1000 ? `${Number((v / 1000).toPrecision(4))}k` : String(Number(v.toPrecision(4))))) }), plotAxis(unit, { size: 44 })],
      cursor: { drag: { x: false, y: false }, points: { size: 5 } },
      series: [{}, { label: 'level', stroke: '#7fa7d4', width: 1, fill: 'rgba(127,167,212,0.08)', spanGaps: false }],
    }),
    [unit, p.topDb, p.rangeDb],
  );
  const data = useMemo((): uPlot.AlignedData => (freq && levels ? [freq, levels] : [[]]), [freq, levels]);
  const chart = useRef<uPlot | null>(null);

  // the slice shows the map's visible frequency span
  useEffect(() => {
    const apply = () => {
      const v = p.stores.viewport.get();
      const u = chart.current;
      if (!u || !v) return;
      u.setScale('x', { min: Math.max(0, v.f[0]), max: v.f[1] });
    };
    apply();
    let raf = 0;
    const off = p.stores.viewport.subscribe(() => {
      cancelAnimationFrame(raf);
      raf = requestAnimationFrame(apply);
    });
    return () => {
      off();
      cancelAnimationFrame(raf);
    };
  }, [p.stores, data, options]);

  const exportCsv = () => {
    if (!freq || !levels) return;
    const rows = Array.from(freq, (f, k) => [round(f, 3), round(levels[k], 2)]);
    const where = inSpeed && at ? `${Math.round(at.rpm)}rpm` : at ? `${at.timeS.toFixed(2)}s` : '';
    downloadCsv(csvText(['frequency (Hz)', `level (${unit})`], rows), `${baseName(p.recordingName)}-slice-${where}.csv`);
  };

  return (
    <BenchPanel
      title="Slice"
      actions={
        <CsvButton testId="export-slice-csv" disabled={!levels} onClick={exportCsv} />
      }
    >
      <p className="mb-1 font-mono text-[11px] text-mist-500" data-testid="slice-at">
        {at ? (inSpeed ? `${Math.round(at.rpm)} rpm` : `${at.timeS.toFixed(3)} s${Number.isFinite(at.rpm) ? ` · ${Math.round(at.rpm)} rpm` : ''}`) : '—'}
        {at && <span className="text-mist-500"> ({at.from})</span>}
      </p>
      <div className={PLOT_HEIGHT}>
        {levels ? (
          <UPlotChart options={options} data={data} onChart={(u) => (chart.current = u)} label="Spectrum slice at the pointer" testId="slice-plot" />
        ) : (
          <p className="flex h-full items-center justify-center text-xs text-mist-500">Point at the map to see the spectrum there.</p>
        )}
      </div>
    </BenchPanel>
  );
}

function BandsPanel(p: DockProps) {
  const view = useStore(p.stores.viewport);
  const [range, setRange] = useState<[number, number] | null>(null);
  useEffect(() => {
    const t = setTimeout(() => setRange(view ? [view.x[0], view.x[1]] : null), 150);
    return () => clearTimeout(t);
  }, [view]);
  const unit = `${dbUnit(p.weighting)} re ${p.reference.label}`;
  const against = p.against === 'speed' && p.frameRpm ? 'speed' : 'time';
  const result = useMemo(() => {
    if (!p.power || !range || p.power.frames === 0) return null;
    const avg = averagedOver(p.power.power, p.power.layout, p.power.frames, against, range, p.frameRpm);
    if (!avg) return null;
    return { ...bandLevels(avg.avg, p.power.layout, binGains(p.power.layout, p.weighting), p.enbwBins, p.reference.refRms), frames: avg.frames };
  }, [p.power, p.ready, range, against, p.frameRpm, p.weighting, p.enbwBins, p.reference.refRms]);

  const exportCsv = () => {
    if (!result) return;
    const rows: (string | number | null)[][] = result.bands.map((b) => [b.nominalHz, round(b.centerHz, 2), b.db === null ? null : round(b.db, 2)]);
    rows.push(['overall', null, result.overallDb === null ? null : round(result.overallDb, 2)]);
    downloadCsv(csvText(['nominal frequency (Hz)', 'centre frequency (Hz)', `level (${unit})`], rows), `${baseName(p.recordingName)}-bands.csv`);
  };

  const span = range ? (against === 'time' ? `${Math.max(0, range[0]).toFixed(2)}–${range[1].toFixed(2)} s` : `${Math.max(0, range[0]).toFixed(0)}–${range[1].toFixed(0)} rpm`) : '';
  return (
    <BenchPanel
      title="Band levels"
      actions={
        <CsvButton testId="export-bands-csv" disabled={!result} onClick={exportCsv} />
      }
    >
      <div className="mb-1 flex items-baseline gap-2">
        <p className="font-mono text-[11px] text-mist-500">
          third octaves over the view, {span}
        </p>
        <p className="ml-auto text-[11px] text-mist-500" data-testid="overall-level">
          overall{' '}
          <span className="font-mono text-base text-accent">{result?.overallDb != null ? result.overallDb.toFixed(1) : '—'}</span>{' '}
          <span className="font-mono">{dbUnit(p.weighting)}</span>
        </p>
      </div>
      <div className={PLOT_HEIGHT}>{result ? <BandBars bands={result.bands} unit={unit} /> : <p className="flex h-full items-center justify-center text-xs text-mist-500">The bands come with the map.</p>}</div>
    </BenchPanel>
  );
}

const labelled = new Set([31.5, 63, 125, 250, 500, 1000, 2000, 4000, 8000, 16000]);
const shortHz = (hz: number) => (hz >= 1000 ? `${hz / 1000}k` : String(hz));

/** Third-octave bars on a canvas, with a readout of the band under the pointer. */
function BandBars({ bands, unit }: { bands: BandLevel[]; unit: string }) {
  const ref = useRef<HTMLCanvasElement>(null);
  const [hover, setHover] = useState<number | null>(null);
  const geometry = useRef({ left: 0, barW: 0 });

  useEffect(() => {
    const canvas = ref.current;
    if (!canvas) return;
    const draw = () => {
      const dpr = window.devicePixelRatio || 1;
      const W = Math.max(1, Math.round(canvas.clientWidth * dpr));
      const H = Math.max(1, Math.round(canvas.clientHeight * dpr));
      if (canvas.width !== W) canvas.width = W;
      if (canvas.height !== H) canvas.height = H;
      const ctx = canvas.getContext('2d')!;
      ctx.clearRect(0, 0, W, H);
      const values = bands.map((b) => b.db).filter((v): v is number => v !== null);
      if (!values.length) return;
      const top = Math.ceil(Math.max(...values) / 10) * 10;
      const floor = Math.min(top - 20, Math.floor((Math.min(...values) - 5) / 10) * 10);
      const left = 40 * dpr;
      const bottom = 18 * dpr;
      const plotH = H - bottom - 6 * dpr;
      const barW = (W - left) / bands.length;
      geometry.current = { left: left / dpr, barW: barW / dpr };
      const y = (v: number) => 6 * dpr + ((top - v) / (top - floor)) * plotH;
      ctx.font = `${11 * dpr}px "JetBrains Mono", ui-monospace, monospace`;
      ctx.fillStyle = '#b6c0cf';
      ctx.textAlign = 'right';
      ctx.textBaseline = 'middle';
      ctx.strokeStyle = 'rgba(255,255,255,0.06)';
      for (const v of ticks(floor, top, 5)) {
        ctx.beginPath();
        ctx.moveTo(left, Math.round(y(v)) + 0.5);
        ctx.lineTo(W, Math.round(y(v)) + 0.5);
        ctx.stroke();
        ctx.fillText(String(v), left - 6 * dpr, y(v));
      }
      ctx.textAlign = 'center';
      ctx.textBaseline = 'top';
      bands.forEach((b, i) => {
        const x = left + i * barW;
        if (b.db !== null) {
          ctx.fillStyle = i === hover ? '#f0a93e' : '#5f86b3';
          const yv = Math.max(6 * dpr, y(b.db));
          ctx.fillRect(x + barW * 0.14, yv, barW * 0.72, 6 * dpr + plotH - yv);
        }
        if (labelled.has(b.nominalHz)) {
          ctx.fillStyle = '#8793a6';
          ctx.fillText(shortHz(b.nominalHz), x + barW / 2, H - bottom + 4 * dpr);
        }
      });
    };
    draw();
    const observer = new ResizeObserver(draw);
    observer.observe(canvas);
    return () => observer.disconnect();
  }, [bands, hover]);

  const onMove = (e: PointerEvent<HTMLCanvasElement>) => {
    const rect = e.currentTarget.getBoundingClientRect();
    const { left, barW } = geometry.current;
    const i = Math.floor((e.clientX - rect.left - left) / Math.max(1, barW));
    setHover(i >= 0 && i < bands.length ? i : null);
  };
  const h = hover !== null ? bands[hover] : null;
  return (
    <div className="relative h-full">
      <canvas ref={ref} className="block h-full w-full" role="img" aria-label={`Third-octave band levels in ${unit}`} data-testid="bands-canvas" onPointerMove={onMove} onPointerLeave={() => setHover(null)} />
      <p className="pointer-events-none absolute right-1 top-0 font-mono text-[11px] text-mist-300">
        {h ? `${shortHz(h.nominalHz)}Hz ${h.db === null ? '—' : h.db.toFixed(1)} ${unit.split(' ')[0]}` : ''}
      </p>
    </div>
  );
}

/** A panel's CSV export button. */
function CsvButton({ testId, disabled, onClick }: { testId: string; disabled: boolean; onClick: () => void }) {
  return (
    <button type="button" className={toolButtonClass()} data-testid={testId} disabled={disabled} onClick={onClick}>
      CSV
    </button>
  );
}
