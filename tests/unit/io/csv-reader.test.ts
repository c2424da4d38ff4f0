import { describe, expect, it } from 'vitest';
import { memorySource } from '../../../workers/io/byte-source';
import { parseHeaderCell, readCsv } from '../../../workers/io/csv-reader';
import type { CsvOptions } from '../../../workers/io/recording';

const csv = (text: string, options: CsvOptions & { channels?: number[] } = {}, name = 'export.csv') =>
  readCsv(memorySource(new TextEncoder().encode(text), name), options);

describe('CSV reader', () => {
  it('reads comma-separated values with a time column and units in the header', async () => {
    const r = await csv('time [s],mic [Pa],acc (m/s^2)\n0.000,0.1,1\n0.001,0.2,2\n0.002,-0.3,3\n');
    expect(r.header).toMatchObject({ format: 'csv', frames: 3, channels: [
      { index: 0, name: 'mic', unit: 'Pa' },
      { index: 1, name: 'acc', unit: 'm/s^2' },
    ] });
    expect(r.header.sampleRateHz).toBeCloseTo(1000, 9);
    expect([...r.samples[0]]).toEqual([0.1, 0.2, -0.3].map(Math.fround));
    expect([...r.samples[1]]).toEqual([1, 2, 3]);
  });

  it('reads semicolons with decimal commas, and tabs', async () => {
    const semi = await csv('Zeit [s];Kanal 1 [V]\n0,0;1,5\n0,5;2,5\n1,0;-3,25\n');
    expect(semi.header.sampleRateHz).toBeCloseTo(2, 9);
    expect([...semi.samples[0]]).toEqual([1.5, 2.5, -3.25]);
    const tab = await csv('t\tx\ty\n0\t1\t2\n0.25\t3\t4\n', {}, 'export.tsv');
    expect(tab.header.sampleRateHz).toBeCloseTo(4, 9);
    expect([...tab.samples[1]]).toEqual([2, 4]);
  });

  it('takes time in milliseconds from the unit', async () => {
    const r = await csv('time [ms],a\n0,1\n0.5,2\n1.0,3\n');
    expect(r.header.sampleRateHz).toBeCloseTo(2000, 6);
  });

  it('uses a given sample rate when there is no time column, and names headless columns ch1…', async () => {
    const r = await csv('1,2\n3,4\n5,6\n', { sampleRateHz: 100 });
    expect(r.header.channels.map((c) => c.name)).toEqual(['ch1', 'ch2']);
    expect(r.header.durationS).toBeCloseTo(0.03, 12);
    expect([...r.samples[0]]).toEqual([1, 3, 5]);
  });

  it('uses a chosen time column', async () => {
    const r = await csv('a,b,clock\n1,2,0\n3,4,0.1\n', { timeColumn: 2 });
    expect(r.header.channels.map((c) => c.name)).toEqual(['a', 'b']);
    expect(r.header.sampleRateHz).toBeCloseTo(10, 9);
  });

  it('accepts time printed with rounding (51.2 kHz at 6 decimals)', async () => {
    const rows = Array.from({ length: 200 }, (_, i) => `${(i / 51200).toFixed(6)},${i}`).join('\n');
    const r = await csv(`time,x\n${rows}\n`);
    expect(r.header.sampleRateHz).toBeCloseTo(51200, -1);
  });

  it('handles CRLF line ends, a BOM and a last line without a line end', async () => {
    const r = await csv('\uFEFFtime,x\r\n0,1\r\n1,2');
    expect(r.header.channels[0].name).toBe('x');
    expect([...r.samples[0]]).toEqual([1, 2]);
  });

  it('reports NaN and Inf cells and reads them as 0', async () => {
    const r = await csv('t,x\n0,1\n1,NaN\n2,inf\n3,4\n');
    expect([...r.samples[0]]).toEqual([1, 0, 0, 4]);
    expect(r.nonFinite).toEqual([{ channel: 0, count: 2, firstFrame: 1 }]);
  });

  it('parses header cells with units in brackets or parentheses', () => {
    expect(parseHeaderCell('mic [Pa]', 0)).toEqual({ name: 'mic', unit: 'Pa' });
    expect(parseHeaderCell(' acc (m/s^2) ', 1)).toEqual({ name: 'acc', unit: 'm/s^2' });
    expect(parseHeaderCell('speed', 2)).toEqual({ name: 'speed', unit: null });
    expect(parseHeaderCell('', 3)).toEqual({ name: 'ch4', unit: null });
  });

  describe('bad input names the row and the column', () => {
    const cases: [string, string, CsvOptions, string, RegExp][] = [
      ['a ragged row', 't,a,b\n0,1,2\n1,3\n', {}, 'CSV_RAGGED_ROW', /export\.csv, row 3: 2 cells where the header has 3/],
      ['a non-numeric cell', 't,a,b\n0,1,2\n1,x7,3\n', {}, 'CSV_NOT_NUMERIC', /row 3, column 2 \("a"\): "x7" is not a number/],
      ['an empty cell', 't,a\n0,1\n1,\n', {}, 'CSV_NOT_NUMERIC', /row 3, column 2 \("a"\): the cell is empty/],
      ['time going backwards', 't,a\n0,1\n2,1\n1,1\n', {}, 'CSV_TIME_BACKWARDS', /row 4: time goes backwards \(1 s after 2 s\)/],
      ['time standing still', 't,a\n0,1\n0,1\n', {}, 'CSV_TIME_BACKWARDS', /row 3: time does not advance/],
      ['irregular time', 't,a\n0,1\n1,1\n2,1\n3.5,1\n4.5,1\n', {}, 'CSV_TIME_IRREGULAR', /row 5: the time step is 1\.500 s where the usual step is 1\.000 s/],
      ['no time column and no rate', 'a,b\n1,2\n', {}, 'CSV_NEEDS_SAMPLE_RATE', /no time column .* give its sample rate/],
      ['an empty file', '', {}, 'EMPTY_FILE', /export\.csv is empty/],
      ['a header only', 'time,a\n', {}, 'NO_SAMPLES', /no rows of numbers/],
    ];
    it.each(cases)('%s', async (_label, text, options, code, message) => {
      const err = await csv(text, options).catch((e) => e);
      expect(err).toMatchObject({ name: 'RecordingError', code });
      expect(err.message).toMatch(message);
    });
  });

  it('reads a file larger than one slice (4 MiB) without losing rows at the seams', async () => {
    const n = 300_000;
    const rows: string[] = ['time,a,b'];
    for (let i = 0; i < n; i++) rows.push(`${(i / 1000).toFixed(3)},${i % 1000},${-(i % 777)}`);
    const text = rows.join('\n');
    expect(text.length).toBeGreaterThan(4 * 1024 * 1024);
    const r = await csv(text);
    expect(r.header.frames).toBe(n);
    expect(r.samples[0][n - 1]).toBe((n - 1) % 1000);
    expect(r.samples[1][123_457]).toBe(-(123_457 % 777));
  });
});
