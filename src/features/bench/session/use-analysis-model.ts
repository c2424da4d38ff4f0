import { useCallback, useMemo, useReducer } from 'react';
import { patternOfQuantity } from '../../../../workers/dsp/inverter-analysis';
import type { ChannelSetup } from '../../../../workers/io/channel-setup';
import { guidesReducer, initialGuides, resolveLines, type GuidesState } from '../map/guides';
import type { LevelReference } from '../map/level-reference';
import type { BenchRestore } from '../view-state/view-restore';
import { tonalityAt } from './analysis-requests';
import { useFindings, useGuideTracks } from './use-analysis-tasks';
import type { MapSettings } from './use-map-settings';
import type { MapPower } from './use-map-computation';

export interface AnalysisInputs {
  power: MapPower | null;
  done: boolean;
  frames: number;
  frameRpm: Float64Array | null;
  rpmStep: number;
  against: 'time' | 'speed';
  settings: MapSettings;
  enbwBins: number;
  reference: LevelReference;
  channelSetup: ChannelSetup | undefined;
  typedPoles: number | null;
  /** The map channel's samples and calibration: the tracks filter the crossings from them */
  mapChannel: { samples: Float32Array | null; scale: number };
  /** The session's recording (its tasks are its own) */
  owner: string;
}

/** The guides, the inverter findings, the lines the guides resolve to, their tracks, and the tonality. */
export function useAnalysisModel(inp: AnalysisInputs, restore: BenchRestore | undefined, followedGuides?: GuidesState) {
  const [ownGuides, dispatchGuides] = useReducer(guidesReducer, restore?.guides ?? (initialGuides as GuidesState));
  // a compared run tracks the baseline's guides
  const guides = followedGuides ?? ownGuides;
  const orderKs = guides.orders.filter((o) => !o.hidden).map((o) => o.order).join(',');
  const soundPressure = inp.channelSetup?.quantity === 'sound-pressure' && inp.reference.label === '20 µPa';
  const findings = useFindings({
    power: inp.power,
    ready: inp.done,
    frameRpm: inp.frameRpm,
    window: inp.settings.windowName,
    enbwBins: inp.enbwBins,
    polePairs: inp.typedPoles,
    orders: orderKs,
    expectedPattern: patternOfQuantity(inp.channelSetup?.quantity ?? 'other'),
    soundPressure,
    owner: inp.owner,
  });
  const report = findings.kind === 'done' ? findings.value : null;
  const polePairs = inp.typedPoles ?? report?.polePairs.value ?? null;
  const detectedHz = useMemo(() => (report && report.carrier.hz.some((h) => Number.isFinite(h)) ? Float64Array.from(report.carrier.hz) : null), [report]);

  const lines = useMemo(
    () => (inp.frames > 0 ? resolveLines(guides, { frames: inp.frames, frameRpm: inp.frameRpm, polePairs, detectedHz }) : []),
    [guides, inp.frames, inp.frameRpm, polePairs, detectedHz],
  );
  const selected = useMemo(() => lines.filter((l) => l.selected), [lines]);
  const tracks = useGuideTracks({
    power: inp.power,
    ready: inp.done,
    lines: selected,
    shown: lines,
    window: inp.settings.windowName,
    enbwBins: inp.enbwBins,
    against: inp.against,
    frameRpm: inp.frameRpm,
    rpmStep: inp.rpmStep,
    weighting: inp.settings.weighting,
    refRms: inp.reference.refRms,
    channel: inp.mapChannel,
    owner: inp.owner,
  });

  // The carrier tones' tonality at a moment, as the batch CLI judges it (`analyze inverter --at`)
  const { power, frameRpm, enbwBins } = inp;
  const tonalityAtS = useCallback(
    (atS: number) =>
      power ? tonalityAt({ power: power.power, layout: power.layout, enbwBins, frameRpm, carrierHz: detectedHz, polePairs, soundPressure }, atS) : null,
    [power, frameRpm, enbwBins, detectedHz, polePairs, soundPressure],
  );

  return {
    state: { guides, findings, report, polePairs, detectedHz, lines, selected, tracks, tonalityAt: tonalityAtS, soundPressure },
    actions: { dispatchGuides },
  };
}
