import { guideTracks } from '../../../../workers/dsp/guide-tracks';
import { snapshotHeader, type SnapshotHeader } from '../../../../workers/io/snapshot-format';
import { issuesText } from '../api/save-view';
import { uniqueLabels } from '../map/guides';
import { dbUnit } from '../map/level-reference';
import type { Viewport } from '../map/viewport';
import { benchViewState, quantiseVisible, snapshotHeaderOf, type BenchViewInputs } from '../view-state/view-snapshot';
import type { BenchState } from './bench-session';

/** What a save takes from the Bench at that moment: the view's state, and the snapshot of what is on screen. */
export interface ViewCapture {
  state: unknown;
  header: SnapshotHeader;
  map: Uint8Array;
  swapped: boolean;
}

/** The tracks the dock shows, named as there; computed now (the same guideTracks) if the dock's are not ready. */
function tracksOf(s: BenchState): BenchViewInputs['tracks'] {
  const { map, selected, lines } = s;
  if (!map.done || !map.power || selected.length === 0) return null;
  const names = uniqueLabels(selected);
  const series =
    s.tracks.kind === 'done' && !s.tracks.stale
      ? s.tracks.value
      : guideTracks({
          power: map.power.power,
          layout: map.power.layout,
          lines: selected,
          shown: lines,
          window: s.settings.windowName,
          enbwBins: s.enbwBins,
          against: s.against,
          frameRpm: s.frameRpm,
          rpmStep: s.rpmStep,
          weighting: s.settings.weighting,
          refRms: s.reference.refRms,
        });
  return {
    series: series.map((t) => ({ name: names.get(t.id) ?? t.id, x: t.x, db: t.db })),
    unit: `${dbUnit(s.settings.weighting)} re ${s.reference.label}`,
  };
}

/** The view and its snapshot as the Bench shows them, or why it cannot be saved yet. */
export function captureView(s: BenchState, view: Viewport | null): ViewCapture | string {
  const { raster, map } = s;
  if (!raster || !view || !map.layout) return 'There is no map to save yet.';
  if (raster.columnsDone < raster.columns) return 'Wait for the map to be complete before saving it.';
  if (!s.rangeOk) return 'Set a level range above 0 dB first.';
  const inputs: BenchViewInputs = {
    channelIndex: s.channelSetup?.index ?? 0,
    window: s.settings.windowName,
    blockSize: s.settings.blockSize,
    overlap: s.settings.overlap,
    weighting: s.settings.weighting,
    refRms: s.reference.refRms,
    against: s.against,
    swapped: s.swapped,
    view,
    colourScale: s.settings.colours,
    topDb: s.topDb,
    rangeDb: s.rangeDb,
    guides: s.guides,
    lines: s.lines,
    report: s.report,
    polePairs: s.polePairs,
    speedSource: s.speedSource,
    polePairsSource: s.typedPoles !== null ? 'typed' : s.polePairs !== null ? 'inferred' : null,
    durationS: s.recording.decoded.header.durationS,
    tracks: tracksOf(s),
  };
  const picture = quantiseVisible(raster, view, s.swapped, s.topDb, s.rangeDb);
  // the same check the server makes on the file, before anything is sent
  const header = snapshotHeader.safeParse(snapshotHeaderOf(inputs, picture));
  if (!header.success) return `The snapshot cannot be made: ${issuesText(header.error.issues)}`;
  return { state: benchViewState(inputs), header: header.data, map: picture.map, swapped: s.swapped };
}
