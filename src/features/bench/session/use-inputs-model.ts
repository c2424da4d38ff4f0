import { useMemo, useState } from 'react';
import { defaultSpeedSource, type SpeedSource } from '../../../../workers/io/speed-source';
import type { OpenRecording } from '../hooks/use-recording-reader';
import type { BenchRestore } from '../view-state/view-restore';
import { useChannelSetup } from './use-channel-setup';
import { useSpeedChoice } from './use-speed-choice';
import { useSpeedCurve } from './use-speed-curve';

export type PoleChoice = { mode: 'inferred' } | { mode: 'typed'; value: number };

/**
 * What the engineer says about the recording: the channel setup (kept in the library), the speed source
 * and the speed it gives, the pole pairs if typed.
 */
export function useInputsModel(recording: OpenRecording, restore: BenchRestore | undefined) {
  const { header, samples, channelIndices } = recording.decoded;
  const fingerprint = recording.entry.fingerprint;
  const { setup, change, flush, saveState } = useChannelSetup(fingerprint, recording.entry.setup);
  const [speedChoice, chooseSpeed, speedSaveError] = useSpeedChoice(fingerprint, setup, recording.entry.speedSource, restore?.speedSource);
  const speedSource: SpeedSource = speedChoice ?? defaultSpeedSource(setup);
  const [poles, setPoles] = useState<PoleChoice>(restore?.poles ?? { mode: 'inferred' });
  const channels = useMemo(() => ({ indices: channelIndices, samples }), [channelIndices, samples]);
  const speed = useSpeedCurve(speedSource, setup, channels, header.sampleRateHz, header.durationS, fingerprint);
  const typedPoles = poles.mode === 'typed' && Number.isInteger(poles.value) && poles.value >= 1 ? poles.value : null;
  return {
    state: { setup, setupSave: saveState, speedSource, speedAutomatic: speedChoice === null, speedSaveError, poles, typedPoles, speed },
    actions: { changeSetup: change, flushSetup: flush, chooseSpeed, setPoles },
  };
}
