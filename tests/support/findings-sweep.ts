/**
 * A sweep of drive signals whose answers are known by construction, for the inverter findings: the carrier,
 * its shifts, a spread carrier and the pole pairs. Families of signals (every level invented, the structure
 * published):
 * - inverter voltage: the line-to-line voltage of a three-phase two-level inverter, naturally sampled
 *   sine-triangle PWM or its space-vector equivalent (Holmes & Lipo 2003, ch. 3 and 6), at a steady speed;
 * - inverter current: that voltage through an R-L load (first-order low-pass, corner 50 Hz), the same lines
 *   weighted by 1/|Z| (m + n odd);
 * - force: the radial force pattern m + n even on a vibration run-up (seeds/synthetic-drive.ts), steady,
 *   with a carrier step, or spread (a triangle sweep).
 * Carriers 2–20 kHz, sample rates 25.6–204.8 kHz, speeds from 300 rpm, pole pairs 2–8. The cases are
 * drawn from these ranges by a fixed generator, so every run sweeps the same ones.
 * `node --import tsx tests/support/findings-sweep.ts` prints the hit rates (the README quotes them);
 * `… findings-sweep.ts electrical` those of the steady voltage and current cases (electricalCases).
 */
import { synthesiseDrive } from '../../seeds/synthetic-drive';
import { simulateTwoLevelPwm } from '../../workers/dsp/pwm-simulation';
import { analyseSignal } from './analyse-signal';

export type SweepKind = 'voltage sine-triangle' | 'voltage space-vector' | 'current sine-triangle' | 'force steady' | 'force step' | 'force spread';

export interface SweepCase {
  kind: SweepKind;
  fsHz: number;
  carrierHz: number;
  /** the carrier after the step, for 'force step' */
  stepToHz?: number;
  rpmFrom: number;
  rpmTo: number;
  polePairs: number;
  spreadWidthHz?: number;
  /** for the voltage and current kinds; default 0.85 */
  modulationIndex?: number;
}

export interface SweepOutcome {
  case: SweepCase;
  carrier: boolean;
  shifts: boolean;
  spread: boolean;
  /** null where the sidebands are closer than the spectrum resolves (no answer is expected) */
  polePairs: boolean | null;
  detail: string;
}

const CARRIERS = [2000, 2500, 4000, 5000, 8000, 10000, 12000, 16000, 20000];
const RATES = [25600, 51200, 102400, 204800];
const POLE_PAIRS = [2, 3, 4, 5, 6, 8];
const BLOCK = 8192;

/** A fixed linear congruential generator (Numerical Recipes constants): the same cases every run. */
function lcg(seed: number) {
  let s = seed >>> 0;
  return () => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return s / 2 ** 32;
  };
}

export function sweepCases(count = 30, seed = 2026): SweepCase[] {
  const rnd = lcg(seed);
  const pick = <T>(xs: readonly T[]) => xs[Math.floor(rnd() * xs.length)];
  const kinds: SweepKind[] = ['voltage sine-triangle', 'voltage space-vector', 'current sine-triangle', 'force steady', 'force step', 'force spread'];
  const out: SweepCase[] = [];
  for (let i = 0; out.length < count && i < count * 50; i++) {
    const kind = kinds[out.length % kinds.length];
    const fsHz = pick(RATES);
    const carrierHz = pick(CARRIERS);
    const polePairs = pick(POLE_PAIRS);
    if (carrierHz > 0.4 * fsHz) continue; // the carrier inside the acquisition's band
    const steady = kind.startsWith('voltage') || kind.startsWith('current');
    const rpmFrom = 300 + Math.round(rnd() * 20) * 100;
    // the pulse ratio fc/fe stays at 12 or more (common practice for a drive in its linear range)
    const maxRpm = (carrierHz / 12 / polePairs) * 60;
    if (rpmFrom > maxRpm) continue;
    const rpmTo = steady ? rpmFrom : Math.min(maxRpm, rpmFrom * (2 + rnd() * 4));
    const c: SweepCase = { kind, fsHz, carrierHz, rpmFrom, rpmTo, polePairs };
    if (kind === 'force step') {
      const to = CARRIERS.filter((f) => f !== carrierHz && f <= 0.4 * fsHz && Math.abs(f - carrierHz) > 0.15 * carrierHz && (f / 12 / polePairs) * 60 >= rpmTo);
      if (!to.length) continue;
      c.stepToHz = pick(to);
    }
    if (kind === 'force spread') c.spreadWidthHz = Math.round(carrierHz * (0.08 + rnd() * 0.07));
    out.push(c);
  }
  return out;
}

