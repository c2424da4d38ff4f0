/**
 * From FFT power to the amplitude scalings engineers read, per bin of a one-sided spectrum.
 *
 * Fanlight keeps every spectrum as P[k], the mean square in bin k ('spectrum' scaling of
 * scipy.signal.periodogram/welch/spectrogram, mode 'psd'): P[k] = c_k·|X[k]|²/(Σw)² with c_k = 2 for
 * 0 < k < N/2 and 1 at DC and Nyquist, so a bin-centred sine of amplitude A reads A²/2 (Harris [1]).
 * - peak amplitude = √(c_k·P[k]) (A for that sine);
 * - RMS amplitude = √P[k] (A/√2);
 * - power spectral density = P[k]/(ENBW·Δf) in units²/Hz, the window's equivalent noise bandwidth
 *   (Harris [1]) turning bin power into density, so white noise reads its true density
 *   (scipy 'density' scaling: 2|X|²/(fs·Σw²)).
 * References: [1] F. J. Harris, Proc. IEEE 66(1) (1978) 51–83. [2] P. Welch, IEEE Trans. Audio
 *   Electroacoust. 15 (1967) 70–73.
 */
export const amplitudeScalings = ['peak', 'rms', 'psd'] as const;
export type AmplitudeScaling = (typeof amplitudeScalings)[number];

/** The factor that turns mean-square bin power P into the scaling's squared quantity (or density). */
export function powerToScaledSquare(scaling: AmplitudeScaling, bin: number, bins: number, enbwBins: number, binHz: number): number {
  const edge = bin === 0 || bin === bins - 1;
  if (scaling === 'peak') return edge ? 1 : 2;
  if (scaling === 'rms') return 1;
  return 1 / (enbwBins * binHz);
}

/** Linear values (amplitude for peak/RMS, density for psd) of one spectrum of mean-square powers. */
export function scaleSpectrum(power: Float32Array | Float64Array, scaling: AmplitudeScaling, enbwBins: number, binHz: number): Float64Array {
  const out = new Float64Array(power.length);
  for (let k = 0; k < power.length; k++) {
    const v = power[k] * powerToScaledSquare(scaling, k, power.length, enbwBins, binHz);
    out[k] = scaling === 'psd' ? v : Math.sqrt(v);
  }
  return out;
}
