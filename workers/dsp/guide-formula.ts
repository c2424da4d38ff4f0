/**
 * The one place a guide's frequency and its name are worked out; the Bench's map and tracks, the
 * findings, the view page's snapshot figure and the batch CLI all call these.
 *
 * An order guide passes through 0 Hz: f = k·fr, fr = rpm/60. A carrier family (m, n) is centred on
 * the m-th carrier harmonic: f = m·fc + n·fe with fe = p·fr (n in electrical orders, p pole pairs), or
 * f = m·fc + k·fr (k in shaft orders). Sine-triangle PWM puts its lines at these frequencies (Holmes &
 * Lipo, Pulse Width Modulation for Power Converters, Wiley 2003, eq. 3.33); the force families follow
 * from the same lines two by two (common practice).
 */

export type FamilyPer = 'electrical' | 'shaft';

export type Guide =
  | { kind: 'order'; order: number }
  | { kind: 'family'; m: number; n: number; per: FamilyPer };

/** What a guide's frequency depends on at one moment. */
export interface GuideMoment {
  /** Shaft speed, rpm */
  rpm: number;
  /** Carrier, Hz (NaN when unknown) */
  carrierHz: number;
  /** Pole pairs (NaN when unknown) */
  polePairs: number;
}

/** The frequency of a guide at one moment, Hz; NaN when what it needs is unknown. */
export function guideFrequencyHz(g: Guide, at: GuideMoment): number {
  const fr = at.rpm / 60;
  if (g.kind === 'order') return g.order * fr;
  // m·fc alone needs neither the speed nor the pole pairs (0 × NaN would be NaN)
  if (g.n === 0) return g.m * at.carrierHz;
  const step = g.per === 'electrical' ? at.polePairs * fr : fr;
  return g.m * at.carrierHz + g.n * step;
}

const minus = '\u2212';
const num = (v: number) => (Number.isInteger(v) ? String(v) : String(Number(v.toPrecision(4))));
const signed = (n: number) => (n > 0 ? `+${n}` : n < 0 ? `${minus}${-n}` : '0');

/** "8·fr" */
export const orderLabel = (k: number) => `${num(k)}·fr`;

/** "fc", "2fc+fe", "fc−2fr" */
export function familyLabel(m: number, n: number, per: FamilyPer = 'electrical'): string {
  const c = m === 1 ? 'fc' : `${m}fc`;
  if (n === 0) return c;
  const a = Math.abs(n);
  return `${c}${n > 0 ? '+' : minus}${a === 1 ? '' : a}${per === 'electrical' ? 'fe' : 'fr'}`;
}

/** "k 8", "m 1, n +1" */
export const familyDetail = (m: number, n: number, per: FamilyPer = 'electrical') => `m ${m}, ${per === 'electrical' ? 'n' : 'k'} ${signed(n)}`;
export const orderDetail = (k: number) => `k ${num(k)}`;

/** A guide's name, whichever kind it is. */
export const guideLabel = (g: { kind: 'order'; order: number } | { kind: 'family'; m: number; n: number; per?: FamilyPer }) =>
  g.kind === 'order' ? orderLabel(g.order) : familyLabel(g.m, g.n, g.per ?? 'electrical');
