/** `spectrum FILE --channel I`: the averaged spectrum (Welch, linear power averaging) of a time range. */
import { createRealFft } from '../../../workers/dsp/fft';
import { scaleSpectrum, amplitudeScalings } from '../../../workers/dsp/spectrum-scaling';
import { averageFrames, computeFrames, stftLayout } from '../../../workers/dsp/stft';
import { makeWindow, windowNames } from '../../../workers/dsp/window';
import type { Options } from '../options';
import { UsageError } from '../options';
import { calibrationFactor, channelIndex, readChannels, scaled } from '../recording-input';

export async function spectrumCommand(file: string, o: Options) {
  const channel = channelIndex(o);
  const window = o.choice('window', windowNames, 'hann');
  const block = o.integer('block', 8192, 256);
  const overlap = o.number('overlap', 0.5, (f) => (f >= 0 && f <= 0.95 ? null : 'must be from 0 to 0.95.'));
  const scale = o.choice('scale', amplitudeScalings, 'rms');
  const rec = await readChannels(file, [channel]);
  const fs = rec.header.sampleRateHz;
  const from = Math.max(0, Math.round(o.number('from', 0) * fs));
  const to = Math.min(rec.header.frames, Math.round(o.number('to', rec.header.durationS) * fs));
  if (to - from < block) {
    throw new UsageError(`The range holds ${Math.max(0, to - from)} samples, fewer than one block of ${block}; choose a smaller --block or a longer range.`);
  }
  const x = scaled(rec.samples[0].subarray(from, to), calibrationFactor(o));
  const layout = stftLayout(x.length, fs, { blockSize: block, overlap, window });
  const win = makeWindow(window, block);
  const power = new Float32Array(layout.frames * layout.bins);
  computeFrames(x, 0, layout, win, await createRealFft(block), 0, layout.frames, power);
  const values = scaleSpectrum(averageFrames(power, layout.bins, 0, layout.frames), scale, win.enbwBins, layout.binHz);
  return {
    freqHz: Array.from({ length: layout.bins }, (_, k) => k * layout.binHz),
    values: Array.from(values),
    scale,
    window,
    binHz: layout.binHz,
  };
}
