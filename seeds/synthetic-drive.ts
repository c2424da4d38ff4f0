/**
 * Synthesises what an accelerometer or microphone on an invented electric drive would record during a
 * run: machine orders (f = k·fr) and inverter carrier families (f = m·fc + n·fe, fe = p·fr), each a
 * sinusoid whose phase integrates its changing frequency, plus broadband noise. Carrier schedules
 * (steps) and a spread carrier (random modulation of the carrier within a width) are supported.
 * For the demo recordings and for tests with known answers; every level here is invented.
 */

export interface OrderComponent {
  order: number;
  /** Peak amplitude in channel units, or a function of rpm */
  amplitude: number | ((rpm: number) => number);
}

export interface FamilyComponent {
  m: number;
  n: number;
  amplitude: number | ((rpm: number) => number);
}

export interface DriveSignalOptions {
  fsHz: number;
  durationS: number;
  rpm: (tS: number) => number;
  polePairs: number;
  /** Carrier frequency against time (a schedule); steps are allowed. */
  carrierHz: (tS: number) => number;
  /**
   * Spread-spectrum carrier: the carrier swept over ± width/2 by a triangle at `rateHz` (default 150 Hz),
   * or, with `random`, set to a new random value in that range every 1/rateHz.
   */
  spread?: { widthHz: number; rateHz?: number; random?: boolean };
  orders?: OrderComponent[];
  families?: FamilyComponent[];
  noiseRms?: number;
  seed?: number;
}

/** A small seeded generator (LCG + Box–Muller) so the same options make the same samples. */
export function seededRandom(seed = 1) {
  let s = seed >>> 0 || 1;
  const uniform = () => ((s = (Math.imul(s, 1664525) + 1013904223) >>> 0) + 0.5) / 2 ** 32;
  let spare: number | null = null;
  const gauss = () => {
    if (spare !== null) {
      const v = spare;
      spare = null;
      return v;
    }
    const r = Math.sqrt(-2 * Math.log(uniform()));
    const a = 2 * Math.PI * uniform();
    spare = r * Math.sin(a);
    return r * Math.cos(a);
  };
  return { uniform, gauss };
}

const amplitudeAt = (a: number | ((rpm: number) => number), rpm: number) => (typeof a === 'number' ? a : a(rpm));

export function synthesiseDrive(o: DriveSignalOptions): Float32Array {
  const n = Math.round(o.fsHz * o.durationS);
  const x = new Float32Array(n);
  const dt = 1 / o.fsHz;
  const rnd = seededRandom(o.seed ?? 1);
  const orders = o.orders ?? [];
  const families = o.families ?? [];
  let shaftPhase = 0; // rad, ∫2π·fr dt
  let carrierPhase = 0; // rad, ∫2π·fc dt
  let spreadOffset = 0;
  let nextHop = 0;
  const noise = o.noiseRms ?? 0;
  for (let i = 0; i < n; i++) {
    const t = i * dt;
    const rpm = o.rpm(t);
    const fr = rpm / 60;
    let fc = o.carrierHz(t);
    if (o.spread) {
      const rate = o.spread.rateHz ?? 150;
      if (o.spread.random) {
        if (t >= nextHop) {
          spreadOffset = (rnd.uniform() - 0.5) * o.spread.widthHz;
          nextHop = t + 1 / rate;
        }
      } else {
        const u = (t * rate) % 1;
        spreadOffset = (u < 0.5 ? 4 * u - 1 : 3 - 4 * u) * (o.spread.widthHz / 2);
      }
      fc += spreadOffset;
    }
    const electricalPhase = o.polePairs * shaftPhase;
    let v = 0;
    for (const c of orders) v += amplitudeAt(c.amplitude, rpm) * Math.sin(c.order * shaftPhase);
    for (const c of families) v += amplitudeAt(c.amplitude, rpm) * Math.sin(c.m * carrierPhase + c.n * electricalPhase + 0.3 * c.m);
    if (noise) v += noise * rnd.gauss();
    x[i] = v;
    shaftPhase += 2 * Math.PI * fr * dt;
    carrierPhase += 2 * Math.PI * fc * dt;
  }
  return x;
}

/** A tacho channel: a square-ish pulse train of `ppr` pulses per revolution, amplitude ±1. */
export function synthesiseTacho(fsHz: number, durationS: number, rpm: (tS: number) => number, ppr: number): Float32Array {
  const n = Math.round(fsHz * durationS);
  const x = new Float32Array(n);
  let phase = 0;
  for (let i = 0; i < n; i++) {
    x[i] = Math.tanh(6 * Math.sin(ppr * phase));
    phase += (2 * Math.PI * rpm(i / fsHz)) / 60 / fsHz;
  }
  return x;
}
