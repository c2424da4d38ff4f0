/**
 * From a band's pressure to its specific loudness in the hearing model of ECMA-418-2 [1]:
 * rectification and RMS per block (clauses 5.1.6–5.1.7 of the 2nd edition), the compressive
 * nonlinearity (5.1.8), and the threshold in quiet (5.1.9).
 *
 * Constants recalled from memory of [1] and marked so: the reference p₀ = 20 µPa, the exponent
 * α = 1.5, the eight thresholds L_t = 15, 25, … 85 dB with the slopes v₀ … v₈ between them, and the
 * loudness constant c_N. The threshold in quiet is Fanlight's substitute for the standard's table,
 * which is not recalled: the free-field threshold of ISO 389-7 [2] at the band centre, carried
 * through the ear filter.
 *
 * References:
 *   [1] ECMA-418-2, 2nd edition, December 2022, clause 5.1 (formulae of the rectification, the RMS,
 *       the nonlinearity and the threshold in quiet).
 *   [2] ISO 389-7:2005, Table 1 (hearing-threshold.ts).
 */
import { hearingThresholdDb } from '../hearing-threshold';
import { earFilterGain } from './ear-filter';

/** p₀ (Pa), the reference sound pressure. */
export const P0_PA = 20e-6;
/** α, the smoothness of the transitions between slopes (from memory). */
const ALPHA = 1.5;
/** Threshold pressures p_t,ν = p₀·10^(L_t,ν/20), L_t = 15 … 85 dB in 10 dB steps (from memory). */
const THRESHOLDS_PA = [15, 25, 35, 45, 55, 65, 75, 85].map((l) => P0_PA * 10 ** (l / 20));
/** Slopes v₀ … v₈ of specific loudness against pressure, below, between and above the thresholds (from memory). */
const SLOPES = [1, 0.6602, 0.0864, 0.6384, 0.0328, 0.4068, 0.2082, 0.3994, 0.6434];
/** c_N (sone_HMS per Bark_HMS), the loudness calibration (from memory). */
const C_N = 0.0211668;

/**
 * RMS of the half-wave rectified band signal over a block, p̂ = √((2/N)·Σ max(u, 0)²), ECMA-418-2
 * clauses 5.1.6–5.1.7 [1]: the factor 2 restores the RMS of a symmetric signal.
 */
export function rectifiedRms(u: Float64Array, start: number, length: number): number {
  let sum = 0;
  const end = Math.min(u.length, start + length);
  for (let n = Math.max(0, start); n < end; n++) {
    const v = u[n];
    if (v > 0) sum += v * v;
  }
  return Math.sqrt((2 * sum) / length);
}

/**
 * Specific loudness before the threshold in quiet, ECMA-418-2 clause 5.1.8 [1]:
 * N'(p̂) = c_N·(p̂/p₀)·Π_ν [1 + (p̂/p_t,ν)^α]^((v_ν − v_ν−1)/α), a chain of power laws whose slope
 * moves from v_ν−1 to v_ν around each threshold.
 */
export function specificLoudnessBasis(rmsPa: number): number {
  if (!(rmsPa > 0)) return 0;
  let n = C_N * (rmsPa / P0_PA);
  for (let v = 0; v < THRESHOLDS_PA.length; v++) {
    n *= (1 + (rmsPa / THRESHOLDS_PA[v]) ** ALPHA) ** ((SLOPES[v + 1] - SLOPES[v]) / ALPHA);
  }
  return n;
}

/**
 * The band's specific loudness at the threshold in quiet, clause 5.1.9 [1]: a tone at the
 * ISO 389-7 threshold [2] at fc, as the band sees it after the ear filter (18 kHz's value above
 * 18 kHz, 20 Hz's below 20 Hz).
 */
export function thresholdSpecificLoudness(fcHz: number): number {
  const f = Math.min(18000, Math.max(20, fcHz));
  const pressure = P0_PA * 10 ** (hearingThresholdDb(f) / 20) * earFilterGain(fcHz);
  return specificLoudnessBasis(pressure);
}

/** Specific loudness of a block, N' = max(0, N'(p̂) − N'_threshold), clause 5.1.9 [1] (sone_HMS per Bark_HMS). */
export function specificLoudness(rmsPa: number, thresholdLoudness: number): number {
  return Math.max(0, specificLoudnessBasis(rmsPa) - thresholdLoudness);
}
