import type { ToneFinding } from '../../workers/dsp/carrier-tonality';
import { familyLabel } from '../../workers/dsp/guide-formula';

/** dB with one decimal, never "−0.0"; ∞ for a tone with no noise around it. */
export const db1 = (v: number) => (Number.isFinite(v) ? (Math.abs(v) < 0.05 ? '0.0' : v.toFixed(1)) : v > 0 ? '∞' : '−∞');

/**
 * One carrier tone's tonality in words, the same on the Bench and in a saved view's findings (the
 * numbers are analyseInverter's, as the batch CLI prints them).
 */
export function toneText(t: ToneFinding, atS: number): string {
  const judged =
    t.tnrDb !== null && t.prDb !== null
      ? `TNR ${db1(t.tnrDb)} dB (limit ${db1(t.tnrLimitDb ?? NaN)}), PR ${db1(t.prDb)} dB (limit ${db1(t.prLimitDb ?? NaN)}), ${t.prominent ? 'prominent' : 'not prominent'}`
      : 'no TNR or PR above 11.2 kHz (ECMA-418-1)';
  const heard = t.aboveThresholdDb === null ? '' : `; ${db1(t.levelDb!)} dB SPL, ${db1(Math.abs(t.aboveThresholdDb))} dB ${t.aboveThresholdDb >= 0 ? 'above' : 'below'} the threshold of hearing`;
  const audible = t.audibilityDb === null || t.audibilityDb === undefined ? '' : `, audibility ${db1(t.audibilityDb)} dB over the masking noise (ISO/TS 20065)`;
  return `${familyLabel(t.m, t.n)} at ${Math.round(t.hz)} Hz, ${atS.toFixed(2)} s: ${judged}${heard}${audible}`;
}
