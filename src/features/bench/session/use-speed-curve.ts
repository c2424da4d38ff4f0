import { useEffect, useMemo, useState } from 'react';
import { speedTask, type SpeedTaskRequest } from '../../../../workers/analysis.worker';
import { speedFromRamp, type SpeedCurve } from '../../../../workers/dsp/speed';
import { calibrationProblem, unitsPerFileUnit, type ChannelSetup } from '../../../../workers/io/channel-setup';
import { speedSourceProblem, type SpeedSource } from '../../../../workers/io/speed-source';
import { errorMessage } from '../../../lib/error-message';
import { isAbort, runTask } from '../../../lib/workers/analysis-tasks';
import * as Comlink from 'comlink';

export type SpeedState =
  | { kind: 'none' }
  | { kind: 'computing' }
  | { kind: 'done'; curve: SpeedCurve; minRpm: number; maxRpm: number }
  | { kind: 'error'; message: string };

const PAUSE_MS = 250;

function summary(curve: SpeedCurve): SpeedState {
  let lo = Infinity;
  let hi = -Infinity;
  for (const r of curve.rpm) {
    if (Number.isFinite(r)) {
      lo = Math.min(lo, r);
      hi = Math.max(hi, r);
    }
  }
  if (!Number.isFinite(lo)) return { kind: 'error', message: 'The speed has no values that are numbers.' };
  return { kind: 'done', curve, minRpm: lo, maxRpm: hi };
}

/**
 * The speed of the open recording from its source: a tacho or speed channel in an analysis worker
 * (on a copy of the calibrated channel), a typed ramp here. Typed values are taken a moment after the
 * last key.
 */
export function useSpeedCurve(source: SpeedSource, setup: ChannelSetup[], channels: { indices: number[]; samples: Float32Array[] }, fsHz: number, durationS: number, owner = '') {
  const [state, setState] = useState<SpeedState>({ kind: 'none' });
  const problem = speedSourceProblem(source, setup);
  const channel = source.kind === 'tacho' || source.kind === 'channel' ? setup.find((c) => c.index === source.channel) : undefined;
  const scale = channel && calibrationProblem(channel.calibration) === null ? unitsPerFileUnit(channel.calibration) : 1;
  const key = useMemo(() => JSON.stringify({ source, scale }), [source, scale]);
  // the source channel's samples alone: another channel read later must not start the speed again
  const sourceChannel = source.kind === 'tacho' || source.kind === 'channel' ? source.channel : -1;
  const at = channels.indices.indexOf(sourceChannel);
  const raw = at >= 0 ? channels.samples[at] : null;

  useEffect(() => {
    if (problem) {
      setState({ kind: 'error', message: problem });
      return;
    }
    const { source: s, scale: k }: { source: SpeedSource; scale: number } = JSON.parse(key);
    if (s.kind === 'none') {
      setState({ kind: 'none' });
      return;
    }
    if (s.kind === 'ramp') {
      try {
        setState(summary(speedFromRamp([{ tS: 0, rpm: s.startRpm }, { tS: durationS, rpm: s.endRpm }], durationS)));
      } catch (e) {
        setState({ kind: 'error', message: errorMessage(e) });
      }
      return;
    }
    if (!raw) {
      // being read from the file (the session asks for the speed's channel)
      setState({ kind: 'computing' });
      return;
    }
    const make = (): SpeedTaskRequest => {
      const samples = raw.slice();
      if (k !== 1) for (let i = 0; i < samples.length; i++) samples[i] *= k;
      return s.kind === 'tacho'
        ? { kind: 'tacho', samples, fsHz, ppr: s.ppr, ...(s.triggerLevel === null ? {} : { triggerLevel: s.triggerLevel }) }
        : { kind: 'channel', samples, fsHz, rpmPerUnit: s.rpmPerUnit };
    };
    let job: { cancel(): void } | null = null;
    const timer = setTimeout(() => {
      setState({ kind: 'computing' });
      const j = runTask(
        'speed',
        (remote) => {
          const req = make();
          return remote.speed(Comlink.transfer(req, [req.samples.buffer as ArrayBuffer]));
        },
        () => speedTask(make()),
        owner,
      );
      job = j;
      j.promise.then(
        (curve) => setState(summary(curve)),
        (e: unknown) => {
          if (!isAbort(e)) setState({ kind: 'error', message: errorMessage(e) });
        },
      );
    }, PAUSE_MS);
    return () => {
      clearTimeout(timer);
      job?.cancel();
    };
  }, [key, problem, raw, fsHz, durationS, owner]);

  return state;
}
