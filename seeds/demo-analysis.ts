/**
 * A demo recording read as the engine reads it, for the seeded views: one channel calibrated as the demo's
 * channel list says, the speed from the 60-pulse tacho, and the channel's map with its frames' speeds.
 */
import path from 'node:path';
import { openFileSource } from '../server/cli/node-file-source';
import { createRealFft } from '../workers/dsp/fft';
import { rpmAtTimes, speedFromTacho } from '../workers/dsp/speed';
import { computeFrames, frameTimeS, stftLayout, type StftLayout, type StftSettings } from '../workers/dsp/stft';
import { makeWindow } from '../workers/dsp/window';
import { decodeRecording, readRecordingHeader } from '../workers/io/decode-recording';
import { fingerprint } from '../workers/io/fingerprint';
import { demoRecordings } from './demo-recordings';

/** The demo tacho's pulses per revolution (seeds/demo-recordings.ts). */
export const DEMO_TACHO_PPR = 60;

export async function describeFile(file: string): Promise<{ fingerprint: string; sampleRateHz: number; durationS: number }> {
  const source = await openFileSource(file);
  try {
    const header = await readRecordingHeader(source);
    return { fingerprint: await fingerprint(source), sampleRateHz: header.sampleRateHz, durationS: header.durationS };
  } finally {
    await source.close();
  }
}

export interface DemoChannelMap {
  /** The channel in its unit (the demo channel's factor applied) */
  samples: Float32Array;
  layout: StftLayout;
  /** Mean squares, frames × bins */
  power: Float32Array;
  enbwBins: number;
  frameRpm: Float64Array;
}

/** The map of one channel of a demo recording, with the speed of each frame from its tacho. */
export async function demoChannelMap(demoDir: string, file: string, channel: number, settings: StftSettings): Promise<DemoChannelMap> {
  const recording = demoRecordings.find((r) => r.file === file);
  if (!recording) throw new Error(`${file} is not a demo recording.`);
  const tacho = recording.channels.findIndex((c) => c.quantity === 'tacho');
  const source = await openFileSource(path.join(demoDir, file));
  let rec;
  try {
    rec = await decodeRecording(source, { channels: [channel, tacho] });
  } finally {
    await source.close();
  }
  const fs = rec.header.sampleRateHz;
  const x = rec.samples[0];
  const factor = recording.channels[channel].factor;
  for (let i = 0; i < x.length; i++) x[i] *= factor;
  const speed = speedFromTacho(rec.samples[1], fs, DEMO_TACHO_PPR);
  const layout = stftLayout(x.length, fs, settings);
  const window = makeWindow(settings.window, layout.blockSize);
  const power = new Float32Array(layout.frames * layout.bins);
  computeFrames(x, 0, layout, window, await createRealFft(layout.blockSize), 0, layout.frames, power);
  const times = Float64Array.from({ length: layout.frames }, (_, f) => frameTimeS(layout, f));
  return { samples: x, layout, power, enbwBins: window.enbwBins, frameRpm: rpmAtTimes(speed, times) };
}
