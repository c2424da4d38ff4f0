import { describe, expect, it } from 'vitest';
import { createRealFft } from '../../../workers/dsp/fft';
import { averageFrames, computeFrames, stftLayout } from '../../../workers/dsp/stft';
import { criticalBandwidthHz } from '../../../workers/dsp/tonality';
import {
  findTones,
  maskingIndexDb,
  meanNarrowBandPower,
  toneAudibilityTs20065,
  ts20065CriticalBand,
} from '../../../workers/dsp/tone-audibility';
import { makeWindow } from '../../../workers/dsp/window';
import { whiteNoise } from '../../fixtures/hearing-model/noise-signals';

const P0 = 20e-6;
const FS = 48000;

/** Welch's averaged Hann power spectrum (mean square per line), 50 % overlap, the repo's STFT path. */
async function welch(x: Float64Array, blockSize: number): Promise<{ p: Float64Array; binHz: number }> {
  const xf = Float32Array.from(x);
  const layout = stftLayout(xf.length, FS, { window: 'hann', blockSize, overlap: 0.5 });
  const map = new Float32Array(layout.frames * layout.bins);
  computeFrames(xf, 0, layout, makeWindow('hann', blockSize), await createRealFft(blockSize), 0, layout.frames, map);
  return { p: averageFrames(map, layout.bins, 0, layout.frames), binHz: layout.binHz };
}

/** Tones of given RMS levels (dB re 20 µPa) over white noise of one-sided PSD psdPa2PerHz. */
function tonesInWhiteNoise(seconds: number, psdPa2PerHz: number, tones: [number, number][], seed: number): Float64Array {
  // One-sided PSD S of discrete white noise of variance σ² at rate fs: S = 2σ²/fs.
  const sigma = Math.sqrt((psdPa2PerHz * FS) / 2);
  const x = whiteNoise(seconds * FS, seed);
  for (let i = 0; i < x.length; i++) {
    x[i] *= sigma;
    for (const [f, db] of tones) x[i] += P0 * Math.SQRT2 * 10 ** (db / 20) * Math.sin((2 * Math.PI * f * i) / FS + 0.3);
  }
  return x;
}

describe('maskingIndexDb', () => {
  it('follows a_v = −2 − lg[1 + (f/502)^2.5] of ISO/TS 20065 at its published points', () => {
    // ISO/TS 20065:2016 masking index: −2 dB at low frequency (the formula's limit as f → 0).
    expect(maskingIndexDb(20)).toBeCloseTo(-2, 3);
    // At 1 kHz: (1000/502)^2.5 = 5.600, lg 6.600 = 0.8195, a_v = −2.8195 dB (written out by hand).
    expect(maskingIndexDb(1000)).toBeCloseTo(-2.8195, 3);
    // At 10 kHz: (10000/502)^2.5 = 1771, lg 1772 = 3.2485, a_v = −5.25 dB ("about −5.3 dB",
    // /work/shared/references.md §12).
    expect(maskingIndexDb(10000)).toBeCloseTo(-5.2485, 3);
    // ISO 1996-2:2017 Annex J describes the index as falling to −6 dB at 20 kHz: (20000/502)^2.5 = 10018.
    expect(maskingIndexDb(20000)).toBeCloseTo(-6.0, 2);
  });
});

describe('ts20065CriticalBand', () => {
  it('is Δf_c = 25 + 75·(1 + 1.4·(f/kHz)²)^0.69 wide with the tone at the geometric mean of its edges', () => {
    // ISO/TS 20065 critical bandwidth at 1 kHz: 25 + 75·2.4^0.69 = 25 + 75·1.8295 = 162.2 Hz.
    expect(criticalBandwidthHz(1000)).toBeCloseTo(162.2, 1);
    const [f1, f2] = ts20065CriticalBand(1000);
    expect(f2 - f1).toBeCloseTo(criticalBandwidthHz(1000), 9);
    expect(Math.sqrt(f1 * f2)).toBeCloseTo(1000, 9);
  });
});

describe('meanNarrowBandPower', () => {
  it('leaves out the tone line and lines more than 6 dB above the mean, so tone lines do not raise the noise level', () => {
    // ISO/TS 20065 L_S: energetic mean without the tone's line, then without lines 6 dB above the mean.
    // 40 noise lines of 1, the tone line of 1000 and its two neighbours of 250.
    const p = new Float64Array(41).fill(1);
    p[20] = 1000;
    p[19] = 250;
    p[21] = 250;
    expect(meanNarrowBandPower(p, 0, 40, 20)).toBe(1);
  });
});

