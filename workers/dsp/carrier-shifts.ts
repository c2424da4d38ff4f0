/**
 * Step changes of the detected carrier (a carrier schedule), from the per-frame carrier track of
 * detectCarrier. Kept apart from the detector: this is the reading of its track, with its own rules.
 */
import { VOTE_WINDOW_S } from './carrier';

export interface CarrierShift {
  t: number;
  rpm: number;
  fromHz: number;
  toHz: number;
}

/**
 * Step changes of the carrier (a schedule): the median-filtered carrier leaves its level by more than
 * max(3 bins, 2 %) and stays at the new level for at least `holdS`. Noise and short dropouts (NaN
 * frames) do not make shifts.
 */
export function carrierShifts(
  carrier: Float64Array,
  frameTimeS: (f: number) => number,
  frameRpm: Float64Array,
  binHz: number,
  holdS = 0.3,
  minDwellS = VOTE_WINDOW_S,
): CarrierShift[] {
  const steps = carrierSteps(carrier, frameTimeS, frameRpm, binHz, holdS);
  return withoutPassingLevels(steps, frameTimeS, frameRpm, carrier.length, binHz, minDwellS);
}

/** Two carrier readings are one level within max(3 bins, 2 %) of it. */
const sameLevel = (hz: number, level: number, binHz: number) => Math.abs(hz - level) <= Math.max(3 * binHz, 0.02 * level);

/**
 * A level held for less than detectCarrier's vote window between two others is an artefact of the
 * switch, not a level: while the window straddles the switch the two carriers' votes are split and a
 * third line (an order sweeping through) can win for up to about the window's length. Such a pair of
 * steps A → B → C becomes A → C at their middle, and A → B → A goes.
 */
function withoutPassingLevels(
  steps: CarrierShift[],
  frameTimeS: (f: number) => number,
  frameRpm: Float64Array,
  frames: number,
  binHz: number,
  minDwellS: number,
): CarrierShift[] {
  const out: CarrierShift[] = [];
  for (const step of steps) {
    const prev = out.at(-1);
    if (prev && step.t - prev.t < minDwellS) {
      out.pop();
      if (!sameLevel(step.toHz, prev.fromHz, binHz)) {
        const t = (prev.t + step.t) / 2;
        out.push({ t, rpm: interpolateRpm(frameTimeS, frameRpm, t, frames), fromHz: prev.fromHz, toHz: step.toHz });
      }
      continue;
    }
    out.push(step);
  }
  return out;
}

function carrierSteps(
  carrier: Float64Array,
  frameTimeS: (f: number) => number,
  frameRpm: Float64Array,
  binHz: number,
  holdS: number,
): CarrierShift[] {
  const shifts: CarrierShift[] = [];
  let level = NaN;
  let lastAtLevel = -1;
  let candidateStart = -1;
  for (let f = 0; f < carrier.length; f++) {
    const v = carrier[f];
    if (!Number.isFinite(v)) continue;
    if (!Number.isFinite(level)) {
      level = v;
      lastAtLevel = f;
      continue;
    }
    if (sameLevel(v, level, binHz)) {
      level = level + (v - level) * 0.1; // follows a slow drift
      lastAtLevel = f;
      candidateStart = -1;
      continue;
    }
    if (candidateStart < 0) candidateStart = f;
    if (frameTimeS(f) - frameTimeS(candidateStart) >= holdS) {
      const t = (frameTimeS(lastAtLevel) + frameTimeS(candidateStart)) / 2;
      const fNew = carrier[candidateStart];
      shifts.push({ t, rpm: interpolateRpm(frameTimeS, frameRpm, t, carrier.length), fromHz: level, toHz: fNew });
      level = fNew;
      lastAtLevel = f;
      candidateStart = -1;
    }
  }
  return shifts;
}

function interpolateRpm(frameTimeS: (f: number) => number, rpm: Float64Array, t: number, frames: number): number {
  for (let f = 1; f < frames; f++) {
    const t1 = frameTimeS(f);
    if (t1 >= t) {
      const t0 = frameTimeS(f - 1);
      const a = (t - t0) / (t1 - t0);
      return rpm[f - 1] * (1 - a) + rpm[f] * a;
    }
  }
  return rpm[frames - 1];
}
