/**
 * A run-up on which an order and a carrier family cross, known by construction (levels invented for
 * the tests): order 48 (amplitude 0.3) meets fc − fe (0.12; fc 3 kHz, 4 pole pairs) at about 3460 rpm,
 * with the family's partner fc + fe (0.12) so the carrier is found from the symmetric pair. Sampled at
 * 25.6 kHz for 6 s (1000 → 4000 rpm), and its Hann map (block 4096, 75 % overlap).
 */
import { createRealFft } from '../../workers/dsp/fft';
import { computeFrames, frameTimeS, stftLayout } from '../../workers/dsp/stft';
import { makeWindow } from '../../workers/dsp/window';
import { tone } from './tones';

export const FS = 25600;
export const FC = 3000;
export const P = 4;
export const A_ORDER = 0.3;
export const A_FAMILY = 0.12;
const T = 6;
const N = FS * T;
const rpm = (t: number) => 1000 + 500 * t;

export async function crossingRunUp() {
  const order = tone(N, FS, (t) => (48 * rpm(t)) / 60, () => A_ORDER, 0.2);
  const family = tone(N, FS, (t) => FC - (P * rpm(t)) / 60, () => A_FAMILY, 1.0);
  const partner = tone(N, FS, (t) => FC + (P * rpm(t)) / 60, () => A_FAMILY, -0.5);
  const x = Float32Array.from(order, (v, i) => v + family[i] + partner[i]);
  const layout = stftLayout(N, FS, { window: 'hann', blockSize: 4096, overlap: 0.75 });
  const win = makeWindow('hann', 4096);
  const power = new Float32Array(layout.frames * layout.bins);
  computeFrames(x, 0, layout, win, await createRealFft(4096), 0, layout.frames, power);
  const frameRpm = Float64Array.from({ length: layout.frames }, (_, f) => rpm(frameTimeS(layout, f)));
  return { x, layout, win, power, frameRpm };
}
