/**
 * MAT (level 5 and v7.3), HDF5 and UFF 58/58b recordings, read from the fixtures that
 * tests/fixtures/acquisition/make_fixtures.py writes: 4096 samples at 8192 Hz ("acc": 100 Hz at 2.5 and
 * 250 Hz at 0.75, "ramp": -1000 … 3095) and, for UFF, 1024 samples at 51200 Hz.
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { PROJECT_ROOT } from '../../../server/config';
import { memorySource } from '../../../workers/io/byte-source';
import { decodeRecording, readRecordingHeader, sniffFormat } from '../../../workers/io/decode-recording';
import { readMat5 } from '../../../workers/io/mat-reader';
import type { DecodedRecording } from '../../../workers/io/recording';
import { RecordingError } from '../../../workers/io/recording-error';
import { rateFromIncrement } from '../../../workers/io/uff-reader';

const DIR = path.join(PROJECT_ROOT, 'tests/fixtures/acquisition');
const bytes = (file: string) => new Uint8Array(readFileSync(path.join(DIR, file)));
const source = (file: string, name = file) => memorySource(bytes(file), name);
const decode = (file: string, channels?: number[]) => decodeRecording(source(file), { channels });

const FS = 8192;
const sine = (f: number, a: number, fs = FS) => (i: number) => a * Math.sin((2 * Math.PI * f * i) / fs);

/** Every sample within `tol` (absolute, plus `rel` of the value) of the expected signal. */
function expectSignal(x: Float32Array, expected: (i: number) => number, tol = 1e-6, rel = 0) {
  let worst = 0;
  let at = -1;
  for (let i = 0; i < x.length; i++) {
    const e = expected(i);
    const err = Math.abs(x[i] - e) - rel * Math.abs(e);
    if (err > worst) {
      worst = err;
      at = i;
    }
  }
  expect(worst, `sample ${at}: ${x[at]} vs ${expected(at)}`).toBeLessThanOrEqual(tol);
}

async function failure(p: Promise<unknown>): Promise<RecordingError> {
  try {
    await p;
  } catch (e) {
    expect(e).toBeInstanceOf(RecordingError);
    return e as RecordingError;
  }
  throw new Error('expected a RecordingError');
}

function expectDrive(r: DecodedRecording) {
  expect(r.header.sampleRateHz).toBe(FS);
  expect(r.header.frames).toBe(4096);
  expect(r.header.durationS).toBe(0.5);
  expectSignal(r.samples[0], sine(100, 2.5), 2e-7); // float32 of a double
  expectSignal(r.samples[1], sine(250, 0.75), 1e-7);
  expect(Array.from(r.samples[2])).toEqual(Array.from({ length: 4096 }, (_, i) => i - 1000));
}

