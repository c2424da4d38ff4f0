/**
 * The session's longer analysis tasks, each in its worker lane (src/lib/workers/analysis-tasks.ts): the
 * map against speed, the inverter findings and the tracks of the guides. Each runs again when its input
 * changes, cancelling the one before; the map's mean squares go without a copy when they are shared.
 */
import { useEffect, useMemo, useRef, useState } from 'react';
import * as Comlink from 'comlink';
import { speedMapTask } from '../../../../workers/analysis.worker';
import { guideTracks, type GuideTrack, type GuideTracksRequest } from '../../../../workers/dsp/guide-tracks';
import { analyseInverter, type InverterAnalysisInput, type InverterReport } from '../../../../workers/dsp/inverter-analysis';
import type { FamilyPattern } from '../../../../workers/dsp/pole-pairs';
import type { SpeedMap } from '../../../../workers/dsp/speed-map';
import type { Weighting } from '../../../../workers/dsp/weighting';
import type { WindowName } from '../../../../workers/dsp/window';
import { errorMessage } from '../../../lib/error-message';
import { isAbort, powerForTask, runTask } from '../../../lib/workers/analysis-tasks';
import { speedRaster, type SpeedRaster } from '../map/speed-raster';
import { findingsRequest } from './analysis-requests';
import type { MapPower } from './use-map-computation';

export type TaskState<T> =
  | { kind: 'idle' }
  | { kind: 'computing' }
  /** `stale`: a newer one is being computed (the speed or the pole pairs changed) */
  | { kind: 'done'; value: T; stale?: boolean }
  | { kind: 'error'; message: string };

/** A task's input with the map's mean squares as it sends them (see powerForTask). */
function withPower<T extends { power: Float32Array }>(base: Omit<T, 'power'>, power: Float32Array, extra: ArrayBuffer[] = []): { req: T; transfer: ArrayBuffer[] } {
  const sent = powerForTask(power);
  return { req: { ...base, power: sent.power } as T, transfer: [...sent.transfer, ...extra] };
}

/** The map against speed, computed in a worker from a finished map when it is asked for. */
export function useSpeedMap(
  power: MapPower | null,
  ready: boolean,
  frameRpm: Float64Array | null,
  rpmStep: number,
  weighting: Weighting,
  refRms: number,
  wanted: boolean,
  /** The session asking (its tasks cancel only its own older ones) */
  owner: string,
): TaskState<SpeedRaster | null> {
  const [map, setMap] = useState<TaskState<SpeedMap>>({ kind: 'idle' });
  useEffect(() => {
    setMap({ kind: 'idle' });
    if (!wanted || !ready || !power || !frameRpm) return;
    setMap({ kind: 'computing' });
    const base = { layout: power.layout, frameRpm, rpmStep };
    const job = runTask(
      'speed-map',
      (remote) => {
        const { req, transfer } = withPower<Parameters<typeof speedMapTask>[0]>({ ...base, frameRpm: frameRpm.slice() }, power.power);
        return remote.speedMap(Comlink.transfer(req, [...transfer, req.frameRpm.buffer as ArrayBuffer]));
      },
      () => speedMapTask({ ...base, power: power.power }),
      owner,
    );
    job.promise.then(
      (value) => setMap({ kind: 'done', value }),
      (e: unknown) => !isAbort(e) && setMap({ kind: 'error', message: errorMessage(e) }),
    );
    return () => job.cancel();
  }, [power, ready, frameRpm, rpmStep, wanted, owner]);

  return useMemo((): TaskState<SpeedRaster | null> => {
    if (map.kind !== 'done') return map;
    return { kind: 'done', value: power ? speedRaster(map.value, power.layout, rpmStep, weighting, refRms) : null };
  }, [map, power, rpmStep, weighting, refRms]);
}

const FINDINGS_PAUSE_MS = 300;

export interface FindingsInput {
  power: MapPower | null;
  ready: boolean;
  frameRpm: Float64Array | null;
  window: WindowName;
  enbwBins: number;
  polePairs: number | null;
  /** Order guides, "8,48": a family point they cross is flagged, and not taken as its peak */
  orders: string;
  /** The family pattern the map channel's quantity carries (patternOfQuantity), if it says */
  expectedPattern: FamilyPattern | null;
  /** The channel is sound pressure in Pa: the tones are judged against the threshold of hearing */
  soundPressure: boolean;
  owner: string;
}

/**
 * The inverter findings of a finished map (analyseInverter in a worker, as the batch CLI runs it):
 * carrier, shifts, spread, pole pairs and pattern, the strongest families, the carrier tones' tonality.
 * Without a speed the frames' speeds are unknown (NaN): the carrier and its shifts are still found.
 */
