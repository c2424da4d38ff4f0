import { describe, expect, it } from 'vitest';
import { framesInSpeedRange, mapAgainstSpeed } from '../../../workers/dsp/speed-map';
import { stftLayout } from '../../../workers/dsp/stft';

describe('map against speed', () => {
  const layout = stftLayout(256 + 9 * 128, 1000, { blockSize: 256, overlap: 0.5, window: 'hann' }); // 10 frames, 129 bins
  const power = new Float32Array(layout.frames * layout.bins).map((_, i) => Math.floor(i / layout.bins) + 1); // frame f holds f+1

  it('averages linear power of the frames in each rpm bin (mean), ascending for a run-up', () => {
    const rpm = Float64Array.from([1000, 1010, 1030, 1060, 1080, 1110, 1130, 1160, 1190, 1210]);
    const m = mapAgainstSpeed(power, layout, rpm, { rpmStep: 50 });
    expect([...m.rpm]).toEqual([1025, 1075, 1125, 1175, 1225]);
    expect([...m.counts]).toEqual([3, 2, 2, 2, 1]);
    expect(m.power[0]).toBeCloseTo((1 + 2 + 3) / 3, 6);
    expect(m.power[1 * m.bins]).toBeCloseTo((4 + 5) / 2, 6);
  });

  it('handles a coast-down on the same ascending grid, with max per bin and empty bins as NaN', () => {
    const rpm = Float64Array.from([1290, 1270, 1240, 1230, 1210, 1100, 1090, 1060, 1040, 1010]);
    const m = mapAgainstSpeed(power, layout, rpm, { rpmStep: 50, mode: 'max' });
    expect([...m.rpm]).toEqual([1025, 1075, 1125, 1175, 1225, 1275]);
    expect([...m.counts]).toEqual([2, 2, 1, 0, 3, 2]);
    expect(m.power[0]).toBe(10);
    expect(Number.isNaN(m.power[3 * m.bins])).toBe(true);
    expect(framesInSpeedRange(rpm, 1050, 1100)).toEqual([5, 6, 7]);
  });
});

describe('averaged spectrum over a speed range', () => {
  it('is the linear mean of the frames in the range (Welch 1967: averaged periodograms)', async () => {
    const { averageFrameList } = await import('../../../workers/dsp/stft');
    const bins = 3;
    const map = Float32Array.from([1, 2, 3, 10, 20, 30, 100, 200, 300]);
    expect([...averageFrameList(map, bins, [0, 2])]).toEqual([50.5, 101, 151.5]);
  });
});
