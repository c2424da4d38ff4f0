/**
 * Finds the PWM carrier on its own, frame by frame, from short-time spectra.
 *
 * Method (ours, built on the structure of PWM spectra [1]): the carrier families m·fc ± n·fe are
 * symmetric about m·fc, whether or not the line at m·fc itself is there (in phase currents and in the
 * radial force it drives, it often is not). Each frame's strongest peaks vote for the midpoints of the
 * pairs of peaks with similar levels (and, less, for themselves); the carrier is the best-supported
 * centre, taken at m = 1 when the half frequency also holds a family. Machine orders form regular combs
 * that are symmetric too, but they sweep with speed, while the carrier holds still: votes summed over
 * about half a second of frames pile up at the steady centre and spread along a sweeping order, and
 * the steps of a schedule survive.
 * References: [1] D. G. Holmes, T. A. Lipo, Pulse Width Modulation for Power Converters, Wiley-IEEE
 *   2003, ch. 3 (double Fourier series of carrier-based PWM); H. S. Black, Modulation Theory, 1953.
 */
import type { StftLayout } from './stft';

export interface CarrierOptions {
  minHz?: number;
  maxHz?: number;
  peaksPerFrame?: number;
  /** Length of the window over which votes are summed, s (default 0.6 s) */
  medianS?: number;
}

export interface CarrierTrack {
  /** Carrier per frame after the running median, Hz (NaN where no family was found) */
  hz: Float64Array;
  /** The frame's own best centre before the median, Hz */
  rawHz: Float64Array;
  /** Support of the frame's best centre, dB·pairs */
  score: Float64Array;
}

const FLOOR_BLOCK = 64;

/** Per-bin noise floor in dB: the 25th percentile of each block of 64 bins, linearly interpolated. */
function noiseFloor(db: Float64Array): Float64Array {
  const n = db.length;
  const blocks = Math.ceil(n / FLOOR_BLOCK);
  const levels = new Float64Array(blocks);
  const tmp = new Float64Array(FLOOR_BLOCK);
  for (let b = 0; b < blocks; b++) {
    const from = b * FLOOR_BLOCK;
    const m = Math.min(FLOOR_BLOCK, n - from);
    for (let i = 0; i < m; i++) tmp[i] = db[from + i];
    const sorted = tmp.subarray(0, m).sort();
    levels[b] = sorted[Math.floor(m * 0.25)];
  }
  const floor = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    const pos = k / FLOOR_BLOCK - 0.5;
    const b = Math.max(0, Math.min(blocks - 1, Math.floor(pos)));
    const b2 = Math.min(blocks - 1, b + 1);
    const frac = Math.max(0, Math.min(1, pos - b));
    floor[k] = levels[b] * (1 - frac) + levels[b2] * frac;
  }
  return floor;
}

interface Peak {
  bin: number;
  height: number; // dB above the floor
}

/**
 * The frame's strongest peaks above the floor, and the top of its spectrum smoothed over ±6 bins: a
 * spread carrier is a hump of noisy bins rather than a line, and only the smoothed spectrum shows its
 * centre.
 */
function framePeaks(
  power: Float32Array,
  row: number,
  bins: number,
  lo: number,
  hi: number,
  count: number,
  db: Float64Array,
): { peaks: Peak[]; hump: Peak | null } {
  for (let k = 0; k < bins; k++) db[k] = 10 * Math.log10(power[row + k] + 1e-30);
  const floor = noiseFloor(db);
  let hump: Peak | null = null;
  let acc = 0;
  for (let k = lo - 6; k <= lo + 6; k++) acc += power[row + k];
  for (let k = lo; k < hi; k++) {
    const h = 10 * Math.log10(acc / 13 + 1e-30) - floor[k];
    if (h > 10 && (!hump || h > hump.height)) hump = { bin: k, height: h };
    acc += power[row + Math.min(bins - 1, k + 7)] - power[row + k - 6];
  }
  const peaks: Peak[] = [];
  for (let k = Math.max(1, lo); k < Math.min(bins - 1, hi); k++) {
    const h = db[k] - floor[k];
    if (h > 10 && db[k] > db[k - 1] && db[k] >= db[k + 1]) peaks.push({ bin: k, height: h });
  }
  peaks.sort((a, b) => b.height - a.height);
  return { peaks: peaks.slice(0, count), hump };
}