export function useFindings(input: FindingsInput): TaskState<InverterReport> {
  const { power, ready, frameRpm, window, enbwBins, polePairs, orders, expectedPattern, soundPressure, owner } = input;
  const [state, setState] = useState<TaskState<InverterReport>>({ kind: 'idle' });
  const doneFor = useRef<MapPower | null>(null);
  useEffect(() => {
    if (!ready || !power || power.layout.frames < 8) {
      setState({ kind: 'idle' });
      return;
    }
    const base = () =>
      findingsRequest(power.layout, { window, enbwBins, frameRpm, polePairs, orders: orders ? orders.split(',').map(Number) : [], expectedPattern, soundPressure });
    let job: { cancel(): void } | null = null;
    // The last findings of the same map stay up while newer ones are computed.
    setState((prev) => (prev.kind === 'done' && doneFor.current === power ? { ...prev, stale: true } : { kind: 'computing' }));
    const timer = setTimeout(() => {
      const j = runTask(
        'findings',
        (remote) => {
          const b = base();
          const { req, transfer } = withPower<InverterAnalysisInput>(b, power.power, [b.frameRpm.buffer as ArrayBuffer]);
          return remote.inverter(Comlink.transfer(req, transfer));
        },
        () => analyseInverter({ ...base(), power: power.power }),
        owner,
      );
      job = j;
      j.promise.then(
        (value) => {
          doneFor.current = power;
          setState({ kind: 'done', value });
        },
        (e: unknown) => !isAbort(e) && setState({ kind: 'error', message: errorMessage(e) }),
      );
    }, FINDINGS_PAUSE_MS);
    return () => {
      clearTimeout(timer);
      job?.cancel();
    };
  }, [power, ready, frameRpm, window, enbwBins, polePairs, orders, expectedPattern, soundPressure, owner]);
  return state;
}

const TRACKS_PAUSE_MS = 150;

/** The tracks' request as the session has it: the map still filling, the samples not yet calibrated. */
export interface GuideTracksInput extends Omit<GuideTracksRequest, 'power' | 'layout' | 'samples'> {
  power: MapPower | null;
  ready: boolean;
  /** The map channel's samples as read and their calibration: crossing points are filtered from them */
  channel: { samples: Float32Array | null; scale: number };
  owner: string;
}

/** The map channel in its units, for the Vold–Kalman filter at crossings (a copy: it is sent to the worker). */
export const calibrated = (c: { samples: Float32Array | null; scale: number }) => (c.samples ? Float32Array.from(c.samples, (v) => v * c.scale) : undefined);

/**
 * The tracks of the selected guides (guideTracks in a worker, crossings filtered from the samples),
 * recomputed a moment after a change.
 */
export function useGuideTracks(input: GuideTracksInput): TaskState<GuideTrack[]> {
  const [state, setState] = useState<TaskState<GuideTrack[]>>({ kind: 'idle' });
  const { power, ready, lines, shown, window, enbwBins, against, frameRpm, rpmStep, weighting, refRms, channel, owner } = input;
  useEffect(() => {
    if (!ready || !power || lines.length === 0) {
      setState({ kind: 'idle' });
      return;
    }
    const base: Omit<GuideTracksRequest, 'power'> = { layout: power.layout, lines, shown, window, enbwBins, against, frameRpm, rpmStep, weighting, refRms };
    let job: { cancel(): void } | null = null;
    setState((prev) => (prev.kind === 'done' ? { ...prev, stale: true } : { kind: 'computing' }));
    const timer = setTimeout(() => {
      const j = runTask(
        'tracks',
        (remote) => {
          const samples = calibrated(channel);
          const { req, transfer } = withPower<GuideTracksRequest>({ ...base, samples }, power.power, samples ? [samples.buffer as ArrayBuffer] : []);
          return remote.tracks(Comlink.transfer(req, transfer));
        },
        () => guideTracks({ ...base, power: power.power, samples: calibrated(channel) }),
        owner,
      );
      job = j;
      j.promise.then(
        (value) => setState({ kind: 'done', value }),
        (e: unknown) => !isAbort(e) && setState({ kind: 'error', message: errorMessage(e) }),
      );
    }, TRACKS_PAUSE_MS);
    return () => {
      clearTimeout(timer);
      job?.cancel();
    };
  }, [power, ready, lines, shown, window, enbwBins, against, frameRpm, rpmStep, weighting, refRms, channel, owner]);
  return state;
}
