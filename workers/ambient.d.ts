// Packages that ship no types (and have no @types).

declare module 'wav-decoder' {
  export interface DecodedAudio {
    sampleRate: number;
    numberOfChannels: number;
    length: number;
    channelData: Float32Array[];
  }
  export function decode(buffer: ArrayBuffer, opts?: { symmetric?: boolean }): Promise<DecodedAudio>;
  const wavDecoder: { decode: typeof decode };
  export default wavDecoder;
}

declare module '@echogarden/pffft-wasm/simd' {
  import type { PffftModule, PffftModuleOptions } from './dsp/pffft-module';
  const factory: (module?: PffftModuleOptions) => Promise<PffftModule>;
  export default factory;
}

declare module '@echogarden/pffft-wasm' {
  import type { PffftModule, PffftModuleOptions } from './dsp/pffft-module';
  const factory: (module?: PffftModuleOptions) => Promise<PffftModule>;
  export default factory;
}

declare module 'fft.js' {
  export default class FFT {
    constructor(size: number);
    readonly size: number;
    createComplexArray(): number[];
    realTransform(out: number[], data: ArrayLike<number>): void;
    completeSpectrum(out: number[]): void;
    transform(out: number[], data: ArrayLike<number>): void;
  }
}
