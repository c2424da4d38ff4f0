/**
 * What plays on the Bench: a calibrated sound-pressure channel at the stated level (1 Pa RMS is
 * 94 dB SPL re 20 µPa: ISO 1683:2015, reference values for acoustical levels; 20·log10(1/0.00002) =
 * 93.98 dB), any other channel normalised to its peak, and the processed twin through the listening
 * code on this thread (no worker in Node) matching the block filter it calls.
 */
import { describe, expect, it } from 'vitest';
import { levelStatement, runSource, FULL_SCALE_PA } from '../../../src/features/bench/listen/playback-source';
import type { PublishedRun } from '../../../src/features/bench/workspace/workspace';
import { stftLayout } from '../../../workers/dsp/stft';
import type { ChannelSetup } from '../../../workers/io/channel-setup';

const FS = 8000;
const N = FS * 2;

function run(setup: ChannelSetup[], samples: Float32Array[], selected: unknown[] = []): PublishedRun {
  const layout = stftLayout(N, FS, { blockSize: 1024, overlap: 0.5, window: 'hann' });
  const state = {
    recording: { decoded: { header: { sampleRateHz: FS }, samples, channelIndices: setup.map((c) => c.index) } },
    settings: { channel: 0 },
    setup,
    selected,
    map: { layout },
    speed: { kind: 'none' },
  };
  return { id: 'run-a', name: 'run a.wav', baseline: true, state: state as unknown as PublishedRun['state'] };
}

const tone = (amplitude: number, hz: number) => Float32Array.from({ length: N }, (_, i) => amplitude * Math.sin((2 * Math.PI * hz * i) / FS));

describe('the playback source', () => {
  it('plays a Pa channel calibrated: full scale is 20 Pa, so 1 Pa is −26 dBFS before the gain', () => {
    // 0.25 file units × 4 Pa per unit = 1 Pa amplitude
    const mic: ChannelSetup = { index: 0, name: 'mic', quantity: 'sound-pressure', unit: 'Pa', calibration: { kind: 'scale', factor: 4 } };
    const src = runSource(run([mic], [tone(0.25, 440)]), { channel: null, processing: 'off', bandwidthHz: 10 })!;
    const played = src.original(0, N);
    const peak = played.reduce((m, v) => Math.max(m, Math.abs(v)), 0);
    expect(peak).toBeCloseTo(1 / FULL_SCALE_PA, 4);
    expect(20 * Math.log10(1 / FULL_SCALE_PA)).toBeCloseTo(-26.02, 2);
    expect(levelStatement(src, -20)).toBe('1 Pa (94 dB SPL) plays at −46 dBFS');
    expect(src.processed).toBeNull();
  });

  it('plays any other channel normalised to its peak', () => {
    const acc: ChannelSetup = { index: 0, name: 'acc', quantity: 'acceleration', unit: 'g', calibration: { kind: 'scale', factor: 10 } };
    const src = runSource(run([acc], [tone(0.3, 440)]), { channel: null, processing: 'off', bandwidthHz: 10 })!;
    const played = src.original(0, N);
    expect(played.reduce((m, v) => Math.max(m, Math.abs(v)), 0)).toBeCloseTo(1, 3);
    expect(levelStatement(src, -20)).toBe("The channel's peak plays at −20 dBFS");
  });

  it('takes a ticked order out of the played sound and keeps the rest (on this thread without a worker)', async () => {
    // two steady tones: order 6 at 1000 rpm is 100 Hz; the other at 1000 Hz stays
    const acc: ChannelSetup = { index: 0, name: 'acc', quantity: 'acceleration', unit: 'g', calibration: { kind: 'scale', factor: 1 } };
    const x = tone(0.5, 100).map((v, i) => v + 0.25 * Math.sin((2 * Math.PI * 1000 * i) / FS));
    const layout = stftLayout(N, FS, { blockSize: 1024, overlap: 0.5, window: 'hann' });
    const line = { id: 'o6', guide: { kind: 'order', order: 6 }, ctx: { rpm: new Float64Array(layout.frames).fill(1000) } };
    const src = runSource(run([acc], [x], [line]), { channel: null, processing: 'remove', bandwidthHz: 10 })!;
    expect(src.lineCount).toBe(1);
    const from = FS / 2;
    const to = from + FS / 2;
    const out = await src.processed!(from, to);
    const original = src.original(from, to);
    // the 1000 Hz tone remains: the residual equals the original less the 100 Hz tone (scaled alike)
    const scale = src.playScale;
    let err = 0;
    let ref = 0;
    for (let i = 0; i < out.length; i++) {
      const kept = 0.25 * Math.sin((2 * Math.PI * 1000 * (from + i)) / FS) * scale;
      err += (out[i] - kept) ** 2;
      ref += kept ** 2;
    }
    expect(10 * Math.log10(err / ref)).toBeLessThan(-30);
    expect(original.length).toBe(out.length);
  });
});