/**
 * The best-supported centre of symmetric peak pairs, in bins (half-bin resolution), and its support.
 * A pair counts only when its half spacing is under MAX_SPREAD of its centre: families reach a few fe
 * from m·fc, and the pulse ratio fc/fe stays above about 10 (common practice), while pairs straddling
 * two carrier groups (fc and 2fc) are much wider.
 */
const MAX_SPREAD = 0.22;

function frameVotes(peaks: Peak[], hump: Peak | null, lo: number, hi: number, votes: Float32Array): void {
  votes.fill(0);
  const vote = (halfBin: number, w: number) => {
    if (halfBin >= 2 * lo && halfBin < 2 * hi) {
      votes[halfBin] += w;
      votes[halfBin - 1] += w / 2;
      votes[halfBin + 1] += w / 2;
    }
  };
  if (hump) vote(2 * hump.bin, hump.height);
  for (let i = 0; i < peaks.length; i++) {
    vote(2 * peaks[i].bin, peaks[i].height * 0.5);
    for (let j = i + 1; j < peaks.length; j++) {
      if (Math.abs(peaks[i].height - peaks[j].height) > 12) continue;
      const centre = (peaks[i].bin + peaks[j].bin) / 2;
      if (Math.abs(peaks[i].bin - peaks[j].bin) / 2 > MAX_SPREAD * centre) continue;
      vote(peaks[i].bin + peaks[j].bin, Math.min(peaks[i].height, peaks[j].height));
    }
  }
}

/** The highest group m·fc that may win the vote and still be traced back to fc. */
const HARMONICS = 8;
/** A centre is taken as fc under a winning multiple when its own support is at least this share. */
const CANDIDATE_SHARE = 0.1;

/**
 * The carrier from a vote histogram (half-bin units → bins). Each family group votes for its own centre
 * m·fc, and in a line-to-line voltage the group at fc is weaker than those at 2fc and above (the double
 * Fourier series leaves fc ± 2fe and 2fc ± fe strongest, and fc itself absent [1]), so the best-supported
 * centre may be a multiple k·fc. When a well-supported centre sits at the winner divided by a whole k
 * (k = 2 … 8), and the winner's other multiples of it hold groups too, that lower centre is fc. A centre
 * with no family of its own is no candidate, so fc/2 cannot be taken; two carriers of a schedule inside one
 * vote window (8 and 12 kHz) are not whole multiples of each other and do not mix.
 */
function bestCentre(votes: Float32Array, lo: number, hi: number): { bin: number; score: number } {
  const tops: { h: number; score: number }[] = [];
  for (let h = 2 * lo + 1; h < 2 * hi - 1; h++) {
    const v = votes[h];
    if (v > 0 && v >= votes[h - 1] && v > votes[h + 1]) tops.push({ h, score: v });
  }
  tops.sort((a, b) => b.score - a.score);
  const winner = tops[0];
  if (!winner) return { bin: NaN, score: 0 };
  let fc = winner;
  for (const c of tops.slice(1, 40)) {
    if (c.score < CANDIDATE_SHARE * winner.score || c.h >= fc.h) continue;
    const k = Math.round(winner.h / c.h);
    if (k < 2 || k > HARMONICS) continue;
    if (Math.abs(winner.h - k * c.h) > 2 + 0.005 * winner.h) continue;
    fc = c; // the lowest such centre: the fundamental of the winning group
  }
  // Neighbouring groups m·fc and (m+1)·fc pair up across their gap and vote for (m + ½)·fc + …: such a
  // centre has no groups at its own multiples. A candidate whose multiples hold clearly more support
  // (the harmonic sum over m = 1 … 4, half as much again) is the carrier.
  const harmonicSum = (h: number) => {
    let sum = 0;
    for (let m = 1; m <= 4 && m * h < 2 * hi; m++) sum += votesNear(votes, m * h, 2 + 0.005 * m * h);
    return sum;
  };
  let fcSum = harmonicSum(fc.h);
  for (const c of tops.slice(0, 40)) {
    if (c.score < CANDIDATE_SHARE * winner.score || c === fc) continue;
    const sum = harmonicSum(c.h);
    if (sum > 1.5 * fcSum) {
      fc = c;
      fcSum = sum;
    }
  }
  return { bin: fc.h / 2, score: fc.score };
}

