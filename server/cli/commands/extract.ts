/**
 * `extract FILE --channel I (--tacho J --ppr N | --speed-channel J [--speed-cal K]) (--order K | --family M:N)…
 * [--pole-pairs P] [--carrier HZ] [--bandwidth HZ] [--remove] [--cal K] --out OUT.wav`: the time signals of
 * orders and carrier families by the Vold–Kalman filter (workers/dsp/vold-kalman.ts), all components
 * coupled so that crossing ones separate. Writes a 32-bit float WAV at the input's rate: one channel per
 * component in the order given, or with --remove one channel, the input less all of them. Families follow
 * the carrier: --carrier HZ, or the detected carrier with its shifts (and the inferred pole pairs unless
 * --pole-pairs is given).
 */
import { writeFileSync } from 'node:fs';
import path from 'node:path';
import { analyseInverter } from '../../../workers/dsp/inverter-analysis';
import { rpmAtTimes } from '../../../workers/dsp/speed';
import { frameTimeS } from '../../../workers/dsp/stft';
import { voldKalman } from '../../../workers/dsp/vold-kalman';
import { makeWindow } from '../../../workers/dsp/window';
import { writeWav } from '../../../workers/io/wav-writer';
import type { Options } from '../options';
import { UsageError } from '../options';
import { calibrationFactor, channelIndex, readChannels, scaled } from '../recording-input';
import { MapThreadPool } from '../thread-pool';
import { speedCurveFrom } from './speed';

type Component = { kind: 'order'; order: number } | { kind: 'family'; m: number; n: number };

const DEFAULT_BANDWIDTH_HZ = 10;
/** The RMS of each component is reported for frames of this length, s. */
const REPORT_FRAME_S = 0.1;
const round = (x: number, digits = 6) => (Number.isFinite(x) ? Number(x.toPrecision(digits)) : null);

function components(o: Options): Component[] {
  const list = o.sequence(['order', 'family']).map(({ key, value }): Component => {
    if (key === 'order') {
      const k = Number(value);
      if (!(Number.isFinite(k) && k > 0)) throw new UsageError(`--order must be a positive number (shaft orders), not "${value}".`);
      return { kind: 'order', order: k };
    }
    const m = /^(\d+):(-?\d+)$/.exec(value);
    if (!m || Number(m[1]) < 1) throw new UsageError(`--family must be M:N with M a whole number from 1 and N a whole number, not "${value}".`);
    return { kind: 'family', m: Number(m[1]), n: Number(m[2]) };
  });
  if (!list.length) throw new UsageError('Name at least one component: --order K or --family M:N (repeat them for several).');
  return list;
}

/** The carrier per sample and the pole pairs, from the options or found in the recording. */
async function carrierAndPoles(x: Float32Array, fsHz: number, frameRpmOf: (times: Float64Array) => Float64Array, o: Options): Promise<{ carrier: (i: number) => number; polePairs: number }> {
  const given = o.has('carrier') ? o.number('carrier', undefined, (v) => (v > 0 && v < fsHz / 2 ? null : `must lie between 0 and ${fsHz / 2} Hz.`)) : null;
  const givenPoles = o.has('pole-pairs') ? o.integer('pole-pairs', undefined, 1) : null;
  if (given !== null && givenPoles !== null) return { carrier: () => given, polePairs: givenPoles };
  const block = o.integer('block', 8192, 256);
  const pool = new MapThreadPool();
  try {
    const { layout, power } = await pool.map(x, fsHz, { window: 'hann', blockSize: block, overlap: 0.75 });
    if (layout.frames < 8) throw new UsageError(`The recording is too short to find the carrier with blocks of ${block}: use --carrier and --pole-pairs, or a smaller --block.`);
    const times = Float64Array.from({ length: layout.frames }, (_, f) => frameTimeS(layout, f));
    const report = analyseInverter({ power, layout, window: 'hann', enbwBins: makeWindow('hann', block).enbwBins, frameRpm: frameRpmOf(times), polePairs: givenPoles ?? undefined, families: [] });
    const polePairs = givenPoles ?? report.polePairs.value;
    if (!polePairs) throw new UsageError('The pole pairs cannot be told from this recording\'s sidebands: give --pole-pairs P.');
    if (given !== null) return { carrier: () => given, polePairs };
    // the detected carrier per frame, held between frame centres; frames without one take the nearest found
    const hz = report.carrier.hz.map((h) => (typeof h === 'number' && Number.isFinite(h) ? h : NaN));
    let last = hz.find(Number.isFinite);
    if (last === undefined) throw new UsageError('No carrier was found in this recording: give --carrier HZ.');
    for (let f = 0; f < hz.length; f++) if (Number.isFinite(hz[f])) last = hz[f];
    else hz[f] = last;
    const t0 = frameTimeS(layout, 0);
    return {
      carrier: (i) => hz[Math.max(0, Math.min(hz.length - 1, Math.round((i / fsHz - t0) / layout.hopS)))],
      polePairs,
    };
  } finally {
    await pool.close();
  }
}

