/**
 * One-third-octave filter bank for loudness: each band a 6th-order Butterworth band-pass (3rd-order
 * low-pass prototype, low-pass → band-pass transform, bilinear transform with pre-warped band edges),
 * run as three second-order sections. Such a filter meets the class 1 attenuation limits of
 * IEC 61260-1:2014 clause 5.10 for one-third-octave bands.
 *
 * ISO 532-1:2017 clause 6 / Annex A.2 specifies its own filter coefficients at 48 kHz. Here each band
 * is instead designed at the recording's own sample rate, so no resampling to 48 kHz is needed; the
 * band edges are the exact base-10 edges of IEC 61260-1 (workers/dsp/third-octave.ts).
 *
 * References:
 *   [1] IEC 61260-1:2014, Electroacoustics — Octave-band and fractional-octave-band filters — Part 1.
 *   [2] A. V. Oppenheim, R. W. Schafer, Discrete-Time Signal Processing, 3rd ed., §7.1 (bilinear
 *       transform, pre-warping) — and the Butterworth poles, s_k = exp(jπ(2k + n + 1)/(2n)).
 */
import { type Biquad } from '../biquad';
import { thirdOctaveBand } from '../third-octave';

/** Band numbers x (IEC 61260-1, 0 = 1 kHz) of the 28 loudness bands 25 Hz … 12.5 kHz. */
export const LOUDNESS_BAND_NUMBERS: readonly number[] = Object.freeze(Array.from({ length: 28 }, (_, i) => i - 16));

interface Complex {
  re: number;
  im: number;
}
const mul = (a: Complex, b: Complex): Complex => ({ re: a.re * b.re - a.im * b.im, im: a.re * b.im + a.im * b.re });
const div = (a: Complex, b: Complex): Complex => {
  const d = b.re * b.re + b.im * b.im;
  return { re: (a.re * b.re + a.im * b.im) / d, im: (a.im * b.re - a.re * b.im) / d };
};
function csqrt(a: Complex): Complex {
  const r = Math.hypot(a.re, a.im);
  const re = Math.sqrt((r + a.re) / 2);
  const im = Math.sign(a.im || 1) * Math.sqrt(Math.max(0, (r - a.re) / 2));
  return { re, im };
}

/**
 * Three second-order sections of the Butterworth band-pass from loHz to hiHz at fsHz, gain 1 at the
 * geometric centre. Each section has zeros at z = ±1 (numerator 1 − z⁻²).
 */
export function butterworthBandPass(loHz: number, hiHz: number, fsHz: number): Biquad[] {
  if (!(loHz > 0 && hiHz > loHz && hiHz < fsHz / 2)) {
    throw new RangeError(`Band ${loHz}–${hiHz} Hz must lie between 0 Hz and half the sample rate (${fsHz / 2} Hz).`);
  }
  const k = 2 * fsHz;
  const w1 = k * Math.tan((Math.PI * loHz) / fsHz);
  const w2 = k * Math.tan((Math.PI * hiHz) / fsHz);
  const w0sq = w1 * w2;
  const bw = w2 - w1;
  const order = 3;
  const sections: Biquad[] = [];
  // Upper-half-plane prototype poles: the complex one (k = 0) and the real one −1 (k = 1)
  const protoPoles: Complex[] = [0, 1].map((i) => {
    const a = (Math.PI * (2 * i + order + 1)) / (2 * order);
    return { re: Math.cos(a), im: Math.abs(Math.sin(a)) < 1e-12 ? 0 : Math.sin(a) };
  });
  const analogPoles: Complex[] = [];
  for (const p of protoPoles) {
    // s² − p·B·s + ω0² = 0 → s = (p·B ± sqrt(p²B² − 4ω0²))/2
    const pb = { re: p.re * bw, im: p.im * bw };
    const disc = csqrt({ re: pb.re * pb.re - pb.im * pb.im - 4 * w0sq, im: 2 * pb.re * pb.im });
    const roots = [
      { re: (pb.re + disc.re) / 2, im: (pb.im + disc.im) / 2 },
      { re: (pb.re - disc.re) / 2, im: (pb.im - disc.im) / 2 },
    ];
    if (p.im === 0) analogPoles.push(roots[0].im >= 0 ? roots[0] : roots[1]);
    else analogPoles.push(...roots);
  }
  for (const s of analogPoles) {
    const z = div({ re: 1 + s.re / k, im: s.im / k }, { re: 1 - s.re / k, im: -s.im / k });
    sections.push({ b0: 1, b1: 0, b2: -1, a1: -2 * z.re, a2: z.re * z.re + z.im * z.im });
  }
  // Normalise to gain 1 at the centre frequency (digital image of ω0)
  const wc = 2 * Math.atan(Math.sqrt(w0sq) / k);
  const e1: Complex = { re: Math.cos(-wc), im: Math.sin(-wc) };
  const e2 = mul(e1, e1);
  let h: Complex = { re: 1, im: 0 };
  for (const q of sections) {
    const num = { re: q.b0 + q.b1 * e1.re + q.b2 * e2.re, im: q.b1 * e1.im + q.b2 * e2.im };
    const den = { re: 1 + q.a1 * e1.re + q.a2 * e2.re, im: q.a1 * e1.im + q.a2 * e2.im };
    h = mul(h, div(num, den));
  }
  const g = Math.cbrt(1 / Math.hypot(h.re, h.im));
  for (const q of sections) {
    q.b0 *= g;
    q.b2 *= g;
  }
  return sections;
}


/**
 * The 28 loudness bands' filters at fsHz; a band whose upper edge is not below 0.95·fs/2 gets null
 * (its level is then taken as empty: the recording holds nothing there).
 */
export function loudnessFilterBank(fsHz: number): (Biquad[] | null)[] {
  return LOUDNESS_BAND_NUMBERS.map((x) => {
    const b = thirdOctaveBand(x);
    return b.upperHz < 0.95 * (fsHz / 2) ? butterworthBandPass(b.lowerHz, b.upperHz, fsHz) : null;
  });
}
