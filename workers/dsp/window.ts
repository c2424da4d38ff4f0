/**
 * Periodic ("DFT-even") data windows for spectral analysis, w[n] = Σ_k (−1)^k a_k cos(2πkn/N),
 * n = 0…N−1, with the factors that turn FFT magnitudes into amplitudes and densities.
 *
 * Conventions: periodic, as scipy.signal.get_window(…, fftbins=True) and as Harris [1] recommends for
 * DFT analysis (the symmetric form is for filter design).
 * Coefficients: Hann 0.5/0.5 and Hamming 0.54/0.46 [1]; Blackman-Harris 4-term −92 dB
 * 0.35875/0.48829/0.14128/0.01168 [1]; flat-top 0.21557895/0.41663158/0.277263158/0.083578947/0.006947368
 * as in scipy.signal.windows.flattop [2].
 * References: [1] F. J. Harris, "On the use of windows for harmonic analysis with the discrete Fourier
 *   transform", Proc. IEEE 66(1) (1978) 51–83. [2] G. D'Antona, A. Ferrero, Digital Signal Processing for
 *   Measurement Systems, Springer 2006, p. 70.
 */
export const windowNames = ['rect', 'hann', 'hamming', 'blackman-harris', 'flattop'] as const;
export type WindowName = (typeof windowNames)[number];

const COEFFICIENTS: Record<WindowName, number[]> = {
  rect: [1],
  hann: [0.5, 0.5],
  hamming: [0.54, 0.46],
  'blackman-harris': [0.35875, 0.48829, 0.14128, 0.01168],
  flattop: [0.21557895, 0.41663158, 0.277263158, 0.083578947, 0.006947368],
};

export interface SpectralWindow {
  name: WindowName;
  /** w[n], n = 0…N−1 */
  w: Float32Array;
  /** Σw */
  sum: number;
  /** Σw² */
  sumSquares: number;
  /** Coherent gain Σw/N (Harris [1], Table 1). */
  coherentGain: number;
  /** Equivalent noise bandwidth in bins, N·Σw²/(Σw)² (Harris [1], Table 1). */
  enbwBins: number;
  /**
   * The window as a convolution kernel on the DFT, c_0 = a_0, c_±m = (−1)^m·a_m/2: multiplying a block by
   * a periodic cosine-sum window equals convolving its spectrum with these taps (Harris [1], §V).
   */
  spectralKernel: Float64Array;
}

export function makeWindow(name: WindowName, n: number): SpectralWindow {
  const a = COEFFICIENTS[name];
  if (!a) throw new RangeError(`Unknown window "${name}"; use one of ${windowNames.join(', ')}.`);
  const w = new Float32Array(n);
  let sum = 0;
  let sumSquares = 0;
  for (let i = 0; i < n; i++) {
    let v = 0;
    for (let k = 0; k < a.length; k++) v += (k % 2 ? -a[k] : a[k]) * Math.cos((2 * Math.PI * k * i) / n);
    w[i] = v;
    sum += v;
    sumSquares += v * v;
  }
  const m = a.length - 1;
  const spectralKernel = new Float64Array(2 * m + 1);
  spectralKernel[m] = a[0];
  for (let k = 1; k <= m; k++) spectralKernel[m - k] = spectralKernel[m + k] = (k % 2 ? -a[k] : a[k]) / 2;
  return { name, w, sum, sumSquares, coherentGain: sum / n, enbwBins: (n * sumSquares) / (sum * sum), spectralKernel };
}
