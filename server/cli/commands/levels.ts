/** `levels FILE --channel I`: overall level and one-third-octave bands (IEC 61260-1), weighted (IEC 61672-1). */
import { createRealFft } from '../../../workers/dsp/fft';
import { bandPowersFromSpectrum, overallPower, toDb } from '../../../workers/dsp/levels';
import { averageFrames, computeFrames, stftLayout } from '../../../workers/dsp/stft';
import { thirdOctaveBands } from '../../../workers/dsp/third-octave';
import { weightingGainsPower, type Weighting } from '../../../workers/dsp/weighting';
import { makeWindow } from '../../../workers/dsp/window';
import type { Options } from '../options';
import { UsageError } from '../options';
import { calibrationFactor, channelIndex, readChannels, scaled } from '../recording-input';

/** Bins fine enough for the 20 Hz band (about 4.6 Hz wide): Δf ≤ about 1.6 Hz, within the recording. */
function levelBlockSize(fsHz: number, samples: number): number {
  let n = 256;
  while (n < 65536 && fsHz / n > 1.6 && n * 2 <= samples) n *= 2;
  return n;
}

export async function levelsCommand(file: string, o: Options) {
  const channel = channelIndex(o);
  const weighting = o.choice<Weighting>('weighting', ['A', 'C', 'Z'], 'Z');
  const ref = o.number('ref', 1, (r) => (r > 0 ? null : 'must be above 0 (an RMS reference, e.g. 2e-5 for sound pressure in Pa).'));
  const rec = await readChannels(file, [channel]);
  const fs = rec.header.sampleRateHz;
  const x = scaled(rec.samples[0], calibrationFactor(o));
  if (x.length < 256) throw new UsageError(`${rec.header.fileName} holds ${x.length} samples; levels need at least 256.`);
  const block = levelBlockSize(fs, x.length);
  const layout = stftLayout(x.length, fs, { blockSize: block, overlap: 0.5, window: 'hann' });
  const win = makeWindow('hann', block);
  const power = new Float32Array(layout.frames * layout.bins);
  computeFrames(x, 0, layout, win, await createRealFft(block), 0, layout.frames, power);
  const avg = averageFrames(power, layout.bins, 0, layout.frames);
  const freq = Float64Array.from({ length: layout.bins }, (_, k) => k * layout.binHz);
  const gains = weightingGainsPower(weighting, freq);
  for (let k = 0; k < avg.length; k++) avg[k] *= gains[k];
  const bands = thirdOctaveBands(20, 20000);
  const bandPower = bandPowersFromSpectrum(avg, layout.binHz, bands, win.enbwBins);
  return {
    weighting,
    overallDb: toDb(overallPower(avg, win.enbwBins), ref),
    // db is null for a band the spectrum does not reach (then beyondSpectrum) and for one with no energy
    bands: bands.map((b, i) =>
      Number.isFinite(bandPower[i])
        ? { nominalHz: b.nominalHz, centerHz: b.centerHz, db: toDb(bandPower[i], ref) }
        : { nominalHz: b.nominalHz, centerHz: b.centerHz, db: null, beyondSpectrum: true },
    ),
  };
}
