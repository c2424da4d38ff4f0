/**
 * Loading PFFFT-WASM (SIMD build) together with Fanlight's frame-power kernel (kernels/frame-power.wat)
 * on one WebAssembly.Memory, so the kernel reads PFFFT's output and writes the powers in place.
 *
 * PFFFT's Emscripten module keeps its memory to itself; its documented Module.instantiateWasm hook lets
 * us instantiate the binary ourselves and pick the memory out of the instance's exports. The binary is
 * the package's own dist/simd/pffft.wasm: read from disk in Node, fetched as a bundled asset in the
 * browser. Anything missing (no WASM SIMD, no file, a failed fetch) returns null and fft.ts falls back
 * to PFFFT with the readout in JavaScript.
 */
import type { PffftModule, PffftModuleOptions } from './pffft-module';
import { base64 as framePowerBase64 } from './kernels/frame-power.wasm';

/** The exports of kernels/frame-power.wat; addresses are byte offsets into PFFFT's memory. */
export interface FrameKernel {
  narrowPower(y: number, out: number, half: number, c1: number, c0: number, scale: number, edge: number): void;
  multiply(src: number, w: number, dst: number, n: number): void;
  /** n floats at p (n mod 4 = 0) from mean-square power to 10·lg(max(x, 1e−30)) dB, in place. */
  decibels(p: number, n: number): void;
  /** A batch of frames: transform (through PFFFT's own export) and readout in one call. */
  frames(
    setup: number, src: number, hop: number, count: number, y: number, work: number, w: number, tmp: number,
    out: number, half: number, c1: number, c0: number, scale: number, edge: number,
  ): void;
}

const isNode = typeof process === 'object' && typeof process.versions?.node === 'string';

const fromBase64 = (s: string) => Uint8Array.from(atob(s), (c) => c.charCodeAt(0));

export const frameKernelBytes = () => fromBase64(framePowerBase64);

async function pffftSimdBinary(): Promise<BufferSource> {
  if (isNode) {
    // Variable specifiers keep these Node built-ins out of the browser bundle.
    const moduleName = 'node:module';
    const fsName = 'node:fs/promises';
    const { createRequire } = (await import(/* @vite-ignore */ moduleName)) as typeof import('node:module');
    const { readFile } = (await import(/* @vite-ignore */ fsName)) as typeof import('node:fs/promises');
    const glue = createRequire(import.meta.url).resolve('@echogarden/pffft-wasm/simd');
    return readFile(glue.replace(/pffft\.js$/, 'pffft.wasm'));
  }
  // Vite turns this into the URL of the bundled asset (the same file the package's glue loads).
  const url = new URL('../../node_modules/@echogarden/pffft-wasm/dist/simd/pffft.wasm', import.meta.url);
  const response = await fetch(url);
  if (!response.ok) throw new Error(`${url}: HTTP ${response.status}`);
  return response.arrayBuffer();
}

export async function loadPffftWithKernel(
  factory: (module?: PffftModuleOptions) => Promise<PffftModule>,
): Promise<{ m: PffftModule; kernel: FrameKernel } | null> {
  try {
    const kernelBytes = frameKernelBytes();
    if (!WebAssembly.validate(kernelBytes)) return null; // no WASM SIMD here
    const compiled = await WebAssembly.compile(await pffftSimdBinary());
    let memory: WebAssembly.Memory | undefined;
    let exported: unknown[] = [];
    let fail!: (e: unknown) => void;
    const failed = new Promise<never>((_, reject) => (fail = reject));
    const m = await Promise.race([
      factory({
        instantiateWasm(imports, receiveInstance) {
          WebAssembly.instantiate(compiled, imports).then((instance) => {
            exported = Object.values(instance.exports);
            memory = exported.find((v): v is WebAssembly.Memory => v instanceof WebAssembly.Memory);
            receiveInstance(instance, compiled);
          }, fail);
          return {};
        },
      }),
      failed,
    ]);
    if (!memory) return null;
    // The glue's _pffft_transform_ordered replaces itself by the raw WASM export on its first call: make
    // that call on a small setup, so the kernel imports the export itself (a direct WASM-to-WASM call).
    const setup = m._pffft_new_setup(32, 0);
    const buf = m._pffft_aligned_malloc(3 * 128);
    m._pffft_transform_ordered(setup, buf, buf + 128, buf + 256, 0);
    m._pffft_aligned_free(buf);
    m._pffft_destroy_setup(setup);
    const transform = m._pffft_transform_ordered;
    if (!exported.includes(transform)) return null;
    const instance = await WebAssembly.instantiate(await WebAssembly.compile(kernelBytes), {
      env: { memory },
      pffft: { transform_ordered: transform },
    });
    return { m, kernel: instance.exports as unknown as FrameKernel };
  } catch {
    return null;
  }
}
