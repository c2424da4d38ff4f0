import { describe, expect, it } from 'vitest';
import { createRealFft } from '../../../workers/dsp/fft';

/** A direct DFT in float64, the textbook definition X[k] = Σ x[n] e^(−j2πkn/N) (Oppenheim & Schafer, eq. 8.11). */
function dft(x: Float32Array): Float64Array {
  const n = x.length;
  const out = new Float64Array(n + 2);
  for (let k = 0; k <= n / 2; k++) {
    let re = 0;
    let im = 0;
    for (let i = 0; i < n; i++) {
      const a = (-2 * Math.PI * k * i) / n;
      re += x[i] * Math.cos(a);
      im += x[i] * Math.sin(a);
    }
    out[2 * k] = re;
    out[2 * k + 1] = im;
  }
  return out;
}

const seeded = (n: number, seed = 7) => {
  let s = seed;
  return Float32Array.from({ length: n }, () => ((s = (s * 1103515245 + 12345) >>> 0) / 2 ** 32) * 2 - 1);
};

describe('real FFT backends', () => {
  it('uses PFFFT compiled to WASM with SIMD where the engine has it (Node 20 does)', async () => {
    const fft = await createRealFft(1024);
    expect(fft.backend).toBe('pffft-simd');
  });

  it.each([256, 1024, 8192])('PFFFT and fft.js agree with a direct DFT, N = %i', async (n) => {
    const x = seeded(n);
    const ref = n <= 1024 ? dft(x) : null;
    const wasm = await createRealFft(n);
    const js = await createRealFft(n, 'fft.js');
    const a = new Float64Array(n + 2);
    const b = new Float64Array(n + 2);
    wasm.complex(x, a);
    js.complex(x, b);
    const scale = Math.sqrt(n);
    for (let j = 0; j < n + 2; j++) {
      expect(Math.abs(a[j] - b[j]) / scale).toBeLessThan(1e-5);
      if (ref) expect(Math.abs(a[j] - ref[j]) / scale).toBeLessThan(1e-5);
    }
    const pa = new Float64Array(n / 2 + 1);
    const pb = new Float64Array(n / 2 + 1);
    wasm.power(x, pa);
    js.power(x, pb);
    for (let k = 0; k <= n / 2; k++) expect(pa[k]).toBeCloseTo(a[2 * k] ** 2 + a[2 * k + 1] ** 2, 1);
    for (let k = 0; k <= n / 2; k++) expect(Math.abs(pa[k] - pb[k]) / n).toBeLessThan(1e-4);
    wasm.dispose();
  });

  it('refuses a size that is not a power of two', async () => {
    await expect(createRealFft(1000)).rejects.toThrow(/power of two/);
  });
});
