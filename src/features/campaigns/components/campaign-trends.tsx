import { useEffect, useMemo, useRef, useState } from 'react';
import type uPlot from 'uplot';
import { Notice } from '../../../components/ui/notice';
import { compactSelectClass } from '../../../components/ui/styles';
import { themeColour } from '../../../config/theme';
import { plotAxis, UPlotChart } from '../../bench';
import { TRENDS_MAX_RESULTS, useAllCampaignResults } from '../api/campaigns';
import { baseName, formatDb, formatRpm } from '../result-format';
import { buildTrend, type TrendPoint } from '../trend-points';
import { anyTrack, tagNames, trendKeyLabel, trendKeys, type LevelMeasure } from '../trends';
import { TrendPointCard } from './trend-point-card';

/** A click nearer than this to a point, in CSS pixels, picks it. */
const PICK_RADIUS_PX = 12;
const RECEIVED_ORDER = '';

/**
 * Trends: one track's level (its peak, or at a chosen speed) against a tag, one point per recording,
 * the points beyond the Hampel fences flagged. Clicking a point shows its row and, when the files are in
 * this browser, the way to its comparison with the baseline.
 */
export function CampaignTrends({ projectId, campaignId, done }: { projectId: number; campaignId: number; done: number }) {
  const { data, isPending, error } = useAllCampaignResults(projectId, campaignId, done);
  const results = useMemo(() => data?.results ?? [], [data]);
  const keys = useMemo(() => trendKeys(results), [results]);
  const tags = useMemo(() => tagNames(results), [results]);
  const [key, setKey] = useState('');
  const [measureKind, setMeasureKind] = useState<'peak' | 'at-speed'>('peak');
  const [rpmText, setRpmText] = useState('3000');
  const [tag, setTag] = useState<string | null>(null);
  const [baselineId, setBaselineId] = useState<number | null>(null);
  const [selectedId, setSelectedId] = useState<number | null>(null);

  const shownKey = keys.includes(key) ? key : (keys[0] ?? '');
  // the summaries hold each strongest family's peak only; a level at a speed needs the raw track
  const tracked = useMemo(() => anyTrack(results, shownKey), [results, shownKey]);
  const shownTag = tag ?? tags[0] ?? RECEIVED_ORDER;
  const rpm = Number(rpmText);
  const atSpeed = measureKind === 'at-speed' && tracked;
  const measure = useMemo((): LevelMeasure | null => (!atSpeed ? { kind: 'peak' } : Number.isFinite(rpm) && rpm > 0 ? { kind: 'at-speed', rpm } : null), [atSpeed, rpm]);
  const trend = useMemo(() => (shownKey && measure ? buildTrend(results, shownKey, measure, shownTag || null) : null), [results, shownKey, measure, shownTag]);
  const okResults = results.filter((r) => r.ok);
  const baseline = okResults.find((r) => r.id === baselineId) ?? null;
  const selected = trend?.points.find((p) => p.result.id === selectedId) ?? null;

  const pointsRef = useRef<TrendPoint[]>([]);
  pointsRef.current = trend?.points ?? [];
  const fencesRef = useRef(trend?.fences ?? []);
  fencesRef.current = trend?.fences ?? [];

  const categories = trend?.axis.kind === 'categorical' ? trend.axis.values : null;
  const options = useMemo((): Omit<uPlot.Options, 'width' | 'height'> => {
    const pointSeries = (label: string, colour: () => string, size: number): uPlot.Series => ({
      label,
      stroke: colour(),
      paths: () => null,
      points: { show: true, size, width: 1.5, stroke: colour(), fill: colour() },
    });
    const pick = (u: uPlot, e: MouseEvent) => {
      // from the client position, not offsetX: the event's target may be one of uPlot's cursor lines
      const box = u.over.getBoundingClientRect();
      const [cx, cy] = [e.clientX - box.left, e.clientY - box.top];
      let best = -1;
      let bestD = PICK_RADIUS_PX;
      pointsRef.current.forEach((p, i) => {
        const d = Math.hypot(u.valToPos(p.x, 'x') - cx, u.valToPos(p.db, 'y') - cy);
        if (d < bestD) {
          bestD = d;
          best = i;
        }
      });
      if (best >= 0) setSelectedId(pointsRef.current[best].result.id);
    };
    return {
      scales: { x: { time: false, ...(categories ? { range: [-0.5, categories.length - 0.5] as [number, number] } : {}) } },
      axes: [
        plotAxis(shownTag || 'order received', categories ? { splits: () => categories.map((_, i) => i), values: (_u, splits) => splits.map((v) => categories[v] ?? '') } : {}),
        plotAxis('Level, dB'),
      ],
      series: [{}, pointSeries('level', () => themeColour((p) => p.guide.order), 7), pointSeries('outlier', () => themeColour((p) => p.danger), 10), pointSeries('chosen', () => themeColour((p) => p.accent.DEFAULT), 13)],
      cursor: { drag: { x: false, y: false }, points: { show: false } },
      hooks: {
        ready: [(u) => u.over.addEventListener('click', (e) => pick(u, e))],
        // the median and the Hampel fences, dashed, across the plot (grey: the danger colour marks the flagged points alone)
        draw: [
          (u) => {
            const ctx = u.ctx;
            const [left, right] = [u.bbox.left, u.bbox.left + u.bbox.width];
            ctx.save();
            ctx.setLineDash([4 * devicePixelRatio, 4 * devicePixelRatio]);
            ctx.lineWidth = devicePixelRatio;
            for (const fence of fencesRef.current) {
              const x0 = fence.fromX === null ? left : Math.max(left, u.valToPos(fence.fromX, 'x', true));
              const x1 = fence.toX === null ? right : Math.min(right, u.valToPos(fence.toX, 'x', true));
              for (const [v, colour] of [
                [fence.median, themeColour((p) => p.mist[300])],
                [fence.low, themeColour((p) => p.mist[500])],
                [fence.high, themeColour((p) => p.mist[500])],
              ] as const) {
                const y = u.valToPos(v, 'y', true);
                if (y < u.bbox.top || y > u.bbox.top + u.bbox.height) continue;
                ctx.strokeStyle = colour;
                ctx.beginPath();
                ctx.moveTo(x0, y);
                ctx.lineTo(x1, y);
                ctx.stroke();
              }
            }
            ctx.restore();
          },
        ],
      },
    };
  }, [categories, shownTag]);

  const plotData = useMemo((): uPlot.AlignedData => {
    const pts = trend?.points ?? [];
    return [pts.map((p) => p.x), pts.map((p) => (p.outlier ? null : p.db)), pts.map((p) => (p.outlier ? p.db : null)), pts.map((p) => (p.result.id === selectedId ? p.db : null))];
  }, [trend, selectedId]);

  // a newly drawn fence needs a redraw even when the points are the same
  const chartRef = useRef<uPlot | null>(null);
  useEffect(() => chartRef.current?.redraw(), [trend]);

  if (isPending) return <p className="text-sm text-mist-500">Loading the results for Trends…</p>;
  if (error) return <Notice tone="error">{error.message}</Notice>;
  if (keys.length === 0) return <p className="text-sm text-mist-500">No analysed result names a family or order yet; Trends appear with the first one.</p>;

  const outliers = trend?.points.filter((p) => p.outlier) ?? [];
  const levelText = (p: TrendPoint) => `${trendKeyLabel(shownKey)}: ${formatDb(p.db)} at ${formatRpm(p.rpm)}`;
  return (
    <div className="flex flex-col gap-3 text-sm">
      <div className="flex flex-wrap items-end gap-3 text-xs text-mist-500">
        <label className="flex flex-col gap-1">
          Track
          <select className={compactSelectClass} value={shownKey} onChange={(e) => setKey(e.target.value)} aria-label="Track to plot">
            {keys.map((k) => (
              <option key={k} value={k}>
                {trendKeyLabel(k)}
              </option>
            ))}
          </select>
        </label>
        <label className="flex flex-col gap-1">
          Level
          <select className={compactSelectClass} value={atSpeed ? 'at-speed' : 'peak'} onChange={(e) => setMeasureKind(e.target.value as 'peak' | 'at-speed')} aria-label="Level measure">
            <option value="peak">peak level</option>
            <option value="at-speed" disabled={!tracked}>
              {tracked ? 'level at a speed' : 'level at a speed (needs tracks)'}
            </option>
          </select>
        </label>
        {atSpeed && (
          <label className="flex flex-col gap-1">
            Speed (rpm)
            <input type="number" min={1} className={`${compactSelectClass} w-28`} value={rpmText} onChange={(e) => setRpmText(e.target.value)} aria-label="Speed for the level, rpm" />
          </label>
        )}
        <label className="flex flex-col gap-1">
          Against
          <select className={compactSelectClass} value={shownTag} onChange={(e) => setTag(e.target.value)} aria-label="Tag on the x axis">
            {tags.map((t) => (
              <option key={t} value={t}>
                tag: {t}
              </option>
            ))}
            <option value={RECEIVED_ORDER}>order received</option>
          </select>
        </label>
        <label className="flex flex-col gap-1">
          Baseline
          <select className={compactSelectClass} value={baselineId ?? ''} onChange={(e) => setBaselineId(e.target.value ? Number(e.target.value) : null)} aria-label="Baseline run">
            <option value="">none</option>
            {okResults.map((r) => (
              <option key={r.id} value={r.id}>
                {baseName(r.file)}
              </option>
            ))}
          </select>
        </label>
      </div>
      {atSpeed && !measure && <Notice tone="error">The speed is a number of rpm above 0.</Notice>}
      {data && data.total > data.results.length && (
        <Notice>
          Trends show the first {data.results.length} of {data.total} results (at most {TRENDS_MAX_RESULTS}).
        </Notice>
      )}
      {trend && trend.points.length === 0 && (
        <p className="text-sm text-mist-500" data-testid="trends-summary">
          No recording has a level to plot here: {trend.left.length} left out (failed, without this track{atSpeed ? ` at ${formatRpm(rpm)}` : ''}, or without the tag {shownTag}).
        </p>
      )}
      {trend && trend.points.length > 0 && (
        <>
          <div className="h-72 w-full">
            <UPlotChart options={options} data={plotData} onChart={(u) => (chartRef.current = u)} testId="campaign-trends-plot" label={`${trendKeyLabel(shownKey)} level against ${shownTag || 'the order received'}, one point per recording`} />
          </div>
          <p className="text-xs text-mist-500" data-testid="trends-summary">
            {trend.points.length} recordings plotted, {outliers.length} flagged
            {trend.left.length > 0 && `; ${trend.left.length} left out (failed, without this track or speed, or without the tag)`}.{' '}
            {trend.axis.kind === 'categorical'
              ? `Flagged: further than 3 × 1.4826·MAD from the median of its own ${shownTag} (Hampel identifier; dashed lines, drawn where a ${shownTag} has three runs or more with some spread).`
              : trend.fences[0]
                ? `Flagged: further than 3 × 1.4826·MAD = ${(3 * trend.fences[0].scaledMad).toFixed(1)} dB from the median ${formatDb(trend.fences[0].median)} (Hampel identifier; dashed lines).`
                : 'Outliers are judged from three runs or more with some spread.'}{' '}
            Click a point to see its row.
          </p>
          {outliers.length > 0 && (
            <ul className="flex flex-wrap gap-2 text-xs" aria-label="Flagged recordings">
              {outliers.map((p) => (
                <li key={p.result.id}>
                  <button type="button" className="rounded px-2 py-0.5 text-danger ring-1 ring-danger/50 hover:bg-ink-800" onClick={() => setSelectedId(p.result.id)}>
                    {baseName(p.result.file)} · {formatDb(p.db)}
                  </button>
                </li>
              ))}
            </ul>
          )}
          {selected && <TrendPointCard result={selected.result} level={levelText(selected)} baseline={baseline} projectId={projectId} />}
        </>
      )}
    </div>
  );
}
