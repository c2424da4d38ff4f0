/**
 * Vold–Kalman order tracking filter, second generation [1], [2]: the complex envelopes x_k(n) of several
 * components y(n) ≈ Σ_k x_k(n)·e^{jΘ_k(n)} (+ their conjugates), each of known instantaneous frequency
 * f_k(n) (Θ_k its running phase), estimated together so that components whose frequencies cross are
 * separated rather than summed.
 *
 * Method: minimise  r²·Σ_k Σ_n |x_k(n) − 2x_k(n+1) + x_k(n+2)|²  +  Σ_n |y(n) − Σ_k x_k(n)·e^{jΘ_k(n)}|²
 * (the structural equation of a two-pole filter: envelopes are locally linear; the data equation couples
 * the components). The normal equations (r²·DᵀD ⊗ I + C) X = Cᴴy, with C(n)_{kl} = conj(c_k)·c_l and
 * c_k = e^{jΘ_k(n)}, are Hermitian positive definite and, with the unknowns ordered by time (K per sample),
 * banded with half-bandwidth 3K − 1: solved by a banded Cholesky factorisation L·Lᴴ in O(N·K³) [3].
 * Long recordings are solved in overlapping blocks whose centres are kept and whose overlaps are
 * cross-faded (the envelope is smooth, so the seams leave no mark).
 *
 * Bandwidth: for one component the filter's amplitude response to a line Δf away from its frequency is
 * H(Δω) = 1/(1 + r²·|1 − e^{−jΔω}|⁴) = 1/(1 + r²·(2 − 2cos Δω)²), Δω = 2πΔf/fs (from the normal
 * equations in the frequency domain). H = 1/√2 (−3 dB) at Δf = ±B/2 gives the exact relation
 *   r = √(√2 − 1) / (2 − 2cos(πB/fs)),
 * the one given for the two-pole filter by Tůma [2] (derived here, and checked numerically in the tests).
 *
 * Conventions: the envelope of a real component A·cos(Θ + φ) is x = (A/2)·e^{jφ} (the conjugate term is
 * rejected as a line at −2f); the component's time signal is 2·Re(x·e^{jΘ}) and its RMS |x|·√2.
 * Written here: no npm package implements the Vold–Kalman filter (searched: none for JavaScript).
 *
 * References: [1] H. Vold, J. Leuridan, "High resolution order tracking at extreme slew rates, using Kalman
 *   tracking filters", SAE 931288, 1993. [2] H. Vold, M. Mains, J. Blough, "Theoretical foundations for
 *   high performance order tracking with the Vold-Kalman tracking filter", SAE 972007 (1997); J. Tůma,
 *   "Setting the passband width in the Vold-Kalman order tracking filter", ICSV12, Lisbon 2005.
 *   [3] G. H. Golub, C. F. Van Loan, Matrix Computations, 4th ed., 2013, §4.3 (banded Cholesky).
 */

export interface VoldKalmanOptions {
  /** −3 dB bandwidth B of each component's filter, Hz (the passband is f_k ± B/2). */
  bandwidthHz: number;
  /** Block length for long signals, samples (default: enough for 8 settling times, at least 32768). */
  blockSamples?: number;
}

export interface VoldKalmanResult {
  /** Envelope of component k: re and im, N samples each (peak amplitude / 2, phase). */
  re: Float64Array[];
  im: Float64Array[];
  /** The component's time signal 2·Re(x·e^{jΘ}), same unit as y. */
  signal(k: number): Float32Array;
}

/** The weight r of the structural equation for a −3 dB bandwidth B at sampling rate fs (Tůma 2005). */
export function voldKalmanWeight(bandwidthHz: number, fsHz: number): number {
  if (!(bandwidthHz > 0 && bandwidthHz < fsHz / 2)) throw new RangeError(`The bandwidth must be above 0 and below fs/2, not ${bandwidthHz} Hz.`);
  return Math.sqrt(Math.SQRT2 - 1) / (2 - 2 * Math.cos((Math.PI * bandwidthHz) / fsHz));
}

