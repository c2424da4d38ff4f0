import { useEffect, useMemo, useRef, useState } from 'react';
import * as Comlink from 'comlink';
import { speedMapTask } from '../../../../workers/analysis.worker';
import { analyseInverter, type InverterAnalysisInput, type InverterReport } from '../../../../workers/dsp/inverter-analysis';
import type { FamilyPattern } from '../../../../workers/dsp/pole-pairs';
import type { SpeedMap } from '../../../../workers/dsp/speed-map';
import type { Weighting } from '../../../../workers/dsp/weighting';
import type { WindowName } from '../../../../workers/dsp/window';
import { isAbort, runTask } from '../../../lib/workers/analysis-tasks';
import { speedRaster, type SpeedRaster } from '../map/speed-raster';
import type { MapPower } from './use-map-computation';

export type TaskState<T> =
  | { kind: 'idle' }
  | { kind: 'computing' }
  /** `stale`: a newer one is being computed (the speed or the pole pairs changed) */
  | { kind: 'done'; value: T; stale?: boolean }
  | { kind: 'error'; message: string };

/** The map against speed, computed in a worker from a finished map when it is asked for. */
export function useSpeedMap(
  power: MapPower | null,
  ready: boolean,
  frameRpm: Float64Array | null,
  rpmStep: number,
  weighting: Weighting,
  refRms: number,
  wanted: boolean,
): TaskState<SpeedRaster | null> {
  const [map, setMap] = useState<TaskState<SpeedMap>>({ kind: 'idle' });
  useEffect(() => {
    setMap({ kind: 'idle' });
    if (!wanted || !ready || !power || !frameRpm) return;
    const make = () => ({ power: power.power.slice(), layout: power.layout, frameRpm: frameRpm.slice(), rpmStep });
    setMap({ kind: 'computing' });
    const job = runTask(
      'speed-map',
      (remote) => {
        const req = make();
        return remote.speedMap(Comlink.transfer(req, [req.power.buffer as ArrayBuffer, req.frameRpm.buffer as ArrayBuffer]));
      },
      () => speedMapTask(make()),
    );
    job.promise.then(
      (value) => setMap({ kind: 'done', value }),
      (e: unknown) => !isAbort(e) && setMap({ kind: 'error', message: e instanceof Error ? e.message : String(e) }),
    );
    return () => job.cancel();
  }, [power, ready, frameRpm, rpmStep, wanted]);

  return useMemo((): TaskState<SpeedRaster | null> => {
    if (map.kind !== 'done') return map;
    return { kind: 'done', value: power ? speedRaster(map.value, power.layout, rpmStep, weighting, refRms) : null };
  }, [map, power, rpmStep, weighting, refRms]);
}

const FINDINGS_PAUSE_MS = 300;

/**
 * The inverter findings of a finished map (analyseInverter in a worker, on a copy of the mean squares):
 * carrier, shifts, spread, pole pairs and pattern, the strongest families. Without a speed the frames'
 * speeds are unknown (NaN): the carrier and its shifts are still found.
 */
export function useFindings(
  power: MapPower | null,
  ready: boolean,
  frameRpm: Float64Array | null,
  window: WindowName,
  enbwBins: number,
  polePairs: number | null,
  /** Order guides: a family point they cross is flagged, and not taken as its peak */
  orders: string,
  /** The family pattern the map channel's quantity carries (patternOfQuantity), if it says */
  expectedPattern: FamilyPattern | null = null,
): TaskState<InverterReport> {
  const [state, setState] = useState<TaskState<InverterReport>>({ kind: 'idle' });
  const doneFor = useRef<MapPower | null>(null);
  useEffect(() => {
    if (!ready || !power || power.layout.frames < 8) {
      setState({ kind: 'idle' });
      return;
    }
    const make = (): InverterAnalysisInput => ({
      power: power.power.slice(),
      layout: power.layout,
      window,
      enbwBins,
      frameRpm: frameRpm ? frameRpm.slice() : new Float64Array(power.layout.frames).fill(NaN),
      ...(polePairs ? { polePairs } : {}),
      orders: orders ? orders.split(',').map(Number) : [],
      ...(expectedPattern ? { expectedPattern } : {}),
    });
    let job: { cancel(): void } | null = null;
    // The last findings of the same map stay up while newer ones are computed.
    setState((prev) => (prev.kind === 'done' && doneFor.current === power ? { ...prev, stale: true } : { kind: 'computing' }));
    const timer = setTimeout(() => {
      const j = runTask(
        'findings',
        (remote) => {
          const req = make();
          return remote.inverter(Comlink.transfer(req, [req.power.buffer as ArrayBuffer, req.frameRpm.buffer as ArrayBuffer]));
        },
        () => analyseInverter(make()),
      );
      job = j;
      j.promise.then(
        (value) => {
          doneFor.current = power;
          setState({ kind: 'done', value });
        },
        (e: unknown) => !isAbort(e) && setState({ kind: 'error', message: e instanceof Error ? e.message : String(e) }),
      );
    }, FINDINGS_PAUSE_MS);
    return () => {
      clearTimeout(timer);
      job?.cancel();
    };
  }, [power, ready, frameRpm, window, enbwBins, polePairs, orders, expectedPattern]);
  return state;
}
