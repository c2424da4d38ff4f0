/** `speed FILE (--tacho I --ppr N [--trigger V] | --speed-channel I)`: rpm against time. */
import { speedFromChannel, speedFromTacho, type SpeedCurve } from '../../../workers/dsp/speed';
import type { Options } from '../options';
import { UsageError } from '../options';
import { calibrationFactor, readChannels, scaled } from '../recording-input';

export async function speedCurveFrom(file: string, o: Options, speedCalKey = 'cal'): Promise<SpeedCurve> {
  if (o.has('tacho') === o.has('speed-channel')) {
    throw new UsageError('Give either --tacho I --ppr N or --speed-channel I.');
  }
  if (o.has('tacho')) {
    const ppr = o.integer('ppr', undefined, 1);
    const rec = await readChannels(file, [o.integer('tacho')]);
    const trigger = o.has('trigger') ? o.number('trigger') : undefined;
    return speedFromTacho(rec.samples[0], rec.header.sampleRateHz, ppr, { triggerLevel: trigger });
  }
  const rec = await readChannels(file, [o.integer('speed-channel')]);
  const k = speedCalKey === 'cal' ? calibrationFactor(o) : o.number(speedCalKey, 1);
  return speedFromChannel(scaled(rec.samples[0], 1), rec.header.sampleRateHz, k);
}

export async function speedCommand(file: string, o: Options) {
  const curve = await speedCurveFrom(file, o);
  return { t: Array.from(curve.tS), rpm: Array.from(curve.rpm) };
}
