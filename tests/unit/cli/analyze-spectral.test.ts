/** The spectral batch commands as a user runs them (`npm run -s analyze -- …`), on files made here. */
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { wav } from '../io/wav-fixtures';
import { analyzeCli } from '../../support/run-analyze';

const dir = mkdtempSync(path.join(tmpdir(), 'fanlight-cli-spectral-'));
const FS = 51200;

const analyze = analyzeCli;

// Channel 0: a 1 kHz sine of amplitude 0.5 full scale. Channel 1: a 60-pulse tacho at a steady 1500 rpm.
const seconds = 4;
const n = FS * seconds;
const tone = Float32Array.from({ length: n }, (_, i) => 0.5 * Math.sin((2 * Math.PI * 1000 * i) / FS));
const tacho = Float32Array.from({ length: n }, (_, i) => Math.tanh(4 * Math.sin((2 * Math.PI * 60 * 25 * i) / FS)) * 0.8);
const file = path.join(dir, 'tone.wav');
writeFileSync(file, wav([tone, tacho], { bits: 32, float: true, sampleRateHz: FS }));

describe('analyze: spectrum, levels, speed, map', () => {
  it('spectrum: a sine reads A/√2 RMS and A peak at its bin (Harris 1978: coherent gain applied), in calibrated units', async () => {
    const rms = await analyze('spectrum', file, '--channel', '0', '--block', '8192', '--scale', 'rms', '--window', 'flattop', '--cal', '9.80665');
    expect(rms.code).toBe(0);
    expect(rms.json).toMatchObject({ scale: 'rms', window: 'flattop', binHz: 6.25 });
    const k = rms.json.freqHz.indexOf(1000);
    expect(rms.json.values[k]).toBeCloseTo((0.5 * 9.80665) / Math.SQRT2, 3);
    const peak = await analyze('spectrum', file, '--channel', '0', '--scale', 'peak', '--from', '1', '--to', '3');
    expect(peak.json.values[k]).toBeCloseTo(0.5, 4);
  });

  it('spectrum: PSD of the tone integrates to its mean square (Parseval)', async () => {
    const psd = await analyze('spectrum', file, '--channel', '0', '--scale', 'psd');
    const total = psd.json.values.reduce((s: number, v: number) => s + v * psd.json.binHz, 0);
    expect(total).toBeCloseTo(0.125, 3);
  });

  it('levels: a 1 kHz tone of 0.5 reads 10·lg(0.125) in the 1 kHz band and overall; A-weighting is 0 dB there (IEC 61672-1)', async () => {
    const z = await analyze('levels', file, '--channel', '0');
    const a = await analyze('levels', file, '--channel', '0', '--weighting', 'A', '--ref', '2e-5');
    const expected = 10 * Math.log10(0.125);
    expect(z.json.overallDb).toBeCloseTo(expected, 1);
    const band = z.json.bands.find((b: { nominalHz: number }) => b.nominalHz === 1000);
    expect(band.db).toBeCloseTo(expected, 1);
    expect(band.centerHz).toBe(1000);
    expect(z.json.bands.map((b: { nominalHz: number }) => b.nominalHz).slice(0, 4)).toEqual([20, 25, 31.5, 40]);
    // re 20 µPa: +93.98 dB (ISO 1683 reference)
    expect(a.json.overallDb).toBeCloseTo(expected + 93.98, 1);
    expect(a.json.weighting).toBe('A');
    // 51.2 kHz reaches every band up to 20 kHz (upper edge 22.4 kHz, IEC 61260-1)
    expect(z.json.bands.some((b: { beyondSpectrum?: boolean }) => b.beyondSpectrum)).toBe(false);
  });

  it('levels: bands reaching above half the sample rate are null and say they are beyond the spectrum', async () => {
    // 16 kHz sampling: Nyquist 8 kHz lies inside the 8 kHz band (7.08–8.91 kHz edges, IEC 61260-1), so
    // that band and those above it are beyond the spectrum
    const fs = 16000;
    const low = path.join(dir, 'low-rate.wav');
    writeFileSync(low, wav([Float32Array.from({ length: fs * 2 }, (_, i) => 0.5 * Math.sin((2 * Math.PI * 1000 * i) / fs))], { bits: 32, float: true, sampleRateHz: fs }));
    const r = await analyze('levels', low, '--channel', '0');
    const beyond = r.json.bands.filter((b: { beyondSpectrum?: boolean }) => b.beyondSpectrum).map((b: { nominalHz: number }) => b.nominalHz);
    expect(beyond).toEqual([8000, 10000, 12500, 16000, 20000]);
    for (const b of r.json.bands.filter((x: { beyondSpectrum?: boolean }) => x.beyondSpectrum)) expect(b.db).toBeNull();
    expect(r.json.bands.find((b: { nominalHz: number }) => b.nominalHz === 1000).db).toBeCloseTo(10 * Math.log10(0.125), 1);
  });

  it('speed: a 60-pulse tacho at 1500 rpm reads 1500 rpm (pulse rate = ppr·rpm/60)', async () => {
    const r = await analyze('speed', file, '--tacho', '1', '--ppr', '60');
    expect(r.code).toBe(0);
    expect(r.json.t.length).toBe(r.json.rpm.length);
    for (const v of r.json.rpm) expect(Math.abs(v - 1500) / 1500).toBeLessThan(1e-3);
  });

  it('map: writes a .npy that numpy can read (NEP 1 header), float32 [frames, bins] in dB', async () => {
    const out = path.join(dir, 'map.npy');
    const r = await analyze('map', file, '--channel', '0', '--block', '4096', '--overlap', '0.5', '--out', out);
    expect(r.json).toEqual({ frames: 1 + Math.floor((n - 4096) / 2048), bins: 2049, hopS: 2048 / FS, binHz: FS / 4096 });
    const bytes = readFileSync(out);
    expect(bytes.subarray(0, 6).toString('latin1')).toBe('\x93NUMPY');
    const headerLength = bytes.readUInt16LE(8);
    const header = bytes.subarray(10, 10 + headerLength).toString('latin1');
    expect((10 + headerLength) % 64).toBe(0);
    expect(header).toMatch(/'descr': '<f4', 'fortran_order': False, 'shape': \(\d+, 2049\)/);
    const data = new Float32Array(bytes.buffer.slice(bytes.byteOffset + 10 + headerLength));
    expect(data.length).toBe(r.json.frames * 2049);
    // frame 3, bin of 1 kHz (1000 / 12.5 = 80): RMS 0.5/√2 → 20·lg(0.3536) = −9.03 dB
    expect(data[3 * 2049 + 80]).toBeCloseTo(20 * Math.log10(0.5 / Math.SQRT2), 1);
  });

  it('bad options exit 2 with one sentence', async () => {
    const r = await analyze('spectrum', file, '--channel', '0', '--window', 'kaiser');
    expect(r.code).toBe(2);
    expect(r.stderr.trim()).toBe('--window must be one of rect, hann, hamming, blackman-harris, flattop, not "kaiser".');
    const s = await analyze('speed', file, '--tacho', '0', '--ppr', '60', '--speed-channel', '1');
    expect(s.code).toBe(2);
    expect(s.stderr.trim()).toMatch(/either --tacho I --ppr N or --speed-channel I/);
  });
});
