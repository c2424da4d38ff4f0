/**
 * Real-input FFT of a power-of-two block, X[k] = Σ x[n]·e^(−j2πkn/N) for k = 0…N/2, unnormalised (the
 * numpy.fft.rfft convention). Two backends give the same numbers:
 * - PFFFT (J. Pommier, after FFTPACK) compiled to WebAssembly with SIMD: @echogarden/pffft-wasm;
 * - fft.js (F. Indutny), plain JavaScript: the fallback where WASM SIMD is missing, and the
 *   independent cross-check in tests.
 */
import FFTJS from 'fft.js';
import type { PffftModule } from './pffft-module';
import type { SpectralWindow } from './window';

export type FftBackend = 'pffft-simd' | 'pffft' | 'fft.js';

export interface RealFft {
  readonly size: number;
  readonly backend: FftBackend;
  /**
   * |X[k]|² for k = 0…N/2 into out (length N/2 + 1). `input` holds N real samples, already windowed;
   * it is not changed.
   */
  power(input: Float32Array, out: Float32Array | Float64Array): void;
  /** X[k] for k = 0…N/2 as interleaved re, im (length N + 2). */
  complex(input: Float32Array, out: Float32Array | Float64Array): void;
  /**
   * The hot path of a map: the power |X_w[k]|²·scale of x[start…start+N) under window `win`, into
   * out[at…at+N/2] (edgeScale at DC and Nyquist, scale elsewhere).
   */
  framePower(x: Float32Array, start: number, win: SpectralWindow, out: Float32Array, at: number, scale: number, edgeScale: number): void;
  dispose(): void;
}

export const isPowerOfTwo = (n: number) => Number.isInteger(n) && n >= 2 && (n & (n - 1)) === 0;

let pffftModule: Promise<{ m: PffftModule; simd: boolean } | null> | null = null;

async function loadPffft(): Promise<{ m: PffftModule; simd: boolean } | null> {
  try {
    const m = await (await import('@echogarden/pffft-wasm/simd')).default();
    return { m, simd: true };
  } catch {
    try {
      const m = await (await import('@echogarden/pffft-wasm')).default();
      return { m, simd: false };
    } catch {
      return null;
    }
  }
}

class PffftReal implements RealFft {
  readonly backend: FftBackend;
  private readonly setup: number;
  private readonly inPtr: number;
  private readonly outPtr: number;
  private readonly workPtr: number;

  /** Where bin k's real and imaginary parts sit in PFFFT's unordered ("z-domain") output. */
  private readonly reIndex: Int32Array;
  private readonly imIndex: Int32Array;

  constructor(
    private readonly m: PffftModule,
    readonly size: number,
    simd: boolean,
  ) {
    this.backend = simd ? 'pffft-simd' : 'pffft';
    this.setup = m._pffft_new_setup(size, 0); // 0 = PFFFT_REAL
    this.inPtr = m._pffft_aligned_malloc(size * 4);
    this.outPtr = m._pffft_aligned_malloc(size * 4);
    this.workPtr = m._pffft_aligned_malloc(size * 4);
    // pffft_zreorder is a permutation for real transforms: reorder the indices themselves once, and the
    // hot path can read powers straight from the unordered output (skipping the reorder pass per frame).
    const heap = m.HEAPF32;
    for (let i = 0; i < size; i++) heap[(this.inPtr >> 2) + i] = i;
    m._pffft_zreorder(this.setup, this.inPtr, this.outPtr, 0);
    const order = m.HEAPF32.slice(this.outPtr >> 2, (this.outPtr >> 2) + size);
    const half = size >> 1;
    this.reIndex = new Int32Array(half + 1);
    this.imIndex = new Int32Array(half + 1);
    this.reIndex[0] = order[0];
    this.reIndex[half] = order[1];
    for (let k = 1; k < half; k++) {
      this.reIndex[k] = order[2 * k];
      this.imIndex[k] = order[2 * k + 1];
    }
  }

  private re = new Float32Array(0);
  private im = new Float32Array(0);