describe('MAT-file level 5', () => {
  it('reads a matrix as channels in columns, an int16 row vector, and the rate from a scalar fs', async () => {
    const r = await decode('drive_v5.mat');
    expect(r.header.format).toBe('mat');
    expect(r.header.channels).toEqual([
      { index: 0, name: 'acc 1', unit: null },
      { index: 1, name: 'acc 2', unit: null },
      { index: 2, name: 'ramp', unit: null },
    ]);
    expect(r.header.warnings).toEqual([]);
    expectDrive(r);
    expect(r.nonFinite).toEqual([]);
  });

  it('reads compressed variables of every numeric class, with the rate from a time vector t (not a channel)', async () => {
    const r = await decode('drive_v5_compressed.mat');
    expect(r.header.channels.map((c) => c.name)).toEqual(['acc_housing', 'acc_shaft', 'ramp_i32', 'ramp_u16', 'ramp_i8', 'ramp_u32', 'ramp_u8']);
    expect(r.header.sampleRateHz).toBeCloseTo(FS, 6);
    expect(r.header.warnings).toEqual(['Not read as channels: note (text).', expect.stringMatching(/8192\.00 Hz, comes from the time vector t/)]);
    expectSignal(r.samples[0], sine(100, 2.5), 4e-7); // stored as single
    expectSignal(r.samples[1], sine(250, 0.75), 1e-7);
    const n = 4096;
    expect(Array.from(r.samples[2])).toEqual(Array.from({ length: n }, (_, i) => i - 1000));
    expect(Array.from(r.samples[3])).toEqual(Array.from({ length: n }, (_, i) => i));
    expect(Array.from(r.samples[4])).toEqual(Array.from({ length: n }, (_, i) => (i % 200) - 100));
    expect(Array.from(r.samples[5])).toEqual(Array.from({ length: n }, (_, i) => i));
    expect(Array.from(r.samples[6])).toEqual(Array.from({ length: n }, (_, i) => i % 256));
  });

  it('decodes only the channels asked for, into shared memory when asked', async () => {
    const r = await decodeRecording(source('drive_v5.mat'), { channels: [2, 0], shared: true });
    expect(r.channelIndices).toEqual([2, 0]);
    expect(r.samples).toHaveLength(2);
    expect(r.samples[0][0]).toBe(-1000);
    expect(r.samples[1].buffer).toBeInstanceOf(SharedArrayBuffer);
    const bad = await failure(decodeRecording(source('drive_v5.mat'), { channels: [3] }));
    expect(bad.message).toBe('drive_v5.mat has 3 channels; there is no channel 4.');
  });

  it('says clearly what is wrong with a broken file', async () => {
    const noRate = await failure(decode('no_rate.mat'));
    expect(noRate.code).toBe('NO_SAMPLE_RATE');
    expect(noRate.message).toBe('no_rate.mat has no sample rate: add a scalar fs (or Fs, sampleRate, sample_rate, sr) in Hz, or a time vector t in seconds.');
    const unequal = await failure(decode('unequal.mat'));
    expect(unequal.code).toBe('UNEQUAL_LENGTHS');
    expect(unequal.message).toBe('unequal.mat: the channels differ in length (acc has 4096 samples, mic 1000); all must have the same length.');
    const text = await failure(decode('text_only.mat'));
    expect(text.code).toBe('NOT_NUMERIC');
    expect(text.message).toMatch(/^text_only\.mat has no numeric data/);
    const cut = await failure(decode('truncated.mat'));
    expect(cut.code).toBe('TRUNCATED_FILE');
    expect(cut.message).toMatch(/^truncated\.mat is cut short: the variable at byte \d+ needs \d+ bytes/);
  });

  it('refuses a matrix with channels in rows, naming the fix', async () => {
    // a hand-made level 5 file: header, then one miMATRIX "acc" of class double, 2×3
    const le = (words: number[]) => new Uint8Array(new Uint32Array(words).buffer);
    const header = new Uint8Array(128);
    header.set(new TextEncoder().encode('MATLAB 5.0 MAT-file, written by a test'.padEnd(116)));
    header.set([0x00, 0x01, 0x49, 0x4d], 124); // version 0x0100, "IM": little endian
    const body = [
      le([6, 8, 6, 0]), // array flags: mxDOUBLE_CLASS
      le([5, 8, 2, 3]), // dimensions 2×3
      le([(3 << 16) | 1]), new Uint8Array([0x61, 0x63, 0x63, 0]), // small element: name "acc"
      le([9, 48]), new Uint8Array(new Float64Array([1, 2, 3, 4, 5, 6]).buffer),
    ];
    const size = body.reduce((n, b) => n + b.byteLength, 0);
    const file = new Uint8Array(128 + 8 + size);
    file.set(header);
    file.set(le([14, size]), 128);
    let at = 136;
    for (const b of body) {
      file.set(b, at);
      at += b.byteLength;
    }
    const e = await failure(decodeRecording(memorySource(file, 'rows.mat')));
    expect(e.message).toBe('rows.mat: the matrix acc is 2×3, more channels than samples; channels go in columns (3×2): transpose it.');
  });

  it('refuses a damaged compressed variable and a MAT-file of another level', async () => {
    const whole = bytes('drive_v5_compressed.mat');
    const damaged = whole.slice();
    for (let i = 300; i < 340; i++) damaged[i] ^= 0xa5;
    const e = await failure(decodeRecording(memorySource(damaged, 'damaged.mat')));
    expect(e.code).toBe('BAD_STRUCTURE');
    expect(e.message).toMatch(/^damaged\.mat: the compressed variable at byte 128 cannot be inflated/);
    const level4 = new Uint8Array(200);
    const other = await failure(readMat5(memorySource(level4, 'old.mat')));
    expect(other.message).toMatch(/^old\.mat is not a MAT-file of level 5 or v7\.3/);
  });
});

describe('MAT-file v7.3 and HDF5', () => {
  it('reads a v7.3 MAT-file by the level 5 rules (a matrix in columns, fs)', async () => {
    expect(await sniffFormat(source('drive_v73.mat'))).toBe('mat');
    const r = await decode('drive_v73.mat');
    expect(r.header.format).toBe('mat');
    expect(r.header.channels.map((c) => c.name)).toEqual(['acc 1', 'acc 2', 'ramp']);
    expect(r.header.warnings).toEqual(['Not read as channels: unused (empty).']);
    expectDrive(r);
  });

  it('reads 1-D datasets as channels with their paths, units and the root attribute sample_rate', async () => {
    const r = await decode('drive.h5');
    expect(r.header.format).toBe('hdf5');
    expect(r.header.channels).toEqual([
      { index: 0, name: 'acc housing', unit: 'm/s^2' },
      { index: 1, name: 'acc shaft', unit: 'm/s^2' },
      { index: 2, name: 'drive/ramp', unit: null },
    ]);
    expect(r.header.warnings).toEqual(['Not read as channels: comment (not numeric).']);
    expectDrive(r);
  });

  it('takes the rate from a scalar dataset fs and finds HDF5 by its signature whatever the name', async () => {
    const r = await decodeRecording(source('drive_fs.hdf5', 'export.bin'));
    expect(r.header.format).toBe('hdf5');
    expect(r.header.channels).toEqual([{ index: 0, name: 'mic', unit: 'Pa' }]);
    expect(r.header.sampleRateHz).toBe(FS);
    expectSignal(r.samples[0], sine(250, 0.75), 1e-7);
    const header = await readRecordingHeader(source('drive_fs.hdf5'));
    expect(header.frames).toBe(4096);
  });

  it('says clearly what is wrong with a broken file', async () => {
    const noRate = await failure(decode('no_rate.h5'));
    expect(noRate.code).toBe('NO_SAMPLE_RATE');
    expect(noRate.message).toMatch(/^no_rate\.h5 has no sample rate: add a root attribute or a scalar dataset sample_rate/);
    const unequal = await failure(decode('unequal.h5'));
    expect(unequal.message).toBe('unequal.h5: the channels differ in length (acc has 4096 samples, mic 1000); all must have the same length.');
    const cut = await failure(decode('truncated.h5'));
    expect(cut.code).toBe('TRUNCATED_FILE');
    expect(cut.message).toBe('truncated.h5 is cut short: its HDF5 superblock says 73744 bytes but the file has 36872.');
    const damaged = bytes('drive.h5');
    damaged.fill(0x5a, 96, 4000);
    const bad = await failure(decodeRecording(memorySource(damaged, 'damaged.h5')));
    expect(bad.code).toBe('BAD_STRUCTURE');
    expect(bad.message).toBe('damaged.h5 cannot be opened as HDF5 (the file is damaged).');
  });
});

