/**
 * Mean-square power to level: L = 10·lg(P) dB re 1 unit², which is 20·lg of the RMS amplitude re 1 unit
 * (IEC 60027-3 level of a power quantity). A floor of 1e−30 keeps −∞ out of maps and files. The WASM
 * kernel's decibels() (kernels/frame-power.wat) does the same where it runs.
 */
export const POWER_FLOOR = 1e-30;

/** out[from…to) from power to dB, in place. */
export function powerToDecibels(out: Float32Array, from = 0, to = out.length): void {
  for (let i = from; i < to; i++) out[i] = 10 * Math.log10(Math.max(out[i], POWER_FLOOR));
}
