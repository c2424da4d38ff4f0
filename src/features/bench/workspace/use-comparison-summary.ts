import { createContext, createElement, useContext, useMemo, type ReactNode } from 'react';
import type { ComparisonState } from '../../../../server/schemas/views';
import { dbUnit } from '../map/level-reference';
import { useBench } from '../session/bench-session';
import { compareCarriers, compareTrack, findingsRow } from './comparison';
import { runExceedances, targetFor, targetOnGrid } from './target-check';
import { useComparisonTargets } from './use-comparison-targets';
import { useComparisonChoice, useWorkspaceRuns } from './workspace';

/**
 * Everything the comparison shows, worked out once for its panel and for a save: the chosen track of
 * every run on one grid, the target and its exceedances, the carriers against speed, the findings rows.
 */
function useComparisonModel() {
  const runs = useWorkspaceRuns();
  const [choice, choose] = useComparisonChoice();
  const against = useBench((s) => s.against);
  const selected = useBench((s) => s.selected);
  const rpmStep = useBench((s) => s.rpmStep);
  const weighting = useBench((s) => s.settings.weighting);
  const reference = useBench((s) => s.reference);
  const preferredProjectId = useBench((s) => s.preferredProjectId);
  const goals = useComparisonTargets(preferredProjectId);
  const line = selected.find((l) => l.id === choice.trackId) ?? selected[0] ?? null;
  const names = runs.map((r) => r.name);
  const namesKey = names.join('\n');

  const track = useMemo(() => {
    if (!line || against !== 'speed') return null;
    const tracks = runs.map((r) => (r.state.tracks.kind === 'done' ? (r.state.tracks.value.find((t) => t.id === line.id) ?? null) : null));
    return tracks.some((t) => t === null) ? null : compareTrack(tracks, rpmStep);
  }, [runs, line, against, rpmStep]);
  const carriers = useMemo(() => compareCarriers(runs.map((r) => ({ frameRpm: r.state.frameRpm, carrierHz: r.state.report?.carrier.hz ?? null })), rpmStep), [runs, rpmStep]);
  const target = targetFor(goals.targets, line, weighting);
  // eslint-disable-next-line react-hooks/exhaustive-deps -- the names' text, not the array
  const found = useMemo(() => (track && target ? runExceedances(names, track, target) : []), [track, target, namesKey]);
  const rows = useMemo(() => runs.map((r) => findingsRow(r.state.report, reference)), [runs, reference]);

  return {
    runs,
    names,
    against,
    selected,
    line,
    chooseTrack: (id: string) => choose({ trackId: id }),
    rpmStep,
    weighting,
    unit: `${dbUnit(weighting)} re ${reference.label}`,
    referenceLabel: reference.label,
    goals,
    track,
    target,
    found,
    carriers,
    rows,
  };
}

export type ComparisonSummary = ReturnType<typeof useComparisonModel>;

const Summary = createContext<ComparisonSummary | null>(null);

/** Works the comparison out once for everything under it (its panel, and the save that keeps it). */
export function ComparisonSummaryProvider({ children }: { children: ReactNode }) {
  return createElement(Summary.Provider, { value: useComparisonModel() }, children);
}

export function useComparisonSummary(): ComparisonSummary {
  const s = useContext(Summary);
  if (!s) throw new Error('The comparison was read outside its ComparisonSummaryProvider.');
  return s;
}

const nullable = (v: Float64Array) => Array.from(v, (x) => (Number.isFinite(x) ? Number(x.toPrecision(6)) : null));

/** The comparison as a saved view keeps it (null with fewer than two runs). */
export function comparisonStateOf(s: ComparisonSummary): ComparisonState | null {
  if (s.runs.length < 2) return null;
  const g = s.line?.guide;
  const guide = g?.kind === 'order' ? { kind: 'order' as const, order: g.order } : g?.kind === 'family' && g.per === 'electrical' ? { kind: 'family' as const, m: g.m, n: g.n } : null;
  return {
    runs: s.runs.map((r) => ({ name: r.name, fingerprint: r.id })),
    track: s.line && guide && s.track ? { label: s.line.label, guide } : null,
    unit: s.unit,
    rpm: s.track ? nullable(s.track.grid).map((v) => v ?? 0) : [],
    levels: s.track ? s.track.db.map(nullable) : [],
    target: s.track && s.target ? nullable(targetOnGrid(s.track.grid, s.target.points)) : null,
    exceedances: s.found.map((e) => ({ run: e.run, fromRpm: Math.round(e.fromRpm), toRpm: Math.round(e.toRpm), maxExcessDb: Number(e.maxExcessDb.toFixed(2)), atRpm: Math.round(e.atRpm) })),
    carrierRpm: nullable(s.carriers.grid).map((v) => v ?? 0),
    carrierHz: s.carriers.hz.map(nullable),
    findings: s.rows.map((r) => ({ ...(r ?? { carrier: '', shifts: '', spread: '', poles: '', families: '' }) })),
  };
}
