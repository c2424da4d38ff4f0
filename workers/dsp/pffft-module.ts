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

/**
 * What the module factory accepts (Emscripten's Module object); only the documented hook Fanlight uses.
 * instantiateWasm(imports, receiveInstance) lets the caller instantiate the binary itself and so hold
 * its WebAssembly.Memory; it returns {} and calls receiveInstance later.
 */
export interface PffftModuleOptions {
  instantiateWasm?(imports: WebAssembly.Imports, receiveInstance: (instance: WebAssembly.Instance, module: WebAssembly.Module) => void): object;
}
