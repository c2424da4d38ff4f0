/**
 * Real-input FFT of a power-of-two block, X[k] = Σ x[n]·e^(−j2πkn/N) for k = 0…N/2, unnormalised (the
 * numpy.fft.rfft convention). Two backends give the same numbers:
 * - PFFFT (J. Pommier, after FFTPACK) compiled to WebAssembly with SIMD: @echogarden/pffft-wasm;
 * - fft.js (F. Indutny), plain JavaScript: the fallback where WASM SIMD is missing, and the
 *   independent cross-check in tests.
 * With SIMD, a map's per-frame power readout runs in a small WASM kernel of Fanlight's own on PFFFT's
 * memory (frame-kernel.ts, kernels/frame-power.wat); without it, in JavaScript.
 */
import FFTJS from 'fft.js';
import { powerToDecibels } from './decibels';
import { loadPffftWithKernel, type FrameKernel } from './frame-kernel';
import type { PffftModule } from './pffft-module';
import type { SpectralWindow } from './window';

export type FftBackend = 'pffft-simd' | 'pffft' | 'fft.js';

export interface RealFft {
  readonly size: number;
  readonly backend: FftBackend;
  /** Where framePower reads the powers out: the WASM SIMD kernel (kernels/frame-power.wat) or JavaScript. */
  readonly readout: 'wasm-kernel' | 'js';
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
  /**
   * framePower for `count` frames starting at x[start], x[start + hop], …, into consecutive rows of
   * N/2 + 1 values from out[at]. With `decibels`, the rows hold 10·lg(max(power, 1e−30)) instead
   * (decibels.ts; in the WASM kernel where it runs).
   */
  framesPower(
    x: Float32Array, start: number, hop: number, count: number, win: SpectralWindow, out: Float32Array, at: number, scale: number, edgeScale: number,
    decibels?: boolean,
  ): void;
  dispose(): void;
}

export const isPowerOfTwo = (n: number) => Number.isInteger(n) && n >= 2 && (n & (n - 1)) === 0;

interface LoadedPffft {
  m: PffftModule;
  simd: boolean;
  kernel: FrameKernel | null;
}

let pffftModule: Promise<LoadedPffft | null> | null = null;

/** Set to false (tests) before the first createRealFft to load PFFFT without the frame kernel. */
export const pffftOptions = { kernel: true };

async function loadPffft(): Promise<LoadedPffft | null> {
  try {
    const factory = (await import('@echogarden/pffft-wasm/simd')).default;
    const withKernel = pffftOptions.kernel ? await loadPffftWithKernel(factory) : null;
    if (withKernel) return { ...withKernel, simd: true };
    return { m: await factory(), simd: true, kernel: null };
  } catch {
    try {
      const m = await (await import('@echogarden/pffft-wasm')).default();
      return { m, simd: false, kernel: null };
    } catch {
      return null;
    }
  }
}

/** Frames per batch copied into WASM memory at once are capped so the batch stays under 4 MB. */
const BATCH_FLOATS = 1 << 20;
/** Power rows per kernel call, capped at 1 MB of rows. */
const ROW_FLOATS = 1 << 18;

class PffftReal implements RealFft {
  readonly backend: FftBackend;
  readonly readout: 'wasm-kernel' | 'js';
  private readonly setup: number;
  private readonly inPtr: number;
  private readonly outPtr: number;
  private readonly workPtr: number;

  /** Where bin k's real and imaginary parts sit in PFFFT's unordered ("z-domain") output. */
  private readonly reIndex: Int32Array;
  private readonly imIndex: Int32Array;

  /** The readout kernel's buffers: powers of one frame, the time-domain window, a batch of samples. */
  private powPtr = 0;
  private winPtr = 0;
  private winOf: SpectralWindow | null = null;
  private batchPtr = 0;
  private batchFloats = 0;
  private rowsPtr = 0;
  private powViews: Float32Array[] = [new Float32Array(0), new Float32Array(0)];