  /**
   * Windowing by convolution in the frequency domain (Harris 1978, §V): the raw block is copied into
   * WASM memory as it is (a memcpy, no per-sample multiply in JavaScript), transformed, and the
   * window's few spectral taps are applied while the powers are read out. Exact for the periodic
   * cosine-sum windows; the spectrum is extended past DC and Nyquist by conjugate symmetry.
   */
  framePower(x: Float32Array, start: number, win: SpectralWindow, out: Float32Array, at: number, scale: number, edgeScale: number): void {
    const n = this.size;
    const half = n >> 1;
    const c = win.spectralKernel;
    const p = c.length >> 1;
    if (this.re.length !== half + 1 + 2 * p) {
      this.re = new Float32Array(half + 1 + 2 * p);
      this.im = new Float32Array(half + 1 + 2 * p);
    }
    if (p <= 1) {
      this.framePowerNarrow(x, start, p === 1 ? c[1] : c[0], p === 1 ? c[0] : 0, out, at, scale, edgeScale);
      return;
    }
    const re = this.re;
    const im = this.im;
    this.m.HEAPF32.set(x.subarray(start, start + n), this.inPtr >> 2);
    this.m._pffft_transform(this.setup, this.inPtr, this.outPtr, this.workPtr, 0);
    const heap = this.m.HEAPF32;
    const y = this.outPtr >> 2;
    const ri = this.reIndex;
    const ii = this.imIndex;
    re[p] = heap[y + ri[0]];
    im[p] = 0;
    re[p + half] = heap[y + ri[half]];
    im[p + half] = 0;
    for (let k = 1; k < half; k++) {
      re[p + k] = heap[y + ri[k]];
      im[p + k] = heap[y + ii[k]];
    }
    for (let j = 1; j <= p; j++) {
      re[p - j] = re[p + j];
      im[p - j] = -im[p + j]; // X[−j] = conj X[j]
      re[p + half + j] = re[p + half - j];
      im[p + half + j] = -im[p + half - j]; // X[N/2 + j] = conj X[N/2 − j]
    }
    if (p === 1) {
      const c0 = c[0];
      const c1 = c[1];
      for (let k = 0; k <= half; k++) {
        const a = c1 * re[k + 1] + c0 * (re[k] + re[k + 2]);
        const b = c1 * im[k + 1] + c0 * (im[k] + im[k + 2]);
        out[at + k] = (a * a + b * b) * scale;
      }
    } else {
      for (let k = 0; k <= half; k++) {
        let a = 0;
        let b = 0;
        for (let j = 0; j < c.length; j++) {
          a += c[j] * re[k + j];
          b += c[j] * im[k + j];
        }
        out[at + k] = (a * a + b * b) * scale;
      }
    }
    out[at] *= edgeScale / scale;
    out[at + half] *= edgeScale / scale;
  }

  /**
   * Rectangular, Hann and Hamming (kernel c1·X[k] + c0·(X[k−1] + X[k+1])): one sequential pass over the
   * ordered output with the neighbours held in locals, the fastest route in JavaScript.
   */
  private framePowerNarrow(x: Float32Array, start: number, c1: number, c0: number, out: Float32Array, at: number, scale: number, edgeScale: number): void {
    const n = this.size;
    const half = n >> 1;
    this.m.HEAPF32.set(x.subarray(start, start + n), this.inPtr >> 2);
    this.m._pffft_transform_ordered(this.setup, this.inPtr, this.outPtr, this.workPtr, 0);
    const h = this.m.HEAPF32;
    const y = this.outPtr >> 2;
    const x0 = h[y]; // X[0], real
    const xh = h[y + 1]; // X[N/2], real
    // k = 0: neighbours X[−1] = conj X[1] and X[1]
    let pr = h[y + 2];
    let pi = -h[y + 3];
    let cr = x0;
    let ci = 0;
    let nr = h[y + 2];
    let ni = h[y + 3];
    let a = c1 * cr + c0 * (pr + nr);
    let b = c1 * ci + c0 * (pi + ni);
    out[at] = (a * a + b * b) * edgeScale;
    pr = cr;
    pi = ci;
    cr = nr;
    ci = ni;
    for (let k = 1; k < half - 1; k++) {
      const j = y + 2 * k + 2;
      nr = h[j];
      ni = h[j + 1];
      a = c1 * cr + c0 * (pr + nr);
      b = c1 * ci + c0 * (pi + ni);
      out[at + k] = (a * a + b * b) * scale;
      pr = cr;
      pi = ci;
      cr = nr;
      ci = ni;
    }
    // k = N/2 − 1: its upper neighbour is X[N/2]
    a = c1 * cr + c0 * (pr + xh);
    b = c1 * ci + c0 * pi;
    out[at + half - 1] = (a * a + b * b) * scale;
    // k = N/2: neighbours X[N/2 − 1] and X[N/2 + 1] = conj X[N/2 − 1]; the imaginary parts cancel
    a = c1 * xh + c0 * 2 * cr;
    out[at + half] = a * a * edgeScale;
  }

