/** Time-varying loudness of ISO 532-1:2017 clause 6 and the filter bank under it, on sampled Pa signals. */
import { describe, expect, it } from 'vitest';
import { timeVaryingLoudness } from '../../../workers/dsp/loudness';
import { exceededLevel } from '../../../workers/dsp/loudness/time-varying';
import { filterSections } from '../../../workers/dsp/biquad';
import { butterworthBandPass } from '../../../workers/dsp/loudness/third-octave-filter-bank';
import { thirdOctaveBand } from '../../../workers/dsp/third-octave';

const FS = 48000;
const amplitudeOf = (levelDb: number) => Math.SQRT2 * 20e-6 * 10 ** (levelDb / 20);

function toneBurst(hz: number, levelDb: number, onS: number, totalS: number, fs = FS): Float64Array {
  const a = amplitudeOf(levelDb);
  const on = Math.round(onS * fs);
  return Float64Array.from({ length: Math.round(totalS * fs) }, (_, i) => (i < on ? a * Math.sin((2 * Math.PI * hz * i) / fs) : 0));
}

/** Steady-state gain (dB) of the sections for a sine at hz: RMS out over RMS in, after 0.5 s. */
function gainDb(hz: number, sections: ReturnType<typeof butterworthBandPass>, fs = FS): number {
  const x = Float64Array.from({ length: fs }, (_, i) => Math.sin((2 * Math.PI * hz * i) / fs));
  const y = filterSections(x, sections);
  let sx = 0;
  let sy = 0;
  for (let i = fs / 2; i < fs; i++) {
    sx += x[i] * x[i];
    sy += y[i] * y[i];
  }
  return 10 * Math.log10(sy / sx);
}

describe('loudness filter bank', () => {
  const band = thirdOctaveBand(0);
  const sections = butterworthBandPass(band.lowerHz, band.upperHz, FS);

  it('passes the 1 kHz band centre at 0 dB and its edges at −3 dB (Butterworth definition; IEC 61260-1 band edges)', () => {
    expect(gainDb(1000, sections)).toBeCloseTo(0, 1);
    expect(gainDb(band.lowerHz, sections)).toBeCloseTo(-3.01, 1);
    expect(gainDb(band.upperHz, sections)).toBeCloseTo(-3.01, 1);
  });

  it('follows the 6th-order Butterworth band-pass magnitude −10·lg(1 + ((ω² − ω0²)/(ω·B))⁶) at the pre-warped frequency ω = 2fs·tan(πf/fs) (Oppenheim & Schafer §7.1)', () => {
    const warp = (f: number) => 2 * FS * Math.tan((Math.PI * f) / FS);
    const w1 = warp(band.lowerHz);
    const w2 = warp(band.upperHz);
    const expected = (f: number) => {
      const w = warp(f);
      return -10 * Math.log10(1 + ((w * w - w1 * w2) / (w * (w2 - w1))) ** 6);
    };
    for (const f of [500, 800, 1200, 2000]) expect(gainDb(f, sections)).toBeCloseTo(expected(f), 1);
    // about 49 dB down an octave away
    expect(gainDb(2000, sections)).toBeLessThan(-45);
  });

  it('refuses a band reaching half the sample rate', () => {
    expect(() => butterworthBandPass(11000, 14000, 24000)).toThrow(/half the sample rate/);
  });
});

describe('timeVaryingLoudness', () => {
  it('gives N5 equal to the stationary loudness for a steady 1 kHz tone at 60 dB, within 5 % (ISO 532-1:2017 clause 6: for stationary sounds both methods agree)', () => {
    const r = timeVaryingLoudness(toneBurst(1000, 60, 3, 3), FS, 'free');
    expect(Math.abs(r.n5Sone / r.stationarySone - 1)).toBeLessThan(0.05);
    expect(r.maxSone).toBeGreaterThanOrEqual(r.n5Sone);
    expect(r.t.length).toBe(r.sone.length);
  });

  it('rises during a 500 ms tone burst and decays after it, to under 10 % within 300 ms (Zwicker & Fastl 2007 ch. 8: decay within some 100 ms)', () => {
    const r = timeVaryingLoudness(toneBurst(1000, 70, 0.5, 1.2), FS, 'free');
    const at = (s: number) => r.sone[r.t.findIndex((t) => t >= s)];
    const steady = at(0.45);
    expect(at(0.01)).toBeLessThan(steady);
    expect(Math.abs(at(0.3) / steady - 1)).toBeLessThan(0.05);
    for (let s = 0.52; s < 0.8; s += 0.02) expect(at(s + 0.02)).toBeLessThanOrEqual(at(s) + 1e-9);
    expect(at(0.8)).toBeLessThan(0.1 * steady);
  });

  it('reads a 10 ms burst softer than a 500 ms one of the same level (temporal integration, Zwicker & Fastl 2007 ch. 8)', () => {
    const short = timeVaryingLoudness(toneBurst(1000, 70, 0.01, 0.6), FS, 'free');
    const long = timeVaryingLoudness(toneBurst(1000, 70, 0.5, 0.6), FS, 'free');
    expect(short.maxSone).toBeLessThan(0.8 * long.maxSone);
  });

  it('works at 51.2 kHz and returns at most 2000 points for 20 s', () => {
    const fs = 51200;
    const r = timeVaryingLoudness(toneBurst(1000, 60, 20, 20, fs), fs, 'free');
    expect(r.sone.length).toBeLessThanOrEqual(2000);
    expect(r.t[r.t.length - 1]).toBeGreaterThan(19.9);
    expect(Math.abs(r.n5Sone / r.stationarySone - 1)).toBeLessThan(0.05);
  }, 30000);

  it('says what is wrong with a too short signal', () => {
    expect(() => timeVaryingLoudness(new Float64Array(100), FS, 'free')).toThrow(/less than 10 ms/);
  });
});

describe('exceededLevel', () => {
  it('gives the value exceeded 5 % of the time: the 95th percentile, linear between ranks (ISO 532-1:2017 clause 6, N5)', () => {
    const v = Float64Array.from({ length: 101 }, (_, i) => 100 - i);
    expect(exceededLevel(v, 0.05)).toBeCloseTo(95, 9);
  });
});
