/**
 * The hearing figures of a sound-pressure channel: its loudness (ISO 532-1) and its tonality
 * (ECMA-418-2), each in its own worker lane so the two run side by side and neither holds up the map.
 * They are computed once asked for (the hearing panel's button), and again when the channel or its
 * calibration changes while asked.
 */
import { useCallback, useEffect, useMemo, useState } from 'react';
import * as Comlink from 'comlink';
import { loudnessCurve, tonalityCurve, type HearingRequest, type LoudnessCurve, type TonalityCurve } from '../../../../workers/dsp/hearing-curves';
import { errorMessage } from '../../../lib/error-message';
import { isAbort, runTask, type TaskLane } from '../../../lib/workers/analysis-tasks';
import { calibrated, type TaskState } from './use-analysis-tasks';

export interface HearingInput {
  /** The map channel as read, and the factor to Pa */
  channel: { samples: Float32Array | null; scale: number };
  fsHz: number;
  /** The channel is sound pressure in Pa: the only kind the hearing methods take */
  soundPressure: boolean;
  owner: string;
}

export interface HearingState {
  asked: boolean;
  field: 'free' | 'diffuse';
  loudness: TaskState<LoudnessCurve>;
  tonality: TaskState<TonalityCurve>;
}

const request = (c: HearingInput['channel'], fsHz: number, field: 'free' | 'diffuse'): HearingRequest => ({ samplesPa: calibrated(c)!, fsHz, field });

function useHearingTask<T extends LoudnessCurve | TonalityCurve>(lane: TaskLane, input: HearingInput, asked: boolean, field: 'free' | 'diffuse', inline: (r: HearingRequest) => T): TaskState<T> {
  const [state, setState] = useState<TaskState<T>>({ kind: 'idle' });
  const { channel, fsHz, soundPressure, owner } = input;
  useEffect(() => {
    if (!asked || !soundPressure || !channel.samples || !(fsHz > 0)) {
      setState({ kind: 'idle' });
      return;
    }
    setState({ kind: 'computing' });
    const job = runTask(
      lane,
      (remote) => {
        const req = request(channel, fsHz, field);
        const call = lane === 'loudness' ? remote.loudness : remote.tonality;
        return call(Comlink.transfer(req, [req.samplesPa.buffer as ArrayBuffer])) as Promise<T>;
      },
      () => inline(request(channel, fsHz, field)),
      owner,
    );
    job.promise.then(
      (value) => setState({ kind: 'done', value }),
      (e: unknown) => !isAbort(e) && setState({ kind: 'error', message: errorMessage(e) }),
    );
    return () => job.cancel();
  }, [lane, asked, soundPressure, channel, fsHz, field, owner, inline]);
  return state;
}

export function useHearing(input: HearingInput) {
  const [asked, setAsked] = useState(false);
  const [field, setField] = useState<'free' | 'diffuse'>('free');
  const [tonalOnMap, showTonalOnMap] = useState(true);
  const loudness = useHearingTask('loudness', input, asked, field, loudnessCurve);
  // the hearing model's tonality does not depend on the sound field
  const tonality = useHearingTask('tonality', input, asked, 'free', tonalityCurve);
  const askHearing = useCallback(() => setAsked(true), []);
  const setHearingField = useCallback((f: 'free' | 'diffuse') => setField(f), []);
  const hearing: HearingState = useMemo(() => ({ asked, field, loudness, tonality }), [asked, field, loudness, tonality]);
  // the strongest tonal frequency against time, drawn on the map while asked
  const tonalLine = useMemo(
    () => (tonalOnMap && tonality.kind === 'done' ? { t: tonality.value.t, hz: tonality.value.tonalHz } : null),
    [tonalOnMap, tonality],
  );
  return { state: { hearing, tonalOnMap, tonalLine }, actions: { askHearing, setHearingField, showTonalOnMap } };
}