  private run(input: Float32Array): Float32Array {
    // HEAPF32 is re-read each time: the WASM memory may have grown (and its views been replaced).
    const heap = this.m.HEAPF32;
    heap.set(input.subarray(0, this.size), this.inPtr >> 2);
    this.m._pffft_transform_ordered(this.setup, this.inPtr, this.outPtr, this.workPtr, 0);
    return this.m.HEAPF32.subarray(this.outPtr >> 2, (this.outPtr >> 2) + this.size);
  }

  power(input: Float32Array, out: Float32Array | Float64Array): void {
    const y = this.run(input);
    const half = this.size >> 1;
    // Ordered real output packs X[0] and X[N/2] (both real) into the first pair (pffft.h).
    out[0] = y[0] * y[0];
    out[half] = y[1] * y[1];
    for (let k = 1, j = 2; k < half; k++, j += 2) out[k] = y[j] * y[j] + y[j + 1] * y[j + 1];
  }

  complex(input: Float32Array, out: Float32Array | Float64Array): void {
    const y = this.run(input);
    const half = this.size >> 1;
    out[0] = y[0];
    out[1] = 0;
    out[2 * half] = y[1];
    out[2 * half + 1] = 0;
    for (let j = 2; j < 2 * half; j++) out[j] = y[j];
  }

  dispose(): void {
    this.m._pffft_aligned_free(this.inPtr);
    this.m._pffft_aligned_free(this.outPtr);
    this.m._pffft_aligned_free(this.workPtr);
    this.m._pffft_destroy_setup(this.setup);
  }
}

class FftJsReal implements RealFft {
  readonly backend: FftBackend = 'fft.js';
  private readonly fft: FFTJS;
  private readonly out: number[];
  private readonly buf: Float64Array;

  constructor(readonly size: number) {
    this.fft = new FFTJS(size);
    this.out = this.fft.createComplexArray();
    this.buf = new Float64Array(size);
  }

  private run(input: Float32Array): number[] {
    this.buf.set(input.subarray(0, this.size));
    // realTransform fills k = 0…N/2 (the half we need); completeSpectrum would mirror the rest.
    this.fft.realTransform(this.out, this.buf);
    return this.out;
  }

  power(input: Float32Array, out: Float32Array | Float64Array): void {
    const y = this.run(input);
    const half = this.size >> 1;
    for (let k = 0, j = 0; k <= half; k++, j += 2) out[k] = y[j] * y[j] + y[j + 1] * y[j + 1];
  }

  complex(input: Float32Array, out: Float32Array | Float64Array): void {
    const y = this.run(input);
    for (let j = 0; j < this.size + 2; j++) out[j] = y[j];
  }

  framePower(x: Float32Array, start: number, win: SpectralWindow, out: Float32Array, at: number, scale: number, edgeScale: number): void {
    const n = this.size;
    const half = n >> 1;
    const w = win.w;
    for (let i = 0; i < n; i++) this.buf[i] = x[start + i] * w[i];
    this.fft.realTransform(this.out, this.buf);
    const y = this.out;
    out[at] = y[0] * y[0] * edgeScale;
    out[at + half] = (y[n] * y[n] + y[n + 1] * y[n + 1]) * edgeScale;
    for (let k = 1, j = 2; k < half; k++, j += 2) out[at + k] = (y[j] * y[j] + y[j + 1] * y[j + 1]) * scale;
  }

  dispose(): void {}
}

/** A real FFT of size n: PFFFT-WASM (SIMD when the engine has it) unless `backend` asks for fft.js. */
export async function createRealFft(n: number, backend: 'auto' | 'fft.js' = 'auto'): Promise<RealFft> {
  if (!isPowerOfTwo(n)) throw new RangeError(`The block size must be a power of two, not ${n}.`);
  if (backend === 'auto' && n >= 32) {
    pffftModule ??= loadPffft();
    const loaded = await pffftModule;
    if (loaded) return new PffftReal(loaded.m, n, loaded.simd);
  }
  return new FftJsReal(n);
}
