/**
 * Tonal and noise parts of a band's specific loudness from its autocorrelation function, the core of
 * the tonality of ECMA-418-2 [1] clause 6.2 (after Sottek's hearing-model tonality [2]):
 *
 * - 6.2.2: each block's ACF, unbiased (divided by N − lag) and scaled so its value at lag 0 is the
 *   block's squared specific loudness N'². Fanlight takes it of the band signal itself, before the
 *   rectification (an assumption: the clause's exact input is not recalled).
 * - 6.2.3: the scaled ACFs of the band and its neighbours (±1 band, fewer at the ends; the
 *   standard's neighbour count is not recalled) are averaged, which adds a tone's correlation
 *   coherently and a noise's not.
 * - 6.2.4: a lag window past the lags where a noise's ACF has decayed (12 filter time constants τ,
 *   at most a quarter block) and half a block long, Hann-weighted.
 * - 6.2.5: a tone leaves a cosine of undamped amplitude N_t'² in the windowed ACF; the peak of its
 *   spectrum within ±Δf of the band centre gives N_t'² (2·|peak|/Σw) and the tonal frequency
 *   (parabolic interpolation of the log magnitude [3]); the rest of N'² is the noise part. Both are
 *   then averaged over SMOOTHING_S (the frequency weighted by N_t'²).
 *
 * References:
 *   [1] ECMA-418-2, 2nd edition, December 2022, clauses 6.2.2–6.2.5.
 *   [2] R. Sottek, "Progress in calculating tonality of technical sounds", Proc. Inter-Noise 2014.
 *   [3] J. O. Smith, Spectral Audio Signal Processing (W3K, 2011), "Quadratic interpolation of
 *       spectral peaks".
 */
import type { BandBlocks } from './band-blocks';
import { BAND_CENTRES_HZ, HMS_FS_HZ, bandBandwidthHz, gammatoneTimeConstantS } from './filter-bank';

/** Tonal and noise loudness of one band at its blocks' centres. */
export interface BandTonalLoudness {
  centresS: Float64Array;
  /** N_t', the tonal part of the specific loudness (sone_HMS per Bark_HMS). */
  tonal: Float64Array;
  /** N_n', the noise part. */
  noise: Float64Array;
  /** Frequency of the tonal component (Hz). */
  tonalHz: Float64Array;
}

/** Lags (samples) a noise's ACF needs to decay: 12 time constants of the band's gammatone (Fanlight's choice). */
const DECAY_TIME_CONSTANTS = 12;
/**
 * Span (s) over which the blocks' tonal and total loudness are averaged (Fanlight's choice): the
 * short blocks of the high bands (21 ms) alone leave noise a widely scattered tonal fraction, and
 * averaging narrows it. Averaged after the peak is read, not before, so a tone sweeping through a
 * run-up keeps its full tonal loudness.
 */
export const SMOOTHING_S = 0.2;
/** Lines of the K = 2N spectrum either side summed per output line (see the first pass below). */
const KERNEL_REACH = 40;

/** The windowed-ACF spectrum lines searched for band b's tone with blocks of n samples (spacing fs/n), and one either side. */
function searchedLines(band: number, n: number): { first: number; width: number } {
  const fc = BAND_CENTRES_HZ[band];
  const bandwidth = bandBandwidthHz(fc);
  const kLo = Math.max(1, Math.floor(((fc - bandwidth) * n) / HMS_FS_HZ));
  const kHi = Math.min(n / 2 - 1, Math.ceil(((fc + bandwidth) * n) / HMS_FS_HZ));
  return { first: kLo - 1, width: kHi - kLo + 3 };
}

/** Line k of the K = 2n-line spectrum folded onto the stored lines 0 … n (the spectrum is even and K-periodic). */
function foldLine(k: number, n: number): number {
  const nfft = 2 * n;
  const folded = ((k % nfft) + nfft) % nfft;
  return folded > n ? nfft - folded : folded;
}

/**
 * First and last block-spectrum line (0 … n) that {@link bandTonalLoudness} reads for band b with
 * blocks of n samples: the segmentation keeps only these.
 */
