import { useEffect, useMemo, useRef } from 'react';
import type uPlot from 'uplot';
import { baseName, csvText, downloadCsv, round } from '../analysis/export';
import { binGains, frameAt, spectrumDb } from '../analysis/spectra';
import { dbUnit } from '../map/level-reference';
import type { BenchPointer } from '../session/live-stores';
import { useStore } from '../session/store';
import { BenchPanel } from './bench-panel';
import { CsvButton, PLOT_HEIGHT, useDockInputs, type DockInputs } from './dock-inputs';
import { plotAxis, UPlotChart } from './uplot-chart';
import { palette, withAlpha } from '../../../config/theme';

/** The frame the slice shows: under the pointer, else at the pinned time, else where the pointer last was, else mid-run. */
function usePointedFrame(p: DockInputs) {
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
  const column = p.against === 'speed' && p.speedRaster && Number.isFinite(rpm) ? Math.floor((rpm - p.speedRaster.raster.xSpan[0]) / p.speedRaster.rpmStep) : frame;
  return { frame, column, timeS: p.layout.t0S + frame * p.layout.hopS, rpm, from: p.pinnedTimeS !== null ? 'pinned' : 'middle of the run' };
}

/** The spectrum at the pointer (or the pinned moment), over the map's visible frequency span. */
export function SlicePanel() {
  const p = useDockInputs();
  const at = usePointedFrame(p);
  const unit = `${dbUnit(p.weighting)} re ${p.reference.label}`;
  const layout = p.power?.layout ?? null;
  const freq = useMemo(() => (layout ? Float64Array.from({ length: layout.bins }, (_, k) => k * layout.binHz) : null), [layout]);
  const inSpeed = p.against === 'speed' && p.speedRaster;
  // the slice changes with the frame (or the speed column), not with every move of the pointer within it
  const column = at ? (inSpeed ? at.column : at.frame) : null;
  const framesDone = p.power?.frames ?? 0;
  const levels = useMemo(() => {
    if (column === null || !p.power || !layout) return null;
    const gains = binGains(layout, p.weighting);
    const bins = layout.bins;
    if (inSpeed && p.speedRaster) {
      const i = Math.max(0, Math.min(p.speedRaster.shown.length - 1, column));
      const row = p.speedRaster.shown[i];
      if (row < 0) return null;
      return spectrumDb(p.speedRaster.map.power.subarray(row * bins, (row + 1) * bins), gains, p.reference.refRms);
    }
    if (column >= framesDone) return null;
    return spectrumDb(p.power.power.subarray(column * bins, (column + 1) * bins), gains, p.reference.refRms);
  }, [column, p.power, framesDone, layout, p.weighting, p.reference.refRms, p.speedRaster, inSpeed]);

  const options = useMemo(
    (): Omit<uPlot.Options, 'width' | 'height'> => ({
      scales: {
        x: { time: false, auto: false },
        y: { auto: false, range: [p.topDb - p.rangeDb, p.topDb + 5] },
      },
      axes: [plotAxis('Frequency (Hz)', { values: (_u, splits) => splits.map((v) => (Math.abs(v) >= 1000 ? `${Number((v / 1000).toPrecision(4))}k` : String(Number(v.toPrecision(4))))) }), plotAxis(unit, { size: 44 })],
      cursor: { drag: { x: false, y: false }, points: { size: 5 } },
      series: [{}, { label: 'level', stroke: palette.guide.order, width: 1, fill: withAlpha(palette.guide.order, 0.08), spanGaps: false }],
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

