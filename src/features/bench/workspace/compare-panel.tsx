import { useMemo } from 'react';
import type uPlot from 'uplot';
import { seriesColours } from '../../../config/theme';
import { carrierSummary, groupDigits } from '../analysis/findings-text';
import { BenchPanel, smallSelectClass, toolButtonClass } from '../components/bench-panel';
import { plotAxis, UPlotChart } from '../components/uplot-chart';
import { useBench, useBenchActions } from '../session/bench-session';
import { ExceedanceList, targetOnGrid, type RunExceedance } from './target-check';
import { useComparisonSummary } from './use-comparison-summary';
import { palette } from '../../../config/theme';
import { frameAtRpm } from '../analysis/spectra';
import { lineHz } from '../map/guides';
import { FindingsTable } from './findings-table';

/** The index of the grid point nearest a value (−1 on an empty grid). */
function nearestIndex(xs: number[], v: number): number {
  let best = -1;
  for (let k = 0; k < xs.length; k++) if (best < 0 || Math.abs(xs[k] - v) < Math.abs(xs[best] - v)) best = k;
  return best;
}

function medianOf(v: Float64Array): number {
  const s = Array.from(v).filter(Number.isFinite).sort((a, b) => a - b);
  return s.length ? s[s.length >> 1] : Number.NaN;
}

const values = (v: Float64Array) => Array.from(v, (x) => (Number.isFinite(x) ? x : null));
const rpmTicks = (_u: uPlot, splits: number[]) => splits.map((v) => String(Math.round(v)));

function runSeries(names: string[], dashedFirst = false): uPlot.Series[] {
  return [{}, ...names.map((name, i) => ({ label: name, stroke: seriesColours[i % seriesColours.length], width: 1.5, spanGaps: false, ...(dashedFirst && i === 0 ? { dash: [6, 4] } : {}) }))];
}

/**
 * The runs side by side in numbers: one tracked guide from every run against speed with its difference
 * from the baseline, every run's carrier against speed, and the findings of each run.
 */