  constructor(
    private readonly m: PffftModule,
    readonly size: number,
    simd: boolean,
    private readonly kernel: FrameKernel | null,
  ) {
    this.backend = simd ? 'pffft-simd' : 'pffft';
    this.readout = kernel ? 'wasm-kernel' : 'js';
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
    if (kernel) {
      this.powPtr = m._pffft_aligned_malloc((half + 8) * 4);
      this.winPtr = m._pffft_aligned_malloc(size * 4);
    }
  }

  /**
   * The kernel's power row for a destination out[at]: its byte address has the same remainder mod 8 as
   * the destination's. V8 copies into a SharedArrayBuffer (the CLI's map) with relaxed atomics, a word
   * at a time only where source and destination are equally aligned and byte by byte otherwise —
   * measured 2.4× slower; rows of N/2 + 1 floats alternate between the two alignments.
   */
  private row(out: Float32Array, at: number): { ptr: number; view: Float32Array } {
    const odd = ((out.byteOffset >> 2) + at) & 1;
    let view = this.powViews[odd];
    if (view.buffer !== this.m.HEAPF32.buffer) {
      // renewed when the memory has grown (growth detaches old views)
      const p = (this.powPtr >> 2) + odd;
      view = this.powViews[odd] = this.m.HEAPF32.subarray(p, p + (this.size >> 1) + 1);
    }
    return { ptr: this.powPtr + 4 * odd, view };
  }

  /**
   * The kernel route for one frame whose N samples sit at byte address src (16-byte aligned): transform,
   * then the powers into the kernel's row. Narrow windows (rect, Hann, Hamming) by their 3 spectral taps on
   * the raw block; wider ones multiplied in time first (into inPtr, so src is never changed). The powers
   * go to byte address dst.
   */
  private kernelFrame(src: number, dst: number, win: SpectralWindow, scale: number, edgeScale: number): void {
    const k = this.kernel!;
    const m = this.m;
    const c = win.spectralKernel;
    const half = this.size >> 1;
    if (c.length <= 3) {
      m._pffft_transform_ordered(this.setup, src, this.outPtr, this.workPtr, 0);
      k.narrowPower(this.outPtr, dst, half, c.length === 3 ? c[1] : c[0], c.length === 3 ? c[0] : 0, scale, edgeScale);
    } else {
      if (this.winOf !== win) {
        m.HEAPF32.set(win.w, this.winPtr >> 2);
        this.winOf = win;
      }
      k.multiply(src, this.winPtr, this.inPtr, this.size);
      m._pffft_transform_ordered(this.setup, this.inPtr, this.outPtr, this.workPtr, 0);
      k.narrowPower(this.outPtr, dst, half, 1, 0, scale, edgeScale);
    }
  }