/** The running phase Θ(n) = 2π·Σ f(i)/fs of an instantaneous frequency (trapezoidal), rad. */
export function phaseOf(freqHz: Float64Array | Float32Array, fsHz: number): Float64Array {
  const out = new Float64Array(freqHz.length);
  let acc = 0;
  for (let n = 1; n < freqHz.length; n++) {
    acc += (Math.PI * (freqHz[n - 1] + freqHz[n])) / fsHz;
    out[n] = acc;
  }
  return out;
}

/**
 * Solves one block [from, to) of the coupled filter. Returns the envelopes (re, im) per component.
 */
function solveBlock(y: Float32Array, phases: Float64Array[], from: number, to: number, r2: number): { re: Float64Array[]; im: Float64Array[] } {
  const K = phases.length;
  const N = to - from;
  const size = N * K;
  const w = 3 * K - 1; // half-bandwidth
  const W = w + 1;
  // lower band of A: row u holds columns u − w … u at offsets 0 … w (offset w is the diagonal)
  const aRe = new Float64Array(size * W);
  const aIm = new Float64Array(size * W);
  const bRe = new Float64Array(size);
  const bIm = new Float64Array(size);
  const cRe = new Float64Array(K);
  const cIm = new Float64Array(K);
  const at = (u: number, v: number) => u * W + (v - u + w);
  // structural part r²·DᵀD ⊗ I: rows i = 0 … N−3 of D are [1, −2, 1] at i, i+1, i+2
  const d = [1, -2, 1];
  for (let i = 0; i + 2 < N; i++) {
    for (let a = 0; a < 3; a++) {
      for (let b = 0; b <= a; b++) {
        const v = r2 * d[a] * d[b];
        const n = i + a;
        const m = i + b; // m ≤ n
        for (let k = 0; k < K; k++) aRe[at(n * K + k, m * K + k)] += v;
      }
    }
  }
  // data part: C(n)_{kl} = conj(c_k)·c_l on the diagonal blocks, and the right-hand side conj(c_k)·y
  for (let n = 0; n < N; n++) {
    for (let k = 0; k < K; k++) {
      const th = phases[k][from + n];
      cRe[k] = Math.cos(th);
      cIm[k] = Math.sin(th);
    }
    const yn = y[from + n];
    for (let k = 0; k < K; k++) {
      const u = n * K + k;
      bRe[u] = cRe[k] * yn;
      bIm[u] = -cIm[k] * yn;
      for (let l = 0; l <= k; l++) {
        // conj(c_k)·c_l
        const idx = at(u, n * K + l);
        aRe[idx] += cRe[k] * cRe[l] + cIm[k] * cIm[l];
        aIm[idx] += cRe[k] * cIm[l] - cIm[k] * cRe[l];
      }
    }
  }
  // banded Cholesky A = L·Lᴴ in place (L lower, real positive diagonal) [3]
  for (let i = 0; i < size; i++) {
    const j0 = Math.max(0, i - w);
    for (let j = j0; j <= i; j++) {
      let sRe = aRe[at(i, j)];
      let sIm = aIm[at(i, j)];
      const k0 = Math.max(j0, j - w);
      for (let k = k0; k < j; k++) {
        // L[i][k]·conj(L[j][k])
        const p = at(i, k);
        const q = at(j, k);
        sRe -= aRe[p] * aRe[q] + aIm[p] * aIm[q];
        sIm -= aIm[p] * aRe[q] - aRe[p] * aIm[q];
      }
      if (j === i) {
        if (!(sRe > 0)) throw new Error('The Vold–Kalman system is not positive definite (a component with no data?).');
        aRe[at(i, i)] = Math.sqrt(sRe);
        aIm[at(i, i)] = 0;
      } else {
        const djj = aRe[at(j, j)];
        aRe[at(i, j)] = sRe / djj;
        aIm[at(i, j)] = sIm / djj;
      }
    }
  }
  // forward: L·z = b
  for (let i = 0; i < size; i++) {
    let sRe = bRe[i];
    let sIm = bIm[i];
    for (let k = Math.max(0, i - w); k < i; k++) {
      const p = at(i, k);
      sRe -= aRe[p] * bRe[k] - aIm[p] * bIm[k];
      sIm -= aRe[p] * bIm[k] + aIm[p] * bRe[k];
    }
    const dii = aRe[at(i, i)];
    bRe[i] = sRe / dii;
    bIm[i] = sIm / dii;
  }
  // backward: Lᴴ·x = z
  for (let i = size - 1; i >= 0; i--) {
    let sRe = bRe[i];
    let sIm = bIm[i];
    for (let k = i + 1; k <= Math.min(size - 1, i + w); k++) {
      // conj(L[k][i])·x_k
      const p = at(k, i);
      sRe -= aRe[p] * bRe[k] + aIm[p] * bIm[k];
      sIm -= aRe[p] * bIm[k] - aIm[p] * bRe[k];
    }
    const dii = aRe[at(i, i)];
    bRe[i] = sRe / dii;
    bIm[i] = sIm / dii;
  }
  const re = Array.from({ length: K }, () => new Float64Array(N));
  const im = Array.from({ length: K }, () => new Float64Array(N));
  for (let n = 0; n < N; n++) {
    for (let k = 0; k < K; k++) {
      re[k][n] = bRe[n * K + k];
      im[k][n] = bIm[n * K + k];
    }
  }
  return { re, im };
}

