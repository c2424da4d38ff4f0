/**
 * The campaign's small parts on their own: RESULTS.jsonl after a crash (a line cut short is dropped and
 * the file continues on a fresh line; a file already written is not written twice), the preset's keys
 * as the inverter command's options, and TAGS.csv rows checked against the header (RFC 4180 quoting).
 */
import { mkdirSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { collectFiles, relativeName } from '../../../server/cli/campaign/files';
import { parsePreset, presetOptions } from '../../../server/cli/campaign/preset';
import { analyseOne } from '../../../server/cli/campaign/analyse-one';
import { fitInverter, thinTracks } from '../../../server/cli/campaign/fit-inverter';
import { ResultsLog } from '../../../server/cli/campaign/results-log';
import { readTagsCsv } from '../../../server/cli/campaign/tags-csv';
import { MapThreadPool } from '../../../server/cli/thread-pool';
import { RUN_UP_PRESET, writeRunUp } from '../../support/campaign-run-ups';

const dir = mkdtempSync(path.join(tmpdir(), 'fanlight-campaign-parts-'));

describe('ResultsLog', () => {
  it('drops a line a crash cut short, goes on on a fresh line, and writes each file once', () => {
    const file = path.join(dir, 'crashed.jsonl');
    writeFileSync(file, '{"file":"/a.wav","ok":true,"inverter":{}}\n{"file":"/b.wav","ok":tr');
    const log = new ResultsLog(file);
    expect(log.has('/a.wav')).toBe(true);
    expect(log.has('/b.wav')).toBe(false);
    expect(log.write({ file: '/b.wav', ok: false, error: 'b.wav is empty (0 bytes).' })).toBe(true);
    expect(log.write({ file: '/b.wav', ok: true, inverter: {} })).toBe(false);
    log.close();
    const lines = readFileSync(file, 'utf8').split('\n');
    expect(lines[2]).toBe('{"file":"/b.wav","ok":false,"error":"b.wav is empty (0 bytes)."}');
    expect(new ResultsLog(file).results.get('/b.wav')).toEqual({ file: '/b.wav', ok: false, error: 'b.wav is empty (0 bytes).' });
  });
});

describe('preset', () => {
  it('gives the inverter command its options, lists joined as on the command line', () => {
    const preset = parsePreset({ channel: 0, tacho: 1, ppr: 60, polePairs: 4, orders: [8, 48], families: ['1:2', { m: 2, n: -1 }], soundPressure: true }, 'p.json');
    expect(presetOptions(preset)).toEqual({ channel: '0', tacho: '1', ppr: '60', 'pole-pairs': '4', orders: '8,48', families: '1:2,2:-1', 'sound-pressure': true });
  });

  it('names the key of a value of the wrong kind', () => {
    expect(() => parsePreset({ channel: 0, speedChannel: 1, block: 'large' }, 'p.json')).toThrow(/^p\.json: "block" /);
    expect(() => parsePreset({ speedChannel: 1 }, 'p.json')).toThrow(/^p\.json: "channel" /);
  });
});

describe('files and tags', () => {
  it('finds recordings under a folder by extension, leaving out tags.csv, and names them relative to it', () => {
    const runs = path.join(dir, 'runs');
    for (const f of ['a.wav', 'sub/b.mat', 'sub/c.unv', 'tags.csv', 'notes.txt', '.hidden.wav']) {
      const full = path.join(runs, f);
      mkdirSync(path.dirname(full), { recursive: true });
      writeFileSync(full, 'x');
    }
    const { files, root } = collectFiles([runs], dir);
    expect(root).toBe(runs);
    expect(files.map((f) => relativeName(f, root))).toEqual(['a.wav', 'sub/b.mat', 'sub/c.unv']);
  });

  it('reads TAGS.csv with quoted fields, and names the line of a short row', () => {
    const tags = path.join(dir, 'tags.csv');
    writeFileSync(tags, 'file,firmware,note\nrun-1.wav,A,"full load, hot"\nsub\\run-2.wav,B,\n');
    expect(readTagsCsv(tags)).toEqual({ 'run-1.wav': { firmware: 'A', note: 'full load, hot' }, 'sub/run-2.wav': { firmware: 'B', note: '' } });
    writeFileSync(tags, 'file,firmware,note\nrun-1.wav,A\n');
    expect(() => readTagsCsv(tags)).toThrow(`${tags} line 2: 2 fields where the header has 3.`);
  });
});

describe('fitInverter', () => {
  it('thins a long report’s tracks by the smallest k that fits, keeping whole-run findings and the ends', async () => {
    const file = path.join(dir, 'fit.wav');
    writeRunUp(file, 5000);
    const pool = new MapThreadPool(1);
    const outcome = await analyseOne(file, presetOptions(parsePreset(RUN_UP_PRESET, 'preset')), pool).finally(() => pool.close());
    if (!outcome.ok) throw new Error(outcome.error);
    type Track = { rpm: number[]; rms: number[] };
    type Report = Record<string, unknown> & { families: Track[]; carrier: { t: number[]; hz: number[] }; thinnedBy?: number };
    const inverter = outcome.inverter as Report;
    const size = Buffer.byteLength(JSON.stringify(inverter));
    const limit = Math.floor(size / 2.5);
    const fitted = fitInverter(inverter, limit) as Report;
    expect(Buffer.byteLength(JSON.stringify(fitted))).toBeLessThanOrEqual(limit);
    const k = fitted.thinnedBy!;
    // the smallest k: one less does not fit (and a report that fits is posted whole)
    expect(k).toBeGreaterThanOrEqual(2);
    if (k > 2) expect(Buffer.byteLength(JSON.stringify({ ...(thinTracks(inverter, k - 1) as object), thinnedBy: k - 1 }))).toBeGreaterThan(limit);
    expect(fitInverter(inverter, size)).toBe(inverter);
    // every kept point is the original's point i·k (and the last one)
    const f0 = inverter.families[0];
    const g0 = fitted.families[0];
    const kept = f0.rpm.map((_: number, i: number) => i).filter((i: number) => i % k === 0 || i === f0.rpm.length - 1);
    expect(g0.rpm).toEqual(kept.map((i: number) => f0.rpm[i]));
    expect(g0.rms).toEqual(kept.map((i: number) => f0.rms[i]));
    expect(fitted.carrier.t.length).toBe(fitted.carrier.hz.length);
    for (const key of ['carrierShifts', 'carrierSpreadHz', 'polePairs', 'strongestFamilies', 'tonality']) expect(fitted[key]).toEqual(inverter[key]);
  });
});
