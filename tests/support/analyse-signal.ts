/** The inverter findings of a signal as the app computes them: a Hann map (75 % overlap), then analyseInverter. */
import { createRealFft } from '../../workers/dsp/fft';
import { analyseInverter, type InverterAnalysisInput } from '../../workers/dsp/inverter-analysis';
import { computeFrames, frameTimeS, stftLayout } from '../../workers/dsp/stft';
import { makeWindow } from '../../workers/dsp/window';

export type AnalysisExtras = Omit<InverterAnalysisInput, 'power' | 'layout' | 'window' | 'enbwBins' | 'frameRpm'>;

export async function analyseSignal(x: Float32Array, fsHz: number, rpm: (t: number) => number, extra: AnalysisExtras = {}, blockSize = 8192) {
  const layout = stftLayout(x.length, fsHz, { window: 'hann', blockSize, overlap: 0.75 });
  const win = makeWindow('hann', blockSize);
  const power = new Float32Array(layout.frames * layout.bins);
  computeFrames(x, 0, layout, win, await createRealFft(blockSize), 0, layout.frames, power);
  const frameRpm = Float64Array.from({ length: layout.frames }, (_, f) => rpm(frameTimeS(layout, f)));
  return { layout, report: analyseInverter({ power, layout, window: 'hann', enbwBins: win.enbwBins, frameRpm, ...extra }) };
}
