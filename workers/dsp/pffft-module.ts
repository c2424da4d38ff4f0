/** The part of the Emscripten module of @echogarden/pffft-wasm that Fanlight calls (pffft.h). */
export interface PffftModule {
  HEAPF32: Float32Array;
  _pffft_new_setup(n: number, transform: 0 | 1): number;
  _pffft_destroy_setup(setup: number): void;
  _pffft_aligned_malloc(bytes: number): number;
  _pffft_aligned_free(ptr: number): void;
  _pffft_transform_ordered(setup: number, input: number, output: number, work: number, direction: 0 | 1): void;
  _pffft_transform(setup: number, input: number, output: number, work: number, direction: 0 | 1): void;
  _pffft_zreorder(setup: number, input: number, output: number, direction: 0 | 1): void;
  _pffft_simd_size(): number;
}
