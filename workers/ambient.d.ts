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
