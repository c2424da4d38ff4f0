import { useEffect, useMemo, useState } from 'react';
import { baseName, csvText, downloadCsv, round } from '../analysis/export';
import { averagedOver, bandLevels, binGains } from '../analysis/spectra';
import { dbUnit } from '../map/level-reference';
import { useStore } from '../session/store';
import { BandBars } from './band-bars';
import { BenchPanel } from './bench-panel';
import { CsvButton, PLOT_HEIGHT, useDockInputs } from './dock-inputs';

/** Third-octave band levels and the overall level of the spectra in the map's visible x range. */
export function BandsPanel() {
  const p = useDockInputs();
  const view = useStore(p.stores.viewport);
  const [range, setRange] = useState<[number, number] | null>(null);
  useEffect(() => {
    const t = setTimeout(() => setRange(view ? [view.x[0], view.x[1]] : null), 150);
    return () => clearTimeout(t);
  }, [view]);
  const unit = `${dbUnit(p.weighting)} re ${p.reference.label}`;
  const against = p.against === 'speed' && p.frameRpm ? 'speed' : 'time';
  // the map's mean squares fill in place: the frames done so far say when there are more to average
  const framesDone = p.ready ? (p.power?.layout.frames ?? 0) : (p.power?.frames ?? 0);
  const result = useMemo(() => {
    if (!p.power || !range || framesDone === 0) return null;
    const avg = averagedOver(p.power.power, p.power.layout, framesDone, against, range, p.frameRpm);
    if (!avg) return null;
    return { ...bandLevels(avg.avg, p.power.layout, binGains(p.power.layout, p.weighting), p.enbwBins, p.reference.refRms), frames: avg.frames };
  }, [p.power, framesDone, range, against, p.frameRpm, p.weighting, p.enbwBins, p.reference.refRms]);

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

