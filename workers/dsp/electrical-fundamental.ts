/**
 * Pole pairs from the electrical fundamental of a voltage or phase-current channel.
 *
 * Why: at one steady speed the sideband offsets n·fe of the inverter families are whole multiples of the
 * shaft frequency fr for every divisor of the true pole-pair count p, so the sidebands alone fit p = 1 (or
 * any divisor of p) as well as p itself. The modulating wave is itself in the spectrum of an inverter's
 * output voltage and of the current it drives: the baseband term (m = 0, n = 1) of the double Fourier
 * series of a naturally sampled PWM wave, of amplitude M·Vdc/2 per leg and √3 times that line to line
 * (Holmes & Lipo 2003, ch. 3; H. S. Black, Modulation Theory, 1953; the section holding the three-phase
 * case and its √3 recalled from memory). It is the strongest line of the low band on such a channel
 * (common practice: it carries the power). With fr = rpm/60, p = fe/fr.
 *
 * Per frame: the strongest bin in the band from 0.5·fr (three bins at least, clear of the window's DC
 * lobe) up to fr·(maxPolePairs + 0.5), and below half the carrier; its peak is interpolated by a parabola
 * through the log spectrum (J. O. Smith, Spectral Audio Signal Processing, 2011, "Quadratic Interpolation
 * of Spectral Peaks"; edition recalled from memory); it counts when it stands 20 dB above the band's
 * median (a value chosen here, well above the scatter of a noise floor). The frame votes for round(fe/fr) when fe/fr lies within 0.2 of
 * that integer (a synchronous machine gives an integer; an induction machine's slip s raises fe/fr by
 * about s·p, so a large slip makes this fail and the sidebands decide alone, as before). The answer is
 * the integer that at least 60 % of the frames with a line vote for (both fractions chosen here).
 *
 * The strongest line at 2fe or 3fe (a channel that carries an order of the force, or a distorted wave)
 * would read as 2p or 3p: the caller checks the answer against the sidebands (pole-pairs.ts,
 * withFundamental).
 */
import type { StftLayout } from './stft';

export interface FundamentalEstimate {
  /** Pole pairs fe/fr, rounded */
  polePairs: number;
  /** Median electrical fundamental over the voting frames, Hz */
  fundamentalHz: number;
  /** Fraction of the frames with a line that voted for polePairs */
  agreement: number;
}

const MIN_PROMINENCE_DB = 20;
const RATIO_TOLERANCE = 0.2;
const MIN_AGREEMENT = 0.6;

export function polePairsFromFundamental(
  power: Float32Array,
  layout: StftLayout,
  carrierHz: Float64Array,
  frameRpm: Float64Array,
  maxPolePairs = 12,
): FundamentalEstimate | null {
  const { bins, binHz } = layout;
  const votes = new Map<number, number[]>();
  let framesWithLine = 0;
  for (let f = 0; f < layout.frames; f++) {
    const fr = frameRpm[f] / 60;
    if (!(fr > 0)) continue;
    const fc = carrierHz[f];
    const top = Math.min(fr * (maxPolePairs + 0.5), Number.isFinite(fc) ? fc / 2 : Infinity);
    const lo = Math.max(3, Math.floor((0.5 * fr) / binHz));
    const hi = Math.min(bins - 2, Math.ceil(top / binHz));
    if (hi - lo < 4) continue;
    const row = f * bins;
    const db = (k: number) => 10 * Math.log10(power[row + k] + 1e-30);
    let kMax = lo;
    for (let k = lo; k <= hi; k++) if (power[row + k] > power[row + kMax]) kMax = k;
    // a line, not the edge of a slope that continues outside the band
    if (kMax === lo || kMax === hi) continue;
    const levels: number[] = [];
    for (let k = lo; k <= hi; k++) levels.push(db(k));
    levels.sort((a, b) => a - b);
    const floor = levels[levels.length >> 1];
    const [a, b, c] = [db(kMax - 1), db(kMax), db(kMax + 1)];
    if (b - floor < MIN_PROMINENCE_DB) continue;
    framesWithLine++;
    const denom = a - 2 * b + c;
    const delta = denom < 0 ? (0.5 * (a - c)) / denom : 0;
    const fe = (kMax + delta) * binHz;
    const ratio = fe / fr;
    const p = Math.round(ratio);
    if (p < 1 || p > maxPolePairs || Math.abs(ratio - p) > RATIO_TOLERANCE) continue;
    const list = votes.get(p) ?? [];
    list.push(fe);
    votes.set(p, list);
  }
  if (framesWithLine === 0) return null;
  let best: [number, number[]] | null = null;
  for (const entry of votes) if (!best || entry[1].length > best[1].length) best = entry;
  if (!best || best[1].length < MIN_AGREEMENT * framesWithLine) return null;
  const sorted = [...best[1]].sort((x, y) => x - y);
  return { polePairs: best[0], fundamentalHz: sorted[sorted.length >> 1], agreement: best[1].length / framesWithLine };
}
