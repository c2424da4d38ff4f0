/**
 * The tones of `analyze sound`: the strongest tonal components of the averaged spectrum (Welch, Hann,
 * power averaging), each with its level and audibility over the masked threshold of ISO/TS 20065, its
 * height over the free-field threshold of hearing of ISO 389-7, and TNR/PR of ECMA-418-1 where that
 * standard defines them (89.1 Hz–11.2 kHz; null and inTnrPrRange false elsewhere).
 */
import { createRealFft } from '../../../workers/dsp/fft';
import { averageFrames, computeFrames, stftLayout } from '../../../workers/dsp/stft';
import { findTones, toneAudibilityTs20065 } from '../../../workers/dsp/tone-audibility';
import { inTonalityScope, prominenceRatio, toneToNoiseRatio } from '../../../workers/dsp/tonality';
import { makeWindow } from '../../../workers/dsp/window';

export interface SoundTone {
  hz: number;
  levelDb: number;
  audibilityDb: number;
  aboveHearingThresholdDb: number | null;
  tnrDb: number | null;
  prDb: number | null;
  inTnrPrRange: boolean;
}

/** The largest block from 4096 to 16384 samples that fits twice in the range (bins of about 3–12 Hz). */
function toneBlockSize(samples: number): number {
  let n = 16384;
  while (n > 4096 && 2 * n > samples) n /= 2;
  return n;
}

const round = (v: number, digits: number) => Number(v.toFixed(digits));
const finiteOrNull = (v: number | undefined, digits: number) => (v !== undefined && Number.isFinite(v) ? round(v, digits) : null);

/**
 * The `max` strongest tones of x (Pa) at fsHz, strongest first. An empty list when the range is shorter
 * than one block of 4096 samples.
 */
export async function soundTones(x: Float32Array, fsHz: number, max = 5): Promise<SoundTone[]> {
  const block = toneBlockSize(x.length);
  if (x.length < block) return [];
  const layout = stftLayout(x.length, fsHz, { blockSize: block, overlap: 0.5, window: 'hann' });
  const win = makeWindow('hann', block);
  const frames = new Float32Array(layout.frames * layout.bins);
  computeFrames(x, 0, layout, win, await createRealFft(block), 0, layout.frames, frames);
  const power = averageFrames(frames, layout.bins, 0, layout.frames);
  return findTones(power, layout.binHz, max).map((hz) => {
    const a = toneAudibilityTs20065(power, layout.binHz, hz, win.enbwBins);
    const inRange = inTonalityScope(hz);
    const tnr = inRange ? toneToNoiseRatio(power, layout.binHz, win.enbwBins, hz) : null;
    const pr = inRange ? prominenceRatio(power, layout.binHz, win.enbwBins, hz) : null;
    return {
      hz: round(a.toneHz, 2),
      levelDb: round(a.levelDb, 2),
      audibilityDb: round(a.audibilityDb, 2),
      aboveHearingThresholdDb: finiteOrNull(a.aboveHearingThresholdDb, 2),
      tnrDb: finiteOrNull(tnr?.deltaLtDb, 2),
      prDb: finiteOrNull(pr?.deltaLpDb, 2),
      inTnrPrRange: inRange && tnr !== null && pr !== null,
    };
  });
}