/** The largest vote within ±tol half-bins of h. */
function votesNear(votes: Float32Array, h: number, tol: number): number {
  let best = 0;
  for (let i = Math.max(0, Math.floor(h - tol)); i <= Math.min(votes.length - 1, Math.ceil(h + tol)); i++) if (votes[i] > best) best = votes[i];
  return best;
}

function runningMedian(x: Float64Array, width: number): Float64Array {
  const out = new Float64Array(x.length);
  const half = Math.floor(width / 2);
  const buf: number[] = [];
  for (let i = 0; i < x.length; i++) {
    buf.length = 0;
    for (let j = Math.max(0, i - half); j <= Math.min(x.length - 1, i + half); j++) if (Number.isFinite(x[j])) buf.push(x[j]);
    if (buf.length < Math.max(1, half / 2)) out[i] = NaN;
    else {
      buf.sort((a, b) => a - b);
      out[i] = buf[buf.length >> 1];
    }
  }
  return out;
}

/** The span of frames whose votes detectCarrier sums, s (its `medianS` by default). */
export const VOTE_WINDOW_S = 0.6;

export function detectCarrier(power: Float32Array, layout: StftLayout, opts: CarrierOptions = {}): CarrierTrack {
  const bins = layout.bins;
  const frames = layout.frames;
  const lo = Math.max(8, Math.round((opts.minHz ?? 1000) / layout.binHz));
  const hi = Math.min(bins - 8, Math.round((opts.maxHz ?? layout.fsHz * 0.475) / layout.binHz));
  const db = new Float64Array(bins);
  const rawHz = new Float64Array(frames);
  const score = new Float64Array(frames);
  // Votes summed over a sliding window of frames: a steady carrier piles up in one place, a sweeping
  // order spreads its votes along its path.
  const half = Math.max(1, Math.round((opts.medianS ?? VOTE_WINDOW_S) / layout.hopS / 2));
  const width = 2 * half + 1;
  const ring = Array.from({ length: width }, () => new Float32Array(2 * bins + 2));
  const sum = new Float32Array(2 * bins + 2);
  const evaluate = (centre: number) => {
    const c = bestCentre(sum, lo, hi);
    rawHz[centre] = c.bin * layout.binHz;
    score[centre] = c.score;
  };
  for (let f = 0; f < frames + half; f++) {
    if (f >= width) {
      const old = ring[f % width];
      for (let h = 0; h < sum.length; h++) sum[h] -= old[h];
      old.fill(0);
    }
    if (f < frames) {
      const v = ring[f % width];
      const { peaks, hump } = framePeaks(power, f * bins, bins, lo, hi, opts.peaksPerFrame ?? 24, db);
      frameVotes(peaks, hump, lo, hi, v);
      for (let h = 0; h < sum.length; h++) sum[h] += v[h];
    }
    const centre = f - half;
    if (centre >= 0 && centre < frames) evaluate(centre);
  }
  return { hz: runningMedian(rawHz, 3), rawHz, score };
}

/**
 * Width of a spread (swept or randomly modulated) carrier: in one frame's spectrum around fc, the
 * contiguous span where the envelope stays within 10 dB of its top (for a swept carrier about Carson's
 * bandwidth 2(Δf + f_mod), i.e. the sweep range plus twice the sweep rate). A steady line with its near
 * sidebands stays under 300 Hz and gives null.
 */
