import { useMemo, useState } from 'react';
import { rpmAtTimes } from '../../../../workers/dsp/speed';
import { makeWindow } from '../../../../workers/dsp/window';
import { calibrationProblem, unitsPerFileUnit, type ChannelSetup } from '../../../../workers/io/channel-setup';
import { frameTimes as frameTimesOf } from '../analysis/spectra';
import type { OpenRecording } from '../hooks/use-recording-reader';
import { colourLut } from '../../../lib/plot/colour-scales';
import { levelReference } from '../map/level-reference';
import type { MapRaster } from '../map/map-raster';
import { speedStep } from '../map/speed-raster';
import type { Extents } from '../map/viewport';
import type { BenchRestore } from '../view-state/view-restore';
import { useSpeedMap } from './use-analysis-tasks';
import { useMapComputation } from './use-map-computation';
import { DEFAULT_RANGE_DB, useMapSettings, useSettledValue } from './use-map-settings';
import type { SpeedState } from './use-speed-curve';
import type { FillingChannels } from './use-recording-channels';

export const MIN_BLOCK_SAMPLES = 256;
/** A calibration being typed is taken a moment after the last key. */
const CALIBRATION_PAUSE_MS = 300;
const validScale = (v: number) => Number.isFinite(v) && v !== 0;

function extentsOf(raster: MapRaster, minX: number): Extents {
  const [f0, f1] = raster.frequencySpanHz;
  return { x: raster.xSpan, f: [f0, f1], minX, minF: 8 * raster.grid.binHz * raster.binsPerRow };
}

/**
 * The map of one channel: its settings, the calibrated levels computed in the pool, the level range
 * shown, the speed of each frame, and the map against speed when it is asked for.
 */
export function useMapModel(
  recording: OpenRecording,
  setup: ChannelSetup[],
  speed: SpeedState,
  restore: BenchRestore | undefined,
  followedAgainst?: 'time' | 'speed',
  filling?: FillingChannels | null,
) {
  const { header, samples: channelSamples, channelIndices } = recording.decoded;
  const { settings, setters } = useMapSettings(header.frames, setup, restore);
  const channelSetup = setup.find((c) => c.index === settings.channel) ?? setup[0];
  const at = channelIndices.indexOf(channelSetup?.index ?? -1);
  // a channel still being read: the map computes the columns its samples allow as they arrive
  const fillAt = at < 0 && filling ? filling.indices.indexOf(channelSetup?.index ?? -1) : -1;
  const samples = at >= 0 ? channelSamples[at] : fillAt >= 0 ? filling!.samples[fillAt] : null;
  const fill = fillAt >= 0 ? filling!.fill : undefined;
  const calibrationBad = channelSetup ? calibrationProblem(channelSetup.calibration) !== null : false;
  const typedScale = channelSetup && !calibrationBad ? unitsPerFileUnit(channelSetup.calibration) : Number.NaN;
  const scale = useSettledValue(typedScale, validScale, CALIBRATION_PAUSE_MS, settings.channel);
  const reference = useMemo(() => levelReference(channelSetup ?? { quantity: 'other', unit: '' }), [channelSetup]);
  const stft = useMemo(() => ({ blockSize: settings.blockSize, overlap: settings.overlap, window: settings.windowName }), [settings.blockSize, settings.overlap, settings.windowName]);
  const tooShort = header.frames < MIN_BLOCK_SAMPLES;
  const map = useMapComputation({
    samples: tooShort || !validScale(scale) ? null : samples,
    fsHz: header.sampleRateHz,
    settings: stft,
    weighting: settings.weighting,
    scale,
    refRms: reference.refRms,
    filling: fill,
  });
  const { layout } = map;
  /** The map channel's samples as read, and the calibration the map took (units per file unit) */
  // (what reads the whole channel, its hearing and Vold–Kalman tracks, waits until it is all read)
  const whole = at >= 0;
  const mapChannel = useMemo(() => ({ samples: tooShort || !validScale(scale) || !whole ? null : samples, scale }), [tooShort, scale, samples, whole]);
  const done = map.status.kind === 'done';
  const enbwBins = useMemo(() => makeWindow(settings.windowName, settings.blockSize).enbwBins, [settings.windowName, settings.blockSize]);

  // The level range: a typed top, else the map's highest level rounded up
  const parsedTop = settings.topText === null ? Number.NaN : Number(settings.topText);
  const manualTop = settings.topText !== null && Number.isFinite(parsedTop);
  const topDb = manualTop ? parsedTop : (map.peakTopDb ?? 0);
  const parsedRange = Number(settings.rangeText);
  const rangeOk = Number.isFinite(parsedRange) && parsedRange > 0 && parsedRange <= 400;
  const rangeDb = rangeOk ? parsedRange : DEFAULT_RANGE_DB;
  const lut = useMemo(() => colourLut(settings.colours), [settings.colours]);

  // Speed per frame, and the map against speed
  const frameTimes = useMemo(() => (layout && layout.frames > 0 ? frameTimesOf(layout) : null), [layout]);
  const frameRpm = useMemo(() => (speed.kind === 'done' && frameTimes ? rpmAtTimes(speed.curve, frameTimes) : null), [speed, frameTimes]);
  const rpmStep = useMemo(() => (frameRpm ? speedStep(frameRpm) : 50), [frameRpm]);
  const [againstChoice, setAgainst] = useState<'time' | 'speed'>(restore?.against ?? 'time');
  const against: 'time' | 'speed' = (followedAgainst ?? againstChoice) === 'speed' && frameRpm ? 'speed' : 'time';
  const speedMap = useSpeedMap(map.power, done, frameRpm, rpmStep, settings.weighting, reference.refRms, against === 'speed', recording.entry.fingerprint);
  const speedRaster = speedMap.kind === 'done' ? speedMap.value : null;
  const raster = against === 'speed' ? (speedRaster?.raster ?? null) : map.raster;
  const extents = useMemo(
    () => (raster && layout ? extentsOf(raster, against === 'speed' ? 4 * rpmStep : 4 * layout.hopS) : null),
    [raster, layout, against, rpmStep],
  );

  return {
    state: {
      settings,
      channelSetup,
      calibrationBad,
      tooShort,
      reference,
      enbwBins,
      map: { raster: map.raster, layout, status: map.status, power: map.power, done },
      mapChannel,
      topDb,
      manualTop,
      rangeDb,
      rangeOk,
      lut,
      frameTimes,
      frameRpm,
      rpmStep,
      against,
      speedMap,
      speedRaster,
      raster,
      extents,
    },
    actions: { ...setters, setAgainst, cancelMap: map.cancel, restartMap: map.restart },
  };
}