export function linesRead(band: number, n: number): [number, number] {
  const { first, width } = searchedLines(band, n);
  let lo = n;
  let hi = 0;
  for (let k = 2 * first - KERNEL_REACH; k <= 2 * (first + width - 1) + KERNEL_REACH; k++) {
    const line = foldLine(k, n);
    lo = Math.min(lo, line);
    hi = Math.max(hi, line);
  }
  return [lo, hi];
}

/**
 * Tonal and noise loudness of band `band` for each of its blocks, from its own blocks and its
 * neighbours' blocks under the same segmentation ({@link BandBlocks}, same blockSize and hop).
 */
export function bandTonalLoudness(band: number, blocks: readonly BandBlocks[]): BandTonalLoudness {
  const own = blocks[0];
  const n = own.blockSize;
  const nfft = 2 * n;
  const fc = BAND_CENTRES_HZ[band];
  const bandwidth = bandBandwidthHz(fc);
  const lag0 = Math.min(n / 4, Math.ceil(DECAY_TIME_CONSTANTS * gammatoneTimeConstantS(bandwidth) * HMS_FS_HZ));
  const m = n / 2;
  const hann = new Float64Array(m);
  // Σ of the window times the biased ACF's taper (N − lag)/N: a cosine of amplitude A in the ACF peaks at A·Σ/2.
  let taperedSum = 0;
  for (let i = 0; i < m; i++) {
    hann[i] = 0.5 - 0.5 * Math.cos((2 * Math.PI * i) / m);
    taperedSum += (hann[i] * (n - lag0 - i)) / n;
  }

  // First pass: each block's windowed-ACF spectrum over the searched bins (and one either side).
  // With S the neighbour-averaged power spectrum of the zero-padded blocks (K = 2N lines) and
  // r = IDFT(S) the ACF, the spectrum of h·r over lags L0 … L0 + M − 1 at line q (spacing fs/N) is
  //   Y(q) = (1/K)·Σ_k S_k·e^(jπ·k·L0/N)·H((2q − k)/K),  H(ν) = Σ_i h_i·e^(−j2πiν),
  // exact when summed over all k; H of a Hann window of M lags has fallen below −60 dB by
  // |2q − k| = KERNEL_REACH, so only those lines are summed (two FFTs per block saved).
  const { first, width } = searchedLines(band, n);
  const reach = KERNEL_REACH;
  const kernelRe = new Float64Array(2 * reach + 1);
  const kernelIm = new Float64Array(2 * reach + 1);
  for (let d = -reach; d <= reach; d++) {
    let re = 0;
    let im = 0;
    for (let i = 0; i < m; i++) {
      const ph = (2 * Math.PI * i * d) / nfft;
      re += hann[i] * Math.cos(ph);
      im -= hann[i] * Math.sin(ph);
    }
    kernelRe[d + reach] = re / nfft;
    kernelIm[d + reach] = im / nfft;
  }
  const kMin = 2 * first - reach;
  const kMax = 2 * (first + width - 1) + reach;
  const span = kMax - kMin + 1;
  const rotRe = new Float64Array(span);
  const rotIm = new Float64Array(span);
  const line = new Int32Array(span);
  for (let j = 0; j < span; j++) {
    const k = kMin + j;
    rotRe[j] = Math.cos((Math.PI * k * lag0) / n);
    rotIm[j] = Math.sin((Math.PI * k * lag0) / n);
    line[j] = foldLine(k, n);
  }
  const sRe = new Float64Array(span);
  const sIm = new Float64Array(span);
  const y = new Float64Array(width * 2);
  const tonalSquares = new Float64Array(own.count);
  const freqs = new Float64Array(own.count).fill(fc);
  const lag0Values = new Float64Array(own.count);
  for (let k = 0; k < own.count; k++) {
    sRe.fill(0);
    let lag0Value = 0;
    for (const b of blocks) {
      const nl = b.loudness[k];
      if (!(b.energy[k] > 0) || nl === 0) continue;
      // Scaled so this band's ACF at lag 0 is N'², clause 6.2.2; averaged over the bands, 6.2.3.
      const w = (nl * nl) / b.energy[k] / blocks.length;
      lag0Value += (nl * nl) / blocks.length;
      const rowLength = b.lines[1] - b.lines[0] + 1;
      const row = k * rowLength - b.lines[0];
      for (let j = 0; j < span; j++) sRe[j] += w * b.power[row + line[j]];
    }
    lag0Values[k] = lag0Value;
    if (lag0Value === 0) continue;
    for (let j = 0; j < span; j++) {
      const v = sRe[j];
      sRe[j] = v * rotRe[j];
      sIm[j] = v * rotIm[j];
    }
    for (let q = 0; q < width; q++) {
      let yr = 0;
      let yi = 0;
      // k = 2q − d for d = −reach … reach, i.e. j = 2(first + q) − d − kMin.
      const j0 = 2 * (first + q) - kMin;
      for (let d = -reach; d <= reach; d++) {
        const j = j0 - d;
        const kr = kernelRe[d + reach];
        const ki = kernelIm[d + reach];
        yr += sRe[j] * kr - sIm[j] * ki;
        yi += sRe[j] * ki + sIm[j] * kr;
      }
      y[2 * q] = yr;
      y[2 * q + 1] = yi;
    }
    const peak = spectrumPeak(y, width);
    tonalSquares[k] = Math.min(lag0Value, (2 * peak.magnitude) / taperedSum);
    freqs[k] = ((first + peak.line) * HMS_FS_HZ) / n;
  }

  // Second pass: moving averages over SMOOTHING_S of N_t'² and N'², and of the frequency weighted by N_t'².
  const half = Math.max(0, Math.round(SMOOTHING_S / 2 / (own.hop / HMS_FS_HZ)));
  let sumTonal = 0;
  let sumLag0 = 0;
  let sumFreq = 0;
  let lo = 0;
  let hi = -1;
  const result: BandTonalLoudness = {
    centresS: own.centresS,
    tonal: new Float64Array(own.count),
    noise: new Float64Array(own.count),
    tonalHz: new Float64Array(own.count).fill(fc),
  };
  for (let k = 0; k < own.count; k++) {
    const wantHi = Math.min(own.count - 1, k + half);
    const wantLo = Math.max(0, k - half);
    while (hi < wantHi) {
      hi++;
      sumTonal += tonalSquares[hi];
      sumLag0 += lag0Values[hi];
      sumFreq += tonalSquares[hi] * freqs[hi];
    }
    while (lo < wantLo) {
      sumTonal -= tonalSquares[lo];
      sumLag0 -= lag0Values[lo];
      sumFreq -= tonalSquares[lo] * freqs[lo];
      lo++;
    }
    const blocksIn = hi - lo + 1;
    const lag0Value = sumLag0 / blocksIn;
    if (!(lag0Value > 0)) continue;
    const tonalSquare = Math.max(0, Math.min(lag0Value, sumTonal / blocksIn));
    result.tonal[k] = Math.sqrt(tonalSquare);
    result.noise[k] = Math.sqrt(lag0Value - tonalSquare);
    if (sumTonal > 0) result.tonalHz[k] = sumFreq / sumTonal;
  }
  return result;
}

/** Largest magnitude of lines 1 … width − 2 of interleaved y, refined by quadratic interpolation of the log magnitude [3]. */
function spectrumPeak(y: Float64Array, width: number): { line: number; magnitude: number } {
  let best = 1;
  let bestMag = -1;
  for (let i = 1; i < width - 1; i++) {
    const mag = Math.hypot(y[2 * i], y[2 * i + 1]);
    if (mag > bestMag) {
      bestMag = mag;
      best = i;
    }
  }
  const a = Math.log(Math.hypot(y[2 * best - 2], y[2 * best - 1]) + 1e-300);
  const b = Math.log(bestMag + 1e-300);
  const c = Math.log(Math.hypot(y[2 * best + 2], y[2 * best + 3]) + 1e-300);
  const den = a - 2 * b + c;
  const delta = den < 0 ? Math.max(-0.5, Math.min(0.5, (0.5 * (a - c)) / den)) : 0;
  return { line: best + delta, magnitude: Math.exp(b - 0.25 * (a - c) * delta) };
}