/**
 * Voltage and current at one steady speed only, the family where the sideband offsets alone fit every
 * divisor of the pole pairs: pole pairs 1–8, speeds 300–6000 rpm, modulation index 0.6–1.0, the same
 * carriers and rates, the pulse ratio fc/fe at 12 or more. The first case is the three-phase two-level
 * naturally sampled sine-triangle line-to-line voltage with a 4 kHz carrier, fe 60 Hz, M = 0.9, sampled at
 * 102.4 kHz, 1800 rpm, 2 pole pairs.
 */
export function electricalCases(count = 24, seed = 1205): SweepCase[] {
  const rnd = lcg(seed);
  const pick = <T>(xs: readonly T[]) => xs[Math.floor(rnd() * xs.length)];
  const kinds: SweepKind[] = ['voltage sine-triangle', 'voltage space-vector', 'current sine-triangle'];
  const out: SweepCase[] = [{ kind: 'voltage sine-triangle', fsHz: 102400, carrierHz: 4000, rpmFrom: 1800, rpmTo: 1800, polePairs: 2, modulationIndex: 0.9 }];
  for (let i = 0; out.length < count && i < count * 50; i++) {
    const kind = kinds[out.length % kinds.length];
    const fsHz = pick(RATES);
    const carrierHz = pick(CARRIERS);
    const polePairs = 1 + Math.floor(rnd() * 8);
    const rpm = 300 + Math.round(rnd() * 57) * 100;
    const modulationIndex = Math.round((0.6 + rnd() * 0.4) * 100) / 100;
    if (carrierHz > 0.4 * fsHz || rpm > (carrierHz / 12 / polePairs) * 60) continue;
    out.push({ kind, fsHz, carrierHz, rpmFrom: rpm, rpmTo: rpm, polePairs, modulationIndex });
  }
  return out;
}

/** First-order low-pass y' = (x − y)·2πfc (an R-L load's current for a voltage), by the bilinear transform. */
function rlCurrent(v: Float32Array, fsHz: number, cornerHz: number): Float32Array {
  const k = Math.tan((Math.PI * cornerHz) / fsHz);
  const a = (1 - k) / (1 + k);
  const b = k / (1 + k);
  const out = new Float32Array(v.length);
  let y = 0;
  let xPrev = 0;
  for (let i = 0; i < v.length; i++) {
    y = b * (v[i] + xPrev) + a * y;
    xPrev = v[i];
    out[i] = y;
  }
  return out;
}

function signalOf(c: SweepCase): { x: Float32Array; durationS: number; rpm: (t: number) => number } {
  if (c.kind.startsWith('voltage') || c.kind.startsWith('current')) {
    const durationS = 2;
    const fe = (c.polePairs * c.rpmFrom) / 60;
    const { vab } = simulateTwoLevelPwm({
      fsHz: c.fsHz,
      durationS,
      carrierHz: c.carrierHz,
      fundamentalHz: fe,
      modulationIndex: c.modulationIndex ?? 0.85,
      vdc: 400,
      oversample: 4,
      modulation: c.kind.endsWith('space-vector') ? 'space-vector' : 'sine-triangle',
    });
    return { x: c.kind.startsWith('current') ? rlCurrent(vab, c.fsHz, 50) : vab, durationS, rpm: () => c.rpmFrom };
  }
  const durationS = 8;
  const rpm = (t: number) => c.rpmFrom + ((c.rpmTo - c.rpmFrom) * t) / durationS;
  const x = synthesiseDrive({
    fsHz: c.fsHz,
    durationS,
    rpm,
    polePairs: c.polePairs,
    carrierHz: c.stepToHz ? (t) => (t < durationS / 2 ? c.carrierHz : c.stepToHz!) : () => c.carrierHz,
    spread: c.spreadWidthHz ? { widthHz: c.spreadWidthHz } : undefined,
    orders: [{ order: 2 * c.polePairs, amplitude: 0.03 }],
    families: [
      { m: 1, n: 1, amplitude: 0.02 },
      { m: 1, n: -1, amplitude: 0.02 },
      { m: 1, n: 3, amplitude: 0.008 },
      { m: 1, n: -3, amplitude: 0.008 },
      { m: 2, n: 0, amplitude: 0.008 },
      { m: 2, n: 2, amplitude: 0.005 },
      { m: 2, n: -2, amplitude: 0.005 },
    ],
    noiseRms: 0.001,
    seed: Math.round(c.carrierHz + c.rpmFrom),
  });
  return { x, durationS, rpm };
}

