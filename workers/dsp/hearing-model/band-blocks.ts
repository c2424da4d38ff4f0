/**
 * Per-band blocks of the hearing model of ECMA-418-2 [1]: segmentation (clause 5.1.5), the
 * specific loudness of each block (5.1.6–5.1.9, nonlinearity.ts), and the block's power spectrum,
 * from which the tonality's autocorrelation function (clause 6.2.2) is taken by the
 * Wiener–Khinchin relation [2] (FFT of twice the block length, so the circular ACF is the linear one).
 *
 * References:
 *   [1] ECMA-418-2, 2nd edition, December 2022, clauses 5.1.5–5.1.9 and 6.2.2.
 *   [2] J. S. Bendat, A. G. Piersol, Random Data, 4th ed. (Wiley, 2010), §11.4.2 (correlation
 *       functions via FFT with zero padding).
 */
import FFTJS from 'fft.js';
import { HMS_FS_HZ } from './filter-bank';
import { rectifiedRms, specificLoudness } from './nonlinearity';

/** A band's blocks under one segmentation. */
export interface BandBlocks {
  blockSize: number;
  hop: number;
  count: number;
  /** Centre time of each block (s from the signal's start). */
  centresS: Float64Array;
  /** Σ u² over each block, the ACF's lag-0 sum (Pa²). */
  energy: Float64Array;
  /** Specific loudness N' of each block (sone_HMS per Bark_HMS). */
  loudness: Float64Array;
  /** First and last spectrum line kept (the lines the tonality reads; all others are dropped to save memory). */
  lines: [number, number];
  /** |U[k]|² of each zero-padded block for k = lines[0] … lines[1], row after row. */
  power: Float32Array;
}

const ffts = new Map<number, FFTJS>();
/** A cached fft.js plan of size n (fft.js is synchronous, so the model runs without awaiting PFFFT). */
export function fftPlan(n: number): FFTJS {
  let f = ffts.get(n);
  if (!f) {
    f = new FFTJS(n);
    ffts.set(n, f);
  }
  return f;
}

/** Number of blocks of size n at hop h over length samples: full blocks only, and at least one (zero-padded). */
export function blockCount(length: number, n: number, hop: number): number {
  return length >= n ? 1 + Math.floor((length - n) / hop) : 1;
}

/**
 * Segments band signal u into blocks of blockSize at hop blockSize/4 (clause 5.1.5 [1]) and computes
 * each block's specific loudness and power spectrum.
 *
 * @param u                  band signal at 48 kHz (Pa)
 * @param blockSize          block length (samples), a power of two
 * @param thresholdLoudness  the band's specific loudness at the threshold in quiet
 * @param lines              first and last line (0 … blockSize) of the spectra to keep
 */
export function segmentBand(
  u: Float64Array,
  blockSize: number,
  thresholdLoudness: number,
  lines: [number, number] = [0, blockSize],
): BandBlocks {
  const hop = blockSize / 4;
  const count = blockCount(u.length, blockSize, hop);
  const nfft = 2 * blockSize;
  const [firstLine, lastLine] = lines;
  const rowLength = lastLine - firstLine + 1;
  const fft = fftPlan(nfft);
  const buf = new Float64Array(nfft);
  const spec = fft.createComplexArray() as number[];
  const out: BandBlocks = {
    blockSize,
    hop,
    count,
    centresS: new Float64Array(count),
    energy: new Float64Array(count),
    loudness: new Float64Array(count),
    lines: [firstLine, lastLine],
    power: new Float32Array(count * rowLength),
  };
  for (let k = 0; k < count; k++) {
    const start = k * hop;
    buf.fill(0);
    let energy = 0;
    const end = Math.min(u.length, start + blockSize);
    for (let n = start; n < end; n++) {
      const v = u[n];
      buf[n - start] = v;
      energy += v * v;
    }
    out.centresS[k] = (start + blockSize / 2) / HMS_FS_HZ;
    out.energy[k] = energy;
    out.loudness[k] = specificLoudness(rectifiedRms(u, start, blockSize), thresholdLoudness);
    fft.realTransform(spec, buf);
    const row = k * rowLength;
    for (let i = firstLine; i <= lastLine; i++) {
      const re = spec[2 * i];
      const im = spec[2 * i + 1];
      out.power[row + i - firstLine] = re * re + im * im;
    }
  }
  return out;
}