export function ComparePanel() {
  const a = useBenchActions();
  const summary = useComparisonSummary();
  const { runs, names, against, selected, line, rpmStep, unit, track, target, found, carriers, goals } = summary;
  const speedKnown = useBench((s) => s.frameRpm !== null);
  const frameRpm = useBench((s) => s.frameRpm);
  const layout = useBench((s) => s.map.layout);
  const weighting = useBench((s) => s.settings.weighting);
  const showExceedance = (e: RunExceedance) => {
    if (!line || !frameRpm || !layout) return;
    const frame = frameAtRpm(frameRpm, e.atRpm);
    const hz = lineHz(line, frame);
    if (Number.isFinite(hz)) a.goTo({ timeS: layout.t0S + frame * layout.hopS, fromHz: hz * 0.85, toHz: hz * 1.15 });
  };

  const withTarget = target !== null;
  const levelOptions = useMemo(
    () => ({
      scales: { x: { time: false } },
      axes: [plotAxis('Speed (rpm)', { values: rpmTicks }), plotAxis(unit, { size: 48 })],
      series: [...runSeries(names), ...(withTarget ? [{ label: 'target', stroke: palette.danger, width: 1.5, dash: [6, 4] }] : [])],
    }),
    // eslint-disable-next-line react-hooks/exhaustive-deps -- the names' text, not the array, makes new options
    [unit, names.join('\n'), withTarget],
  );
  const deltaOptions = useMemo(
    () => ({ scales: { x: { time: false } }, axes: [plotAxis('Speed (rpm)', { values: rpmTicks }), plotAxis('Δ dB', { size: 48 })], series: runSeries(names, true) }),
    // eslint-disable-next-line react-hooks/exhaustive-deps -- as above
    [names.join('\n')],
  );
  // each run's shifts are marked on its carrier line: the grid point nearest the shift's speed
  const shiftRpms = runs.map((r) => (r.state.report?.carrierShifts ?? []).map((x) => x.rpm).filter(Number.isFinite));
  const shiftKey = JSON.stringify(shiftRpms);
  const carrierOptions = useMemo(
    () => ({
      scales: { x: { time: false } },
      axes: [plotAxis('Speed (rpm)', { values: rpmTicks }), plotAxis('Carrier (Hz)', { size: 56 })],
      series: runSeries(names).map((series, i) =>
        i === 0
          ? series
          : {
              ...series,
              points: {
                show: true,
                size: 8,
                filter: (u: uPlot) => (JSON.parse(shiftKey)[i - 1] as number[]).map((rpm) => nearestIndex(u.data[0] as number[], rpm)).filter((k) => k >= 0),
              },
            },
      ),
    }),
    // eslint-disable-next-line react-hooks/exhaustive-deps -- as above
    [names.join('\n'), shiftKey],
  );

  if (runs.length < 2) return null;
  return (
    <BenchPanel title="Comparison" testId="compare-panel">
      <div className="flex flex-col gap-4 text-xs">
        <ul className="flex flex-wrap gap-x-4 gap-y-1" data-testid="compare-legend">
          {runs.map((r, i) => (
            <li key={r.id} className="flex items-center gap-1.5">
              <span className="inline-block h-0.5 w-4 rounded" style={{ background: seriesColours[i % seriesColours.length] }} aria-hidden />
              <span className="font-mono text-mist-100">{r.name}</span>
              {r.baseline && <span className="text-mist-500">(baseline)</span>}
            </li>
          ))}
        </ul>
        {against !== 'speed' ? (
          <p className="text-mist-300">
            Runs are compared against speed, on one grid.{' '}
            <button type="button" className={toolButtonClass()} disabled={!speedKnown} onClick={() => a.setAgainst('speed')}>
              Map against speed
            </button>
          </p>
        ) : !line ? (
          <p className="text-mist-500">Tick a guide in the guides panel: its track in every run, and each run’s difference from the baseline, show here.</p>
        ) : (
          <section aria-label="Tracks compared" className="flex flex-col gap-2">
            <div className="flex items-center gap-2">
              <span className="text-mist-300">Track</span>
              <select className={smallSelectClass} aria-label="Track to compare" value={line.id} onChange={(e) => summary.chooseTrack(e.target.value)}>
                {selected.map((l) => (
                  <option key={l.id} value={l.id}>
                    {l.label}
                  </option>
                ))}
              </select>
              <span className="text-mist-500">grid {groupDigits(rpmStep)} rpm</span>
            </div>
            {track ? (
              <div className="grid gap-3 @3xl:grid-cols-2">
                <div className="h-56">
                  <UPlotChart
                    options={levelOptions}
                    data={[Array.from(track.grid), ...track.db.map(values), ...(target ? [values(targetOnGrid(track.grid, target.points))] : [])]}
                    label={`${line.label} in every run against speed${target ? ', with its target' : ''}`}
                    testId="compare-tracks-plot"
                  />
                </div>
                <div className="h-56">
                  <UPlotChart options={deltaOptions} data={[Array.from(track.grid), ...track.delta.map(values)]} label={`${line.label}: each run less the baseline`} testId="compare-delta-plot" />
                </div>
              </div>
            ) : null}
            {track ? (
              <ul className="flex flex-wrap gap-x-5 gap-y-1 font-mono text-mist-300" data-testid="compare-deltas">
                {runs.slice(1).map((r, i) => {
                  const d = medianOf(track.delta[i + 1]);
                  return (
                    <li key={r.id} data-run={r.name} data-median-delta={Number.isFinite(d) ? d.toFixed(2) : undefined}>
                      {line.label}, {r.name}: {Number.isFinite(d) ? `${d >= 0 ? '+' : '−'}${Math.abs(d).toFixed(1)} dB` : '—'} <span className="text-mist-500">(median over the speeds both cover)</span>
                    </li>
                  );
                })}
              </ul>
            ) : (
              <p className="text-mist-500">Tracking {line.label} in every run…</p>
            )}
            <TargetLine goals={goals} lineLabel={line.label} weighting={weighting} hasTarget={target !== null} />
            {track && target && <ExceedanceList items={found} targetName={line.label} onShow={showExceedance} />}
          </section>
        )}
        <section aria-label="Carrier schedules" className="flex flex-col gap-2">
          <p className="text-mist-300">Carrier against speed</p>
          {carriers.grid.length > 0 ? (
            <div className="h-48">
              <UPlotChart options={carrierOptions} data={[Array.from(carriers.grid), ...carriers.hz.map(values)]} label="The carrier of every run against speed" testId="compare-carrier-plot" />
            </div>
          ) : (
            <p className="text-mist-500">The carriers come with each run’s speed and findings.</p>
          )}
          <p className="font-mono text-mist-500" data-testid="compare-carriers">
            {runs.map((r) => `${r.name}: ${r.state.report ? carrierSummary(r.state.report) : '…'}`).join(' · ')}
          </p>
        </section>
        <FindingsTable runs={runs} rows={summary.rows} referenceLabel={summary.referenceLabel} />
      </div>
    </BenchPanel>
  );
}

/** Which project's targets are checked, and whether this track has one at this weighting. */
function TargetLine({ goals, lineLabel, weighting, hasTarget }: { goals: ReturnType<typeof useComparisonSummary>['goals']; lineLabel: string; weighting: string; hasTarget: boolean }) {
  if (goals.projects.length === 0) return null;
  return (
    <p className="flex flex-wrap items-center gap-2 text-mist-500">
      Targets of
      <select className={smallSelectClass} aria-label="Project whose targets are checked" value={goals.projectId ?? ''} onChange={(e) => goals.setProjectId(Number(e.target.value))}>
        {goals.projects.map((p) => (
          <option key={p.id} value={p.id}>
            {p.name}
          </option>
        ))}
      </select>
      {goals.error ? <span className="text-danger">{goals.error.message}</span> : hasTarget ? <span>the target of {lineLabel} ({weighting}) is drawn dashed.</span> : <span>no target for {lineLabel} at weighting {weighting}.</span>}
    </p>
  );
}
