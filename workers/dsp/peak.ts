/**
 * A spectral peak near a frequency, located between bins: the strongest bin within a search window, then
 * the vertex of the parabola through the log-magnitude of that bin and its two neighbours — quadratic
 * interpolation of spectral peaks (J. O. Smith and X. Serra, "PARSHL", ICMC 1987; J. O. Smith, Spectral
 * Audio Signal Processing, 2011, "Quadratic Interpolation of Spectral Peaks" [from memory]). A dozen
 * lines of arithmetic, so no package.
 */

export interface SpectralPeak {
  /** Fractional bin of the vertex */
  bin: number;
  /** dB (10·lg of the power) at the vertex */
  db: number;
}

/**
 * The vertex of the parabola through 10·lg P at bins k − 1, k, k + 1 (k inside the spectrum), offset
 * p = ½(α − γ)/(α − 2β + γ), level β − ¼(α − γ)p.
 */
export function interpolatePeak(power: ArrayLike<number>, k: number): SpectralPeak {
  const db = (i: number) => 10 * Math.log10(Math.max(power[i], 1e-30));
  if (k <= 0 || k >= power.length - 1) return { bin: k, db: db(k) };
  const a = db(k - 1);
  const b = db(k);
  const c = db(k + 1);
  const denom = a - 2 * b + c;
  const p = denom < 0 ? Math.max(-0.5, Math.min(0.5, (0.5 * (a - c)) / denom)) : 0;
  return { bin: k + p, db: b - 0.25 * (a - c) * p };
}

/** A line stands this far above the median level of the search window, dB (common practice). */
const PROMINENCE_DB = 10;

/**
 * The interpolated peak of the line nearest `bin` within ±halfWidth bins: the local maxima that stand
 * PROMINENCE_DB above the window's median level, the nearest of them (the stronger on a tie); null when
 * no line stands out there.
 */
export function peakNear(power: ArrayLike<number>, bin: number, halfWidth: number): SpectralPeak | null {
  const lo = Math.max(1, Math.floor(bin - halfWidth));
  const hi = Math.min(power.length - 2, Math.ceil(bin + halfWidth));
  if (hi < lo) return null;
  const db = (k: number) => 10 * Math.log10(Math.max(power[k], 1e-30));
  const levels: number[] = [];
  for (let k = lo; k <= hi; k++) levels.push(db(k));
  const floor = [...levels].sort((a, b) => a - b)[levels.length >> 1];
  let best = -1;
  for (let k = lo; k <= hi; k++) {
    if (!(power[k] > 0 && power[k] >= power[k - 1] && power[k] >= power[k + 1] && db(k) - floor >= PROMINENCE_DB)) continue;
    const nearer = best < 0 || Math.abs(k - bin) < Math.abs(best - bin) || (Math.abs(k - bin) === Math.abs(best - bin) && power[k] > power[best]);
    if (nearer) best = k;
  }
  return best < 0 ? null : interpolatePeak(power, best);
}
