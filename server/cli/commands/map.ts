/** `map FILE --channel I --out PATH.npy`: the map as float32 [frames, bins], RMS amplitude in dB re 1 unit. */
import path from 'node:path';
import { stftLayout } from '../../../workers/dsp/stft';
import { windowNames } from '../../../workers/dsp/window';
import { writeNpy } from '../npy';
import type { Options } from '../options';
import { UsageError } from '../options';
import { calibrationFactor, channelIndex, readChannels, scaled } from '../recording-input';
import { MapThreadPool } from '../thread-pool';

export async function mapCommand(file: string, o: Options) {
  const channel = channelIndex(o);
  const out = o.string('out');
  if (!out.endsWith('.npy')) throw new UsageError(`--out must name a .npy file, not "${out}".`);
  const settings = {
    window: o.choice('window', windowNames, 'hann'),
    blockSize: o.integer('block', 8192, 256),
    overlap: o.number('overlap', 0.75, (f) => (f >= 0 && f <= 0.95 ? null : 'must be from 0 to 0.95.')),
  };
  const rec = await readChannels(file, [channel]);
  const x = scaled(rec.samples[0], calibrationFactor(o));
  const layout = stftLayout(x.length, rec.header.sampleRateHz, settings);
  if (layout.frames === 0) throw new UsageError(`${rec.header.fileName} is shorter than one block of ${settings.blockSize} samples.`);
  const pool = new MapThreadPool();
  try {
    const { power } = await pool.map(x, rec.header.sampleRateHz, settings);
    const db = new Float32Array(power.length);
    // RMS amplitude re 1 unit: 20·lg(√P) = 10·lg(P); a floor keeps −∞ out of the file
    for (let i = 0; i < power.length; i++) db[i] = 10 * Math.log10(Math.max(power[i], 1e-30));
    await writeNpy(path.resolve(process.env.INIT_CWD ?? process.cwd(), out), db, [layout.frames, layout.bins]);
  } finally {
    await pool.close();
  }
  return { frames: layout.frames, bins: layout.bins, hopS: layout.hopS, binHz: layout.binHz };
}
