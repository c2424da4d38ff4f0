/** `map FILE --channel I --out PATH.npy`: the map as float32 [frames, bins], RMS amplitude in dB re 1 unit. */
import { closeSync, openSync, writeSync } from 'node:fs';
import path from 'node:path';
import { checkChannels, readRecordingHeader } from '../../../workers/io/decode-recording';
import type { RecordingHeader } from '../../../workers/io/recording';
import { stftLayout } from '../../../workers/dsp/stft';
import { windowNames } from '../../../workers/dsp/window';
import { openFileSource } from '../node-file-source';
import { npyHeader } from '../npy';
import type { Options } from '../options';
import { UsageError } from '../options';
import { calibrationFactor, channelIndex, readChannels, reportWarnings, scaled } from '../recording-input';
import { MapThreadPool } from '../thread-pool';

async function header(file: string): Promise<RecordingHeader> {
  const source = await openFileSource(file);
  try {
    return await readRecordingHeader(source);
  } finally {
    await source.close();
  }
}

export async function mapCommand(file: string, o: Options) {
  const channel = channelIndex(o);
  const cal = calibrationFactor(o);
  const out = o.string('out');
  if (!out.endsWith('.npy')) throw new UsageError(`--out must name a .npy file, not "${out}".`);
  const settings = {
    window: o.choice('window', windowNames, 'hann'),
    blockSize: o.integer('block', 8192, 256),
    overlap: o.number('overlap', 0.75, (f) => (f >= 0 && f <= 0.95 ? null : 'must be from 0 to 0.95.')),
  };
  // The threads start (and load their WebAssembly) while this thread reads the header.
  const pool = new MapThreadPool();
  try {
    const h = await header(file);
    // A WAV's samples are read by the threads, each the frames it computes; other formats decode here.
    const wav = h.format === 'wav' && h.wav ? h.wav : null;
    if (wav) {
      checkChannels(h.fileName, h, [channel]);
      reportWarnings(h.fileName, h.warnings);
    }
    const rec = wav ? null : await readChannels(file, [channel]);
    const fsHz = h.sampleRateHz;
    const frames = rec ? rec.samples[0].length : h.frames;
    const layout = stftLayout(frames, fsHz, settings);
    if (layout.frames === 0) throw new UsageError(`${h.fileName} is shorter than one block of ${settings.blockSize} samples.`);
    const head = npyHeader([layout.frames, layout.bins]);
    const outFd = openSync(path.resolve(process.env.INIT_CWD ?? process.cwd(), out), 'w');
    const inFd = wav ? openSync(file, 'r') : -1;
    try {
      writeSync(outFd, head);
      // The threads write their rows, as levels in dB, straight into the file after the header.
      const npy = { fd: outFd, offset: head.length };
      if (wav) {
        await pool.mapToFile({ wav: { fd: inFd, fileName: h.fileName, layout: wav, channelCount: h.channels.length, channel, cal }, frames }, fsHz, settings, npy);
      } else await pool.mapToFile({ x: scaled(rec!.samples[0], cal) }, fsHz, settings, npy);
    } finally {
      closeSync(outFd);
      if (inFd >= 0) closeSync(inFd);
    }
    return { frames: layout.frames, bins: layout.bins, hopS: layout.hopS, binHz: layout.binHz };
  } finally {
    await pool.close();
  }
}
