import { useCallback, useEffect, useMemo, useState } from 'react';
import { Notice } from '../../../components/ui/notice';
import { divergingLut } from '../../../lib/plot/colour-scales';
import { carrierSummary, groupDigits } from '../analysis/findings-text';
import type { Extents } from '../map/viewport';
import { DIFFERENCE_RANGE_DB, differenceRaster } from './difference-raster';
import { MapView } from '../components/map-view';
import { BenchPanel, toolButtonClass } from '../components/bench-panel';
import type { OpenRecording } from '../hooks/use-recording-reader';
import { BenchSession, useBench, useBenchActions, useBenchLive, useBenchSnapshot, type BenchState, type FollowedView } from '../session/bench-session';
import type { BenchStores } from '../session/live-stores';
import type { BenchRestore } from '../view-state/view-restore';
import { useComparedRuns } from './use-compared-runs';
import { useWorkspace, useWorkspaceRuns } from './workspace';

/** The baseline's settings as a compared run starts from them (its own speed source and pole pairs). */
function startFrom(s: BenchState, live: BenchStores): BenchRestore {
  return {
    channelIndex: s.settings.channel,
    window: s.settings.windowName,
    blockSize: s.settings.blockSize,
    overlap: s.settings.overlap,
    weighting: s.settings.weighting,
    colours: s.settings.colours,
    topDb: s.topDb,
    rangeDb: s.rangeDb,
    against: s.against,
    swapped: s.swapped,
    viewport: live.viewport.get() ?? { x: [0, 1], f: [0, 1] },
    guides: s.guides,
    poles: { mode: 'inferred' },
    speedSource: null,
  };
}

/**
 * The runs compared with the open recording (the baseline): each a session of its own that follows
 * the baseline's guides, axes, zoom and pointer, shown as a map with the baseline's colour range.
 */
export function ComparedRuns({ fingerprints, onRemove }: { fingerprints: string[]; onRemove: (fingerprint: string) => void }) {
  const runs = useComparedRuns(fingerprints);
  const live = useBenchLive();
  const baselineNow = useBenchSnapshot();
  const topDb = useBench((s) => s.topDb);
  const rangeDb = useBench((s) => s.rangeDb);
  const guides = useBench((s) => s.guides);
  const against = useBench((s) => s.against);
  const swapped = useBench((s) => s.swapped);
  const follow = useMemo((): FollowedView => ({ guides, against, swapped }), [guides, against, swapped]);
  const [start] = useState(() => startFrom(baselineNow(), live));
  return (
    <div className="grid gap-4 @5xl:grid-cols-2" data-testid="compared-runs">
      {runs.map((r) =>
        r.kind === 'ready' ? (
          <ComparedRun key={r.fingerprint} recording={r.recording} start={start} follow={follow} live={live} topDb={topDb} rangeDb={rangeDb} onRemove={() => onRemove(r.fingerprint)} />
        ) : (
          <BenchPanel key={r.fingerprint} title="Compared run">
            {r.kind === 'reading' ? <p className="text-sm text-mist-500">Reading the recording…</p> : <Notice tone="error">{r.message}</Notice>}
            <button type="button" className={`${toolButtonClass()} mt-2`} onClick={() => onRemove(r.fingerprint)}>
              Remove
            </button>
          </BenchPanel>
        ),
      )}
    </div>
  );
}

function ComparedRun({
  recording,
  start,
  follow,
  live,
  topDb,
  rangeDb,
  onRemove,
}: {
  recording: OpenRecording;
  start: BenchRestore;
  follow: FollowedView;
  live: BenchStores;
  topDb: number;
  rangeDb: number;
  onRemove: () => void;
}) {
  const workspace = useWorkspace();
  const id = recording.entry.fingerprint;
  const name = recording.entry.name;
  useEffect(() => () => workspace.withdraw(id), [workspace, id]);
  const publish = useCallback((state: BenchState) => workspace.publish({ id, name, baseline: false, state }), [workspace, id, name]);
  return (
    <BenchSession recording={recording} preferredProjectId={null} start={start} follow={follow} live={live} onPublish={publish}>
      <RunMap name={name} topDb={topDb} rangeDb={rangeDb} onRemove={onRemove} />
    </BenchSession>
  );
}