/**
 * The coupled Vold–Kalman filter over a whole signal.
 * @param y      the signal, unit U
 * @param fsHz   sampling rate, Hz
 * @param freqHz instantaneous frequency of each component per sample, Hz (≥ 0)
 * @returns the envelopes and each component's time signal (unit U)
 */
export function voldKalman(y: Float32Array, fsHz: number, freqHz: (Float64Array | Float32Array)[], opts: VoldKalmanOptions): VoldKalmanResult {
  if (!freqHz.length) throw new RangeError('Name at least one component to extract.');
  for (const f of freqHz) if (f.length !== y.length) throw new RangeError('Each component needs one frequency per sample of the signal.');
  const r = voldKalmanWeight(opts.bandwidthHz, fsHz);
  const r2 = r * r;
  const K = freqHz.length;
  const N = y.length;
  const phases = freqHz.map((f) => phaseOf(f, fsHz));
  // the envelope settles within a few time constants of the filter, about fs/(π·B) samples
  const settle = Math.ceil((3 * fsHz) / (Math.PI * opts.bandwidthHz));
  const overlap = Math.max(2048, settle);
  const blockLen = Math.max(opts.blockSamples ?? 0, 32768, 8 * overlap);
  const re = Array.from({ length: K }, () => new Float64Array(N));
  const im = Array.from({ length: K }, () => new Float64Array(N));
  if (N <= blockLen) {
    const s = solveBlock(y, phases, 0, N, r2);
    for (let k = 0; k < K; k++) {
      re[k].set(s.re[k]);
      im[k].set(s.im[k]);
    }
  } else {
    // blocks [start, start + blockLen) stepping by blockLen − overlap; the overlaps are cross-faded
    const step = blockLen - overlap;
    for (let start = 0; start < N; start += step) {
      const end = Math.min(N, start + blockLen);
      const s = solveBlock(y, phases, start, end, r2);
      for (let n = start; n < end; n++) {
        const i = n - start;
        // weight 0 → 1 across the overlap with the previous block (the first block starts at 1)
        const rise = start === 0 ? 1 : Math.min(1, (i + 0.5) / overlap);
        for (let k = 0; k < K; k++) {
          re[k][n] = re[k][n] * (1 - rise) + s.re[k][i] * rise;
          im[k][n] = im[k][n] * (1 - rise) + s.im[k][i] * rise;
        }
      }
      if (end === N) break;
    }
  }
  return {
    re,
    im,
    signal(k: number) {
      const out = new Float32Array(N);
      const ph = phases[k];
      for (let n = 0; n < N; n++) out[n] = 2 * (re[k][n] * Math.cos(ph[n]) - im[k][n] * Math.sin(ph[n]));
      return out;
    },
  };
}