const median = (xs: number[]) => {
  const s = xs.filter(Number.isFinite).sort((a, b) => a - b);
  return s.length ? s[s.length >> 1] : NaN;
};

export async function runSweepCase(c: SweepCase): Promise<SweepOutcome> {
  const { x, rpm } = signalOf(c);
  const expectedPattern = c.kind.startsWith('force') ? 'm+n even' : 'm+n odd';
  const { layout, report } = await analyseSignal(x, c.fsHz, rpm, { expectedPattern }, BLOCK);

  const tol = (hz: number) => Math.max(1.5 * layout.binHz, 0.01 * hz);
  const hz = report.carrier.hz;
  const third = Math.floor(hz.length / 3);
  const early = median(hz.slice(0, third));
  const late = median(hz.slice(hz.length - third));
  const lateWant = c.stepToHz ?? c.carrierHz;
  const carrier = Math.abs(early - c.carrierHz) <= tol(c.carrierHz) && Math.abs(late - lateWant) <= tol(lateWant);
  const shifts = c.stepToHz
    ? report.carrierShifts.length === 1 && Math.abs(report.carrierShifts[0].toHz - c.stepToHz) <= tol(c.stepToHz)
    : report.carrierShifts.length === 0;
  const spread = c.spreadWidthHz
    ? report.carrierSpreadHz !== null && Math.abs(report.carrierSpreadHz - c.spreadWidthHz) / c.spreadWidthHz < 0.35
    : report.carrierSpreadHz === null;
  // pole pairs can be told only where sidebands stand apart (2fe over three bins) and are not smeared
  const fe = (c.polePairs * Math.min(c.rpmFrom, c.rpmTo)) / 60;
  const resolvable = !c.spreadWidthHz && 2 * fe > 3 * layout.binHz;
  const polePairs = resolvable ? report.polePairs.value === c.polePairs && !report.polePairs.ambiguous : null;
  const detail = `carrier ${early.toFixed(0)}/${late.toFixed(0)} Hz, shifts ${report.carrierShifts.length}, spread ${report.carrierSpreadHz}, p ${report.polePairs.value}${report.polePairs.ambiguous ? '?' : ''}`;
  return { case: c, carrier, shifts, spread, polePairs, detail };
}

export interface HitRates {
  cases: number;
  carrier: number;
  shifts: number;
  spread: number;
  polePairs: number;
  polePairsCases: number;
}

export function hitRates(outcomes: SweepOutcome[]): HitRates {
  const rate = (xs: boolean[]) => (xs.length ? xs.filter(Boolean).length / xs.length : 1);
  const pp = outcomes.map((o) => o.polePairs).filter((v): v is boolean => v !== null);
  return {
    cases: outcomes.length,
    carrier: rate(outcomes.map((o) => o.carrier)),
    shifts: rate(outcomes.map((o) => o.shifts)),
    spread: rate(outcomes.map((o) => o.spread)),
    polePairs: rate(pp),
    polePairsCases: pp.length,
  };
}

export function describeCase(c: SweepCase): string {
  return `${c.kind}${c.modulationIndex ? ` M ${c.modulationIndex}` : ''}, fc ${c.carrierHz}${c.stepToHz ? `→${c.stepToHz}` : ''} Hz, fs ${c.fsHz} Hz, ${c.rpmFrom.toFixed(0)}${c.rpmTo !== c.rpmFrom ? `→${c.rpmTo.toFixed(0)}` : ''} rpm, p ${c.polePairs}${c.spreadWidthHz ? `, spread ${c.spreadWidthHz} Hz` : ''}`;
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const outcomes: SweepOutcome[] = [];
  const cases = process.argv[2] === 'electrical' ? electricalCases(Number(process.argv[3] ?? 24)) : sweepCases(Number(process.argv[2] ?? 30));
  for (const c of cases) {
    const o = await runSweepCase(c);
    outcomes.push(o);
    const marks = [o.carrier, o.shifts, o.spread, o.polePairs].map((v) => (v === null ? '-' : v ? 'ok' : 'MISS')).join(' ');
    console.log(`${marks.padEnd(16)} ${describeCase(c)}: ${o.detail}`);
  }
  const r = hitRates(outcomes);
  console.log(
    `hit rates over ${r.cases} cases: carrier ${(r.carrier * 100).toFixed(0)} %, shifts ${(r.shifts * 100).toFixed(0)} %, spread ${(r.spread * 100).toFixed(0)} %, pole pairs ${(r.polePairs * 100).toFixed(0)} % (of ${r.polePairsCases} resolvable)`,
  );
}