export async function extractCommand(file: string, o: Options) {
  const channel = channelIndex(o);
  const out = path.resolve(process.env.INIT_CWD ?? process.cwd(), o.string('out'));
  if (!out.toLowerCase().endsWith('.wav')) throw new UsageError(`--out must name a .wav file, not "${o.string('out')}".`);
  const list = components(o);
  const bandwidthHz = o.number('bandwidth', DEFAULT_BANDWIDTH_HZ, (b) => (b > 0 ? null : 'must be above 0 Hz.'));
  const curve = await speedCurveFrom(file, o, 'speed-cal');
  const rec = await readChannels(file, [channel]);
  const fsHz = rec.header.sampleRateHz;
  if (!(bandwidthHz < fsHz / 4)) throw new UsageError(`--bandwidth must be below a quarter of the sample rate (${fsHz / 4} Hz).`);
  const x = scaled(rec.samples[0], calibrationFactor(o));
  const n = x.length;
  const rpm = rpmAtTimes(curve, Float64Array.from({ length: n }, (_, i) => i / fsHz));
  const needsCarrier = list.some((c) => c.kind === 'family');
  const carrier = needsCarrier ? await carrierAndPoles(x, fsHz, (times) => rpmAtTimes(curve, times), o) : null;
  const freqs = list.map((c) => {
    const f = new Float64Array(n);
    if (c.kind === 'order') for (let i = 0; i < n; i++) f[i] = (c.order * rpm[i]) / 60;
    else for (let i = 0; i < n; i++) f[i] = Math.max(0, c.m * carrier!.carrier(i) + (c.n * carrier!.polePairs * rpm[i]) / 60);
    return f;
  });
  const vk = voldKalman(x, fsHz, freqs, { bandwidthHz });
  const signals = list.map((_, k) => vk.signal(k));
  let channels: Float32Array[] = signals;
  if (o.has('remove')) {
    const rest = Float32Array.from(x);
    for (const s of signals) for (let i = 0; i < n; i++) rest[i] -= s[i];
    channels = [rest];
  }
  writeFileSync(out, writeWav(channels, { sampleRateHz: fsHz, bits: 32, float: true }));

  // each component's RMS (√2·|x|, x the envelope) per frame, against time and speed
  const frame = Math.max(1, Math.round(REPORT_FRAME_S * fsHz));
  const reported = list.map((c, k) => {
    const t: (number | null)[] = [];
    const r: (number | null)[] = [];
    const rms: (number | null)[] = [];
    for (let a = 0; a + frame <= n; a += frame) {
      let s = 0;
      for (let i = a; i < a + frame; i++) s += Math.hypot(vk.re[k][i], vk.im[k][i]);
      const mid = a + (frame >> 1);
      t.push(round(mid / fsHz));
      r.push(round(rpm[mid]));
      rms.push(round((Math.SQRT2 * s) / frame));
    }
    return { ...c, t, rpm: r, rms };
  });
  return { bandwidthHz, ...(carrier ? { polePairs: carrier.polePairs } : {}), components: reported, out };
}
