/** Known components for filter tests: a tone of any frequency and amplitude law, and the SNR of an estimate. */

/** a(t)·cos(Θ(t) + φ) with Θ the trapezoidal running phase of f(t), n samples at fsHz. */
export function tone(n: number, fsHz: number, f: (t: number) => number, a: (t: number) => number, phase: number): Float32Array {
  const out = new Float32Array(n);
  let th = phase;
  for (let i = 0; i < n; i++) {
    const t = i / fsHz;
    if (i > 0) th += (Math.PI * (f(t - 1 / fsHz) + f(t))) / fsHz;
    out[i] = a(t) * Math.cos(th);
  }
  return out;
}

/** SNR of an estimate against the truth over samples [from, to), dB. */
export function snrDb(est: Float32Array, truth: Float32Array, from = 0, to = truth.length): number {
  let s = 0;
  let e = 0;
  for (let i = from; i < to; i++) {
    s += truth[i] ** 2;
    e += (est[i] - truth[i]) ** 2;
  }
  return 10 * Math.log10(s / e);
}
