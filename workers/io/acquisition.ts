/**
 * What the readers of acquisition-system files (MAT, HDF5, UFF 58) share: they find named numeric
 * arrays, and this turns them into a recording by the same rules for every format. A scalar named fs,
 * Fs, sampleRate, sample_rate or sr gives the sample rate, else a uniform time vector t or time (not a
 * channel); a vector is one channel named after its variable, a matrix is channels in columns
 * ("acc 1", "acc 2", …); every channel must have the same length.
 */
import type { ChannelInfo, DecodedRecording, NonFiniteReport, RecordingFormat } from './recording';
import { RecordingError } from './recording-error';

export type NumericArray = ArrayLike<number>;

export interface NamedArray {
  name: string;
  rows: number;
  cols: number;
  /** rows × cols values, column by column (a column is a channel). */
  data: NumericArray;
  unit: string | null;
}

export const RATE_NAMES = new Set(['fs', 'Fs', 'FS', 'sampleRate', 'sample_rate', 'samplerate', 'sr']);
export const TIME_NAMES = new Set(['t', 'time', 'Time']);
const TIME_TOLERANCE = 1e-3;

export interface AssembleInput {
  format: RecordingFormat;
  fileName: string;
  sizeBytes: number;
  arrays: NamedArray[];
  /** A rate found elsewhere (an HDF5 root attribute, UFF's abscissa increment). */
  sampleRateHz?: number | null;
  /** What the reader skipped or noticed. */
  warnings?: string[];
  /** Tells the user where the rate can go when there is none. */
  noRateHint: string;
}

/** The rate a uniform time vector stands for, or an error naming the sample where the spacing breaks. */
function rateFromTime(fileName: string, t: NamedArray): number {
  const n = t.data.length;
  if (n < 2) throw new RecordingError('NO_SAMPLE_RATE', `${fileName}: the time vector ${t.name} has ${n} value; it needs two to give a sample rate.`);
  const x = t.data;
  const mean = (x[n - 1] - x[0]) / (n - 1);
  if (!(mean > 0)) throw new RecordingError('NO_SAMPLE_RATE', `${fileName}: the time vector ${t.name} does not rise.`);
  // float32 time vectors carry about 7 digits: allow their rounding as well as the relative tolerance
  const quantum = Math.max(Math.abs(x[0]), Math.abs(x[n - 1])) * 2 ** -23;
  for (let i = 1; i < n; i++) {
    const step = x[i] - x[i - 1];
    if (Math.abs(step - mean) > Math.max(TIME_TOLERANCE * mean, 2 * quantum)) {
      throw new RecordingError(
        'NO_SAMPLE_RATE',
        `${fileName}: the time vector ${t.name} is not evenly spaced (step ${step.toPrecision(4)} s at sample ${i + 1} where the mean step is ${mean.toPrecision(4)} s).`,
      );
    }
  }
  return 1 / mean;
}

export function assembleRecording(input: AssembleInput, wanted?: number[]): DecodedRecording {
  const { fileName } = input;
  const warnings = [...(input.warnings ?? [])];
  let rate: number | null = input.sampleRateHz ?? null;
  let time: NamedArray | null = null;
  const channelArrays: NamedArray[] = [];
  const ignored: string[] = [];
  for (const a of input.arrays) {
    const count = a.rows * a.cols;
    if (count === 1) {
      if (RATE_NAMES.has(a.name)) {
        const v = Number(a.data[0]);
        if (!(v > 0 && Number.isFinite(v))) throw new RecordingError('NO_SAMPLE_RATE', `${fileName}: the sample rate ${a.name} is ${v}; it must be a positive number of Hz.`);
        rate ??= v;
      } else ignored.push(a.name);
    } else if (count === 0) ignored.push(a.name);
    else if (TIME_NAMES.has(a.name) && (a.rows === 1 || a.cols === 1)) time = a;
    else channelArrays.push(a);
  }
  if (ignored.length) warnings.push(`Not read as channels (scalars or empty): ${ignored.join(', ')}.`);

  interface Channel { name: string; unit: string | null; data: NumericArray; offset: number; length: number }
  const channels: Channel[] = [];
  for (const a of channelArrays) {
    if (a.rows > 1 && a.cols > a.rows) {
      throw new RecordingError(
        'BAD_STRUCTURE',
        `${fileName}: the matrix ${a.name} is ${a.rows}×${a.cols}, more channels than samples; channels go in columns (${a.cols}×${a.rows}): transpose it.`,
      );
    }
    if (a.rows === 1 || a.cols === 1) channels.push({ name: a.name, unit: a.unit, data: a.data, offset: 0, length: a.rows * a.cols });
    else for (let j = 0; j < a.cols; j++) channels.push({ name: `${a.name} ${j + 1}`, unit: a.unit, data: a.data, offset: j * a.rows, length: a.rows });
  }
  if (!channels.length) throw new RecordingError('NOT_NUMERIC', `${fileName} has no numeric data to read as channels (no numeric vector or matrix).`);
  const frames = channels[0].length;
  const odd = channels.find((c) => c.length !== frames);
  if (odd) {
    throw new RecordingError(
      'UNEQUAL_LENGTHS',
      `${fileName}: the channels differ in length (${channels[0].name} has ${frames} samples, ${odd.name} ${odd.length}); all must have the same length.`,
    );
  }
  if (rate === null && time) {
    if (time.data.length !== frames) {
      throw new RecordingError('UNEQUAL_LENGTHS', `${fileName}: the time vector ${time.name} has ${time.data.length} values but the channels have ${frames} samples.`);
    }
    rate = rateFromTime(fileName, time);
    warnings.push(`The sample rate, ${rate.toPrecision(6)} Hz, comes from the time vector ${time.name}.`);
  }
  if (rate === null) throw new RecordingError('NO_SAMPLE_RATE', `${fileName} has no sample rate: ${input.noRateHint}`);

  const indices = wanted ?? channels.map((_, i) => i);
  for (const c of indices) {
    if (!Number.isInteger(c) || c < 0 || c >= channels.length) {
      throw new RecordingError('BAD_CHANNEL', `${fileName} has ${channels.length} channels; there is no channel ${c + 1}.`);
    }
  }
  const nonFinite: NonFiniteReport[] = [];
  const samples = indices.map((ci) => {
    const c = channels[ci];
    const out = new Float32Array(c.length);
    let bad = 0;
    let first = -1;
    for (let i = 0; i < c.length; i++) {
      const v = Number(c.data[c.offset + i]);
      if (Number.isFinite(v)) out[i] = v;
      else if (bad++ === 0) first = i;
    }
    if (bad) nonFinite.push({ channel: ci, count: bad, firstFrame: first });
    return out;
  });
  const info: ChannelInfo[] = channels.map((c, index) => ({ index, name: c.name, unit: c.unit }));
  return {
    header: {
      format: input.format,
      fileName,
      sizeBytes: input.sizeBytes,
      sampleRateHz: rate,
      frames,
      durationS: frames / rate,
      channels: info,
      warnings,
    },
    channelIndices: indices,
    samples,
    nonFinite,
  };
}