/** A compared run's map: the same guides, zoom and pointer as the baseline's, and how far its analysis is. */
function RunMap({ name, topDb, rangeDb, onRemove }: { name: string; topDb: number; rangeDb: number; onRemove: () => void }) {
  const a = useBenchActions();
  const [showDifference, setShowDifference] = useState(false);
  const baselineSpeed = useWorkspaceRuns().find((r) => r.baseline)?.state.speedRaster ?? null;
  const runSpeed = useBench((s) => s.speedRaster);
  const live = useBenchLive();
  const raster = useBench((s) => s.raster);
  const lut = useBench((s) => s.lut);
  const extents = useBench((s) => s.extents);
  const against = useBench((s) => s.against);
  const swapped = useBench((s) => s.swapped);
  const lines = useBench((s) => s.lines);
  const frameTimes = useBench((s) => s.frameTimes);
  const frameRpm = useBench((s) => s.frameRpm);
  const runId = useBench((s) => s.recording.entry.fingerprint);
  const status = useBench((s) => s.map.status);
  const report = useBench((s) => s.report);
  const speedMap = useBench((s) => s.speedMap);
  const percent = status.kind === 'computing' ? Math.round(status.fraction * 100) : null;
  const difference = useMemo(
    () => (showDifference && against === 'speed' && baselineSpeed && runSpeed ? differenceRaster(baselineSpeed, runSpeed) : null),
    [showDifference, against, baselineSpeed, runSpeed],
  );
  const diff = difference && 'raster' in difference ? difference : null;
  const shown = diff ? diff.raster : raster;
  const shownExtents = useMemo((): Extents | null => {
    if (!diff) return extents;
    const [f0, f1] = diff.raster.frequencySpanHz;
    return { x: diff.raster.xSpan, f: [f0, f1], minX: 4 * diff.stepRpm, minF: 8 * diff.raster.grid.binHz * diff.raster.binsPerRow };
  }, [diff, extents]);
  return (
    <BenchPanel
      title={name}
      testId="compared-run"
      actions={
        <div className="flex gap-1">
          <button
            type="button"
            className={toolButtonClass(showDifference)}
            aria-pressed={showDifference}
            disabled={against !== 'speed'}
            title={against === 'speed' ? 'This run less the baseline, in dB' : 'Against speed only'}
            onClick={() => setShowDifference((v) => !v)}
          >
            Difference
          </button>
          <button type="button" className={toolButtonClass()} onClick={onRemove} aria-label={`Stop comparing ${name}`}>
            Remove
          </button>
        </div>
      }
    >
      <div className="relative h-72 overflow-hidden rounded-sm bg-ink-950 ring-1 ring-ink-800">
        <MapView
          raster={shown}
          lut={diff ? divergingLut() : lut}
          topDb={diff ? DIFFERENCE_RANGE_DB : topDb}
          rangeDb={diff ? 2 * DIFFERENCE_RANGE_DB : rangeDb}
          extents={shownExtents}
          swapped={swapped}
          against={against}
          lines={lines}
          frameTimes={frameTimes}
          frameRpm={frameRpm}
          pinnedX={null}
          runId={runId}
          mode="pan"
          stores={live}
          markPainted={false}
          probe={a.probe}
          onPick={() => undefined}
          onPin={() => undefined}
          marks={[]}
          onMark={() => undefined}
          label={diff ? `${name} less the baseline, dB, against speed` : `Map of ${name}, on the baseline's zoom and guides`}
        />
        {against === 'speed' && speedMap.kind !== 'done' && (
          <p className="pointer-events-none absolute inset-x-0 top-1/2 text-center text-sm text-mist-300" role="status">
            {speedMap.kind === 'error' ? speedMap.message : 'Resampling the map against speed…'}
          </p>
        )}
      </div>
      {diff && (
        <p className="mt-2 font-mono text-[11px] text-mist-300" data-testid="difference-map-note">
          {name} − baseline: colours from −{DIFFERENCE_RANGE_DB} dB (blue, quieter) through 0 to +{DIFFERENCE_RANGE_DB} dB (amber, louder); grid {groupDigits(diff.stepRpm)} rpm over{' '}
          {groupDigits(diff.fromRpm)}–{groupDigits(diff.toRpm)} rpm, the speeds both runs cover.
        </p>
      )}
      {difference && 'problem' in difference && <p className="mt-2 text-xs text-danger">{difference.problem}</p>}
      <p className="mt-2 font-mono text-[11px] text-mist-500" data-testid="compared-run-status">
        {percent !== null ? `computing the map, ${percent} %` : report ? carrierSummary(report) : status.kind === 'done' ? 'finding the carrier…' : ''}
      </p>
    </BenchPanel>
  );
}