export function carrierSpreadHz(
  avgPower: Float32Array | Float64Array,
  binHz: number,
  fcHz: number,
  /** The shaft frequency fr, Hz, where the speed is known: lines on a comb of fc + n·q·fr are sidebands */
  frHz?: number,
): number | null {
  const k0 = Math.round(fcHz / binHz);
  const reach = Math.round((0.25 * fcHz) / binHz);
  const r = Math.max(4, Math.round(SPREAD_ENVELOPE_HZ / binHz));
  if (!(k0 - reach - r > 1 && k0 + reach + r < avgPower.length - 1)) return null;
  // the envelope: a running maximum over ±r bins bridges the fine line structure of a swept carrier
  // (an FM comb at the sweep rate) and the scatter of a random one
  const smooth = new Float64Array(2 * reach + 1);
  for (let i = 0; i < smooth.length; i++) {
    let m = 0;
    for (let j = k0 - reach + i - r; j <= k0 - reach + i + r; j++) if (avgPower[j] > m) m = avgPower[j];
    smooth[i] = m;
  }
  const sorted = Array.from(smooth).sort((a, b) => a - b);
  // a low percentile: a wide hump (a spread carrier with its sidebands) may fill half the window
  const floor = sorted[Math.floor(sorted.length * 0.1)];
  // the strongest smoothed component near fc (the carrier line, or its hump)
  let ip = reach;
  for (let i = reach - Math.round(reach / 5); i <= reach + Math.round(reach / 5); i++) if (smooth[i] > smooth[ip]) ip = i;
  if (!(smooth[ip] > 100 * floor)) return null; // nothing 20 dB above the floor: no carrier to measure
  const limit = smooth[ip] / 10; // −10 dB
  let a = ip;
  let b = ip;
  while (a > 0 && smooth[a - 1] >= limit) a--;
  while (b < smooth.length - 1 && smooth[b + 1] >= limit) b++;
  const widthHz = (b - a + 1 - 2 * r) * binHz; // less the envelope window's own width
  if (!(widthHz > SPREAD_MIN_HZ)) return null;
  if (frHz !== undefined && frHz > 0 && linesAreSidebands(avgPower, k0 - reach + a, k0 - reach + b, binHz, fcHz, frHz)) return null;
  return widthHz;
}

/**
 * Whether the lines inside a hump are the carrier's own sidebands fc + n·fe: at low speed fe is a few tens
 * of Hz, and fc ± fe, fc ± 3fe … (or fc ± 2fe, fc ± 4fe in a line-to-line voltage) lie closer together
 * than the envelope bridges, so they look like a hump. Sidebands sit on a comb fc + n·q·fr, with fr the
 * shaft frequency and q = p or 2p (p the pole pairs, 1 … 8, not needed here); a spread carrier's lines (the
 * comb of a swept carrier at its sweep rate, or noise) mostly fall between them. The lines are the local
 * maxima within 20 dB of the strongest (common practice); when 80 % of them, and at least two, sit within
 * a bin and a half of one such comb whose teeth stand clearly apart, the hump is a sideband family.
 */
function linesAreSidebands(power: Float32Array | Float64Array, from: number, to: number, binHz: number, fcHz: number, frHz: number): boolean {
  let top = 0;
  for (let k = from; k <= to; k++) if (power[k] > top) top = power[k];
  const floor = top / 100;
  const lines: number[] = [];
  for (let k = Math.max(1, from); k <= Math.min(power.length - 2, to); k++) {
    if (power[k] >= floor && power[k] > power[k - 1] && power[k] >= power[k + 1]) lines.push(k * binHz);
  }
  if (lines.length < 2) return false;
  const tolHz = 1.5 * binHz;
  for (let q = 1; q <= 16; q++) {
    const spacing = q * frHz;
    // a comb as fine as the tolerance explains anything
    if (spacing < 4 * tolHz) continue;
    let explained = 0;
    for (const f of lines) {
      const n = Math.round((f - fcHz) / spacing);
      if (Math.abs(f - (fcHz + n * spacing)) <= tolHz) explained++;
    }
    if (explained >= 0.8 * lines.length) return true;
  }
  return false;
}

/**
 * Envelope half width that bridges the fine structure of a spread carrier's hump: the lines of a swept
 * carrier, one sweep rate apart, some of them near a Bessel zero.
 */
const SPREAD_ENVELOPE_HZ = 200;
/** A hump narrower than this is a line with its near sidebands, not a spread carrier. */
const SPREAD_MIN_HZ = 300;

/**
 * The spread of the carrier over a run: the median of the per-frame widths (a frame's own spectrum,
 * not an average over the run, in which sidebands sweeping with speed would smear into a false hump).
 * null when most frames show a steady line.
 */
export function runSpreadHz(
  power: Float32Array,
  bins: number,
  binHz: number,
  carrierHz: Float64Array,
  frames: number[],
  /** The shaft frequency per frame, Hz, where the speed is known: lines on a sideband comb are no spread */
  frHz?: Float64Array,
): number | null {
  const widths: number[] = [];
  for (const f of frames) widths.push(carrierSpreadHz(power.subarray(f * bins, (f + 1) * bins), binHz, carrierHz[f], frHz?.[f]) ?? 0);
  if (!widths.length) return null;
  widths.sort((a, b) => a - b);
  const median = widths[widths.length >> 1];
  return median > 0 ? median : null;
}
