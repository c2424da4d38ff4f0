/**
 * `sound FILE --channel I [--cal K] [--from S] [--to S] [--field free|diffuse]`: is a whine audible?
 * Of a sound-pressure channel in Pa: loudness of ISO 532-1:2017 (stationary, against time, N5),
 * tonality of the hearing model of ECMA-418-2 (against time and averaged, with the tonal frequency),
 * and the strongest tones with their audibility (sound-tones.ts).
 */
import { hearingModelTonality } from '../../../workers/dsp/hearing-model';
import { loudnessLevelPhon, timeVaryingLoudness, type SoundField } from '../../../workers/dsp/loudness';
import type { Options } from '../options';
import { UsageError } from '../options';
import { calibrationFactor, channelIndex, readChannels, scaled } from '../recording-input';
import { soundTones } from './sound-tones';

const round = (v: number, digits: number) => Number(v.toFixed(digits));
const MAX_POINTS = 2000;

/** The channel's samples in Pa over --from … --to, with the sample rate. */
async function soundPressure(file: string, o: Options): Promise<{ x: Float32Array; fs: number; fromS: number }> {
  const channel = channelIndex(o);
  const cal = calibrationFactor(o);
  const rec = await readChannels(file, [channel]);
  const fs = rec.header.sampleRateHz;
  const fromS = o.number('from', 0, (s) => (s >= 0 ? null : 'must be 0 s or later.'));
  const toS = o.number('to', rec.header.durationS, (s) => (s > fromS ? null : `must be after --from (${fromS} s).`));
  const from = Math.round(fromS * fs);
  const to = Math.min(rec.header.frames, Math.round(toS * fs));
  if (to - from < 0.1 * fs) {
    throw new UsageError(`The range of ${rec.header.fileName} holds ${Math.max(0, to - from)} samples, less than 0.1 s; sound figures need a longer range.`);
  }
  return { x: scaled(rec.samples[0].slice(from, to), cal), fs, fromS };
}

/** At most MAX_POINTS of (t, v), each the largest value of its stretch, times shifted by t0. */
function thinned(t: Float64Array, v: Float64Array, t0: number, digits: number): { t: number[]; v: number[] } {
  const stride = Math.max(1, Math.ceil(t.length / MAX_POINTS));
  const outT: number[] = [];
  const outV: number[] = [];
  for (let k = 0; k < t.length; k += stride) {
    let m = -Infinity;
    for (let i = k; i < Math.min(t.length, k + stride); i++) m = Math.max(m, v[i]);
    outT.push(round(t[k] + t0, 3));
    outV.push(round(m, digits));
  }
  return { t: outT, v: outV };
}

export async function soundCommand(file: string, o: Options) {
  const field = o.choice<SoundField>('field', ['free', 'diffuse'], 'free');
  const { x, fs, fromS } = await soundPressure(file, o);
  const loud = timeVaryingLoudness(x, fs, field);
  const tonal = hearingModelTonality(x, fs);
  const tu = thinned(tonal.t, tonal.tu, fromS, 4);
  return {
    loudness: {
      method: 'ISO 532-1',
      field,
      stationarySone: round(loud.stationarySone, 3),
      levelPhon: round(loudnessLevelPhon(loud.stationarySone), 2),
      n5Sone: round(loud.n5Sone, 3),
      maxSone: round(loud.maxSone, 3),
      t: Array.from(loud.t, (t) => round(t + fromS, 3)),
      sone: Array.from(loud.sone, (v) => round(v, 4)),
    },
    tonality: {
      method: 'ECMA-418-2',
      averageTu: round(tonal.averageTu, 4),
      tonalHz: round(tonal.averageTonalHz, 1),
      t: tu.t,
      tu: tu.v,
    },
    tones: await soundTones(x, fs),
  };
}
