/**
 * Real-input FFT of a power-of-two block, X[k] = Σ x[n]·e^(−j2πkn/N) for k = 0…N/2, unnormalised (the
 * numpy.fft.rfft convention). Two backends give the same numbers:
 * - PFFFT (J. Pommier, after FFTPACK) compiled to WebAssembly with SIMD: @echogarden/pffft-wasm;
 * - fft.js (F. Indutny), plain JavaScript: the fallback where WASM SIMD is missing, and the
 *   independent cross-check in tests.
 */
import FFTJS from 'fft.js';
import type { PffftModule } from './pffft-module';

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