describe('toneAudibilityTs20065', () => {
  it('gives the analytic ΔL of a 60 dB tone at 1 kHz in white noise of 30 dB per hertz', async () => {
    // Textbook computation, ISO/TS 20065 ΔL = L_T − L_G − a_v:
    //   noise of PSD S = p0²·10^(30/10) Pa²/Hz → in one line spacing Δf: L_S = 30 + 10·lg(Δf) dB,
    //   in the critical band L_G = L_S + 10·lg(Δf_c/Δf) = 30 + 10·lg(162.2) = 52.10 dB;
    //   a_v(1 kHz) = −2.82 dB; L_T = 60 dB; ΔL = 60 − 52.10 + 2.82 = 10.72 dB.
    const psd = P0 * P0 * 1e3;
    const x = tonesInWhiteNoise(20, psd, [[1000, 60]], 1);
    const { p, binHz } = await welch(x, 16384);
    const r = toneAudibilityTs20065(p, binHz, 1000);
    const dfc = criticalBandwidthHz(1000);
    const expectedLg = 30 + 10 * Math.log10(dfc);
    const expectedAv = -2 - Math.log10(1 + (1000 / 502) ** 2.5);
    // 0.3 dB: ~115 averages of ~55 noise lines keep L_S within ±0.1 dB; the tone lines carry a little noise.
    expect(r.toneHz).toBeCloseTo(1000, 0);
    expect(Math.abs(r.levelDb - 60)).toBeLessThan(0.3);
    expect(Math.abs(r.maskingNoiseDb - expectedLg)).toBeLessThan(0.3);
    expect(Math.abs(r.narrowBandNoiseDb - (30 + 10 * Math.log10(binHz)))).toBeLessThan(0.3);
    expect(r.maskingIndexDb).toBeCloseTo(expectedAv, 3);
    expect(Math.abs(r.audibilityDb - (60 - expectedLg - expectedAv))).toBeLessThan(0.4);
    expect(r.maskedThresholdDb).toBeCloseTo(r.maskingNoiseDb + r.maskingIndexDb, 9);
    // ISO 389-7:2005 Table 1: 2.4 dB at 1 kHz, so the tone lies L_T − 2.4 dB above the threshold of hearing.
    expect(r.aboveHearingThresholdDb).toBeCloseTo(r.levelDb - 2.4, 2); // the peak lies a few mHz off 1 kHz
  });

  it('moves ΔL dB for dB with the tone level (ISO/TS 20065: L_T enters ΔL with weight 1)', async () => {
    const psd = P0 * P0 * 1e3;
    const results = [];
    for (const level of [45, 55, 65]) {
      const { p, binHz } = await welch(tonesInWhiteNoise(10, psd, [[4000, level]], 2), 16384);
      results.push(toneAudibilityTs20065(p, binHz, 4000).audibilityDb);
    }
    expect(Math.abs(results[1] - results[0] - 10)).toBeLessThan(0.4);
    expect(Math.abs(results[2] - results[1] - 10)).toBeLessThan(0.4);
  });

  it('says which argument is wrong', () => {
    expect(() => toneAudibilityTs20065(new Float64Array(100), 0, 10)).toThrow(/binHz/);
    expect(() => toneAudibilityTs20065(new Float64Array(100), 1, 500)).toThrow(/toneHz/);
  });
});

describe('findTones', () => {
  it('finds the tones that rise clearly above the noise, strongest first, and no more than asked', async () => {
    const psd = P0 * P0 * 1e3;
    const x = tonesInWhiteNoise(10, psd, [[700, 55], [3000, 65], [14000, 60], [9000, 30]], 3);
    const { p, binHz } = await welch(x, 16384);
    const tones = findTones(p, binHz, 5);
    // The 30 dB tone at 9 kHz lies ~17 dB under the noise in its line's bandwidth (36.4 dB): not a tone.
    expect(tones).toHaveLength(3);
    expect(tones[0]).toBeCloseTo(3000, 0);
    expect(tones[1]).toBeCloseTo(14000, 0);
    expect(tones[2]).toBeCloseTo(700, 0);
    expect(findTones(p, binHz, 1)).toHaveLength(1);
  });

  it("does not take a strong tone's window side lobes for tones", async () => {
    // A 90 dB tone half-way between lines over noise 80 dB lower per line: the Hann side lobes
    // (−31.5 dB at 2.5 lines, Harris 1978) rise far above the noise but are the tone's leakage; they
    // fill the critical band's mean level L_S, so none stands 10 dB above it.
    const { p, binHz } = await welch(tonesInWhiteNoise(4, P0 * P0, [[(1000.5 * FS) / 16384, 90]], 5), 16384);
    const tones = findTones(p, binHz, 5);
    expect(tones).toHaveLength(1);
    expect(tones[0] / binHz).toBeCloseTo(1000.5, 1);
  });

  it('finds nothing in white noise alone', async () => {
    const { p, binHz } = await welch(tonesInWhiteNoise(10, P0 * P0 * 1e3, [], 4), 16384);
    expect(findTones(p, binHz, 5)).toEqual([]);
  });
});