  framesPower(x: Float32Array, start: number, hop: number, count: number, win: SpectralWindow, out: Float32Array, at: number, scale: number, edgeScale: number, decibels = false): void {
    const n = this.size;
    const bins = (n >> 1) + 1;
    if (!this.kernel || count <= 1 || hop % 4 !== 0 || hop > n) {
      for (let f = 0; f < count; f++) this.framePower(x, start + f * hop, win, out, at + f * bins, scale, edgeScale);
      if (decibels) powerToDecibels(out, at, at + count * bins);
      return;
    }
    // Overlapping frames share their samples: copy a batch's span into WASM memory once and transform
    // every frame from its place in it (hop·4 bytes keeps each frame 16-byte aligned, as PFFFT needs).
    const per = Math.max(1, Math.min(count, Math.floor((BATCH_FLOATS - n) / hop) + 1));
    const need = (per - 1) * hop + n;
    if (this.batchFloats < need) {
      if (this.batchPtr) this.m._pffft_aligned_free(this.batchPtr);
      this.batchPtr = this.m._pffft_aligned_malloc(need * 4);
      this.batchFloats = need;
    }
    const half = n >> 1;
    const rowsPer = Math.max(1, Math.floor(ROW_FLOATS / bins));
    // + 8: room for the alignment float and for decibels() working on whole groups of four
    if (!this.rowsPtr) this.rowsPtr = this.m._pffft_aligned_malloc((rowsPer * bins + 8) * 4);
    const c = win.spectralKernel;
    let w = 0;
    let c1 = 1;
    let c0 = 0;
    if (c.length <= 3) {
      c1 = c.length === 3 ? c[1] : c[0];
      c0 = c.length === 3 ? c[0] : 0;
    } else {
      if (this.winOf !== win) {
        this.m.HEAPF32.set(win.w, this.winPtr >> 2);
        this.winOf = win;
      }
      w = this.winPtr;
    }
    const k = this.kernel;
    for (let f0 = 0; f0 < count; f0 += per) {
      const frames = Math.min(per, count - f0);
      const s = start + f0 * hop;
      this.m.HEAPF32.set(x.subarray(s, s + (frames - 1) * hop + n), this.batchPtr >> 2);
      for (let g0 = 0; g0 < frames; g0 += rowsPer) {
        const g = Math.min(rowsPer, frames - g0);
        const to = at + (f0 + g0) * bins;
        // rows start at the alignment mod 8 of their place in out (see row())
        const dst = this.rowsPtr + 4 * (((out.byteOffset >> 2) + to) & 1);
        k.frames(this.setup, this.batchPtr + g0 * hop * 4, hop * 4, g, this.outPtr, this.workPtr, w, this.inPtr, dst, half, c1, c0, scale, edgeScale);
        if (decibels) k.decibels(dst, (g * bins + 3) & ~3);
        out.set(this.m.HEAPF32.subarray(dst >> 2, (dst >> 2) + g * bins), to);
      }
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
    if (this.kernel) {
      this.m.HEAPF32.set(x.subarray(start, start + n), this.inPtr >> 2);
      const row = this.row(out, at);
      this.kernelFrame(this.inPtr, row.ptr, win, scale, edgeScale);
      out.set(row.view, at);
      return;
    }
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
    for (const p of [this.powPtr, this.winPtr, this.batchPtr, this.rowsPtr]) if (p) this.m._pffft_aligned_free(p);
    this.m._pffft_aligned_free(this.inPtr);
    this.m._pffft_aligned_free(this.outPtr);
    this.m._pffft_aligned_free(this.workPtr);
    this.m._pffft_destroy_setup(this.setup);
  }
}

class FftJsReal implements RealFft {
  readonly backend: FftBackend = 'fft.js';
  readonly readout = 'js' as const;
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

  framesPower(x: Float32Array, start: number, hop: number, count: number, win: SpectralWindow, out: Float32Array, at: number, scale: number, edgeScale: number, decibels = false): void {
    const bins = (this.size >> 1) + 1;
    for (let f = 0; f < count; f++) this.framePower(x, start + f * hop, win, out, at + f * bins, scale, edgeScale);
    if (decibels) powerToDecibels(out, at, at + count * bins);
  }

  dispose(): void {}
}

/** A real FFT of size n: PFFFT-WASM (SIMD when the engine has it) unless `backend` asks for fft.js. */
export async function createRealFft(n: number, backend: 'auto' | 'fft.js' = 'auto'): Promise<RealFft> {
  if (!isPowerOfTwo(n)) throw new RangeError(`The block size must be a power of two, not ${n}.`);
  if (backend === 'auto' && n >= 32) {
    pffftModule ??= loadPffft();
    const loaded = await pffftModule;
    // the kernel's vector loop wants N/2 ≥ 8 and a multiple of 4: every PFFFT real size (N ≥ 32) has that
    if (loaded) return new PffftReal(loaded.m, n, loaded.simd, loaded.kernel);
  }
  return new FftJsReal(n);
}