describe('UFF dataset 58 and 58b', () => {
  it('takes the round rate a printed increment stands for', () => {
    expect(rateFromIncrement('1.95312E-05')).toBe(51200);
    expect(rateFromIncrement(' 1.95313E-05')).toBe(51200);
    expect(rateFromIncrement('1.22070E-04')).toBe(8192);
    expect(rateFromIncrement('3.90625E-05')).toBe(25600);
    expect(rateFromIncrement('2.08333E-05')).toBe(48000);
    expect(rateFromIncrement('1.00000E-03')).toBe(1000);
    expect(rateFromIncrement('1.23457E-04')).toBe(8100);
    expect(rateFromIncrement('1.953125000000E-05')).toBe(51200);
    expect(rateFromIncrement('1.234567890123E-04')).toBeCloseTo(1 / 1.234567890123e-4, 6); // no round rate that close
  });

  it('reads ASCII time responses (single and double) with names from the ID lines and units from record 9', async () => {
    expect(await sniffFormat(source('drive.uff', 'drive.txt'))).toBe('csv'); // a text name wins …
    expect(await sniffFormat(source('drive.uff', 'export'))).toBe('uff'); // … else the "-1" line
    const r = await decode('drive.uff');
    expect(r.header).toMatchObject({ format: 'uff', sampleRateHz: 51200, frames: 1024, warnings: [] });
    expect(r.header.channels).toEqual([
      { index: 0, name: 'acc housing', unit: 'm/s^2' },
      { index: 1, name: 'mic front', unit: 'Pa' },
      { index: 2, name: 'ramp', unit: null },
    ]);
    expectSignal(r.samples[0], sine(1000, 2.5, 51200), 1e-7, 5e-6); // E13.5: six digits
    expectSignal(r.samples[1], sine(2500, 0.75, 51200), 1e-7); // E20.12, kept as float32
    expect(Array.from(r.samples[2])).toEqual(Array.from({ length: 1024 }, (_, i) => i - 100));
  });

  it('reads binary 58b', async () => {
    const r = await decode('drive_b.unv');
    expect(r.header.channels.map((c) => [c.name, c.unit])).toEqual([['acc housing', 'm/s^2'], ['ramp', null]]);
    expect(r.header.sampleRateHz).toBe(51200);
    expectSignal(r.samples[0], sine(1000, 2.5, 51200), 1e-12, 6e-8); // float32 in the file, read as it is
    expect(r.samples[1][1023]).toBe(923);
  });

  it('says clearly what is wrong with a broken file', async () => {
    const cut = await failure(decode('truncated.uff'));
    expect(cut.code).toBe('TRUNCATED_FILE');
    expect(cut.message).toMatch(/^truncated\.uff is cut short: dataset 58 at line 2 ends after \d+ of its 1024 values\.$/);
    const unequal = await failure(decode('unequal.uff'));
    expect(unequal.message).toBe('unequal.uff: the channels differ in length (acc housing has 1024 samples, ramp 500); all must have the same length.');
    const text = await failure(decode('not_numeric.uff'));
    expect(text.code).toBe('NOT_NUMERIC');
    expect(text.message).toBe('not_numeric.uff, line 14: "banana" in the data of dataset 58 at line 2 is not a number.');
    const binCut = bytes('drive_b.unv').subarray(0, 2000);
    const b = await failure(decodeRecording(memorySource(binCut, 'cut.unv')));
    expect(b.message).toMatch(/^cut\.unv is cut short: dataset 58 at line 2 needs 4096 bytes of binary data but \d+ follow\.$/);
    const none = await failure(decodeRecording(memorySource(new TextEncoder().encode('    -1\n   164\n         1  SI\n    -1\n'), 'units.uff')));
    expect(none.message).toBe('units.uff has no time response (UFF dataset 58 of function type 1) to read as channels.');
  });
});
