/**
 * `npm run -s analyze -- extract …` as a user runs it, on a run-up whose components are known by
 * construction: an order and a carrier family whose frequencies cross, and another order. The extracted
 * time signals come back each within 20 dB SNR of the truth (the Vold–Kalman filter's separation of
 * crossing components: Vold & Leuridan, SAE 931288, 1993), and --remove leaves the rest.
 */
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { synthesiseTacho } from '../../../seeds/synthetic-drive';
import { decodeRecording } from '../../../workers/io/decode-recording';
import { memorySource } from '../../../workers/io/byte-source';
import { writeWav } from '../../../workers/io/wav-writer';
import { snrDb, tone } from '../../support/tones';
import { analyzeCli } from '../../support/run-analyze';

const FS = 25600;
const T = 4;
const N = FS * T;
const rpm = (t: number) => 1000 + 750 * t; // 1000 → 4000 rpm
const P = 4;
const FC = 3000;

const analyze = analyzeCli;

async function readWav(file: string): Promise<Float32Array[]> {
  return (await decodeRecording(memorySource(new Uint8Array(readFileSync(file))))).samples;
}

describe('npm run -s analyze -- extract', async () => {
  const dir = mkdtempSync(path.join(tmpdir(), 'fanlight-cli-extract-'));
  const file = path.join(dir, 'runup.wav');
  // order 48 (800 → 3200 Hz) crosses the family fc − fe (3000 − 4·rpm/60 Hz) near 3460 rpm
  const order48 = tone(N, FS, (t) => (48 * rpm(t)) / 60, (t) => 0.3 + 0.05 * t, 0.4);
  const family = tone(N, FS, (t) => FC - (P * rpm(t)) / 60, () => 0.25, -0.7);
  const order8 = tone(N, FS, (t) => (8 * rpm(t)) / 60, () => 0.5, 1.2);
  const x = Float32Array.from(order48, (v, i) => v + family[i] + order8[i]);
  writeFileSync(file, writeWav([x, synthesiseTacho(FS, T, rpm, 60)], { sampleRateHz: FS, bits: 32, float: true }));
  const edge = FS / 2;

  it('writes one channel per component, in the order given, each within 20 dB of the truth, and the contract JSON', async () => {
    const out = path.join(dir, 'parts.wav');
    const r = await analyze('extract', file, '--channel', '0', '--tacho', '1', '--ppr', '60', '--order', '48', '--family', '1:-1', '--order', '8', '--carrier', String(FC), '--pole-pairs', String(P), '--bandwidth', '6', '--out', out);
    expect(r.code, r.stderr).toBe(0);
    const json = JSON.parse(r.stdout);
    expect(json.bandwidthHz).toBe(6);
    expect(json.out).toBe(out);
    expect(json.components.map((c: { kind: string }) => c.kind)).toEqual(['order', 'family', 'order']);
    expect(json.components[0]).toMatchObject({ kind: 'order', order: 48 });
    expect(json.components[1]).toMatchObject({ kind: 'family', m: 1, n: -1 });
    const c1 = json.components[1] as { t: number[]; rpm: number[]; rms: number[] };
    expect(c1.t.length).toBe(c1.rms.length);
    // the family's RMS is 0.25/√2 away from the ends
    const middle = c1.rms.slice(5, -5);
    for (const v of middle) expect(Math.abs(20 * Math.log10(v / (0.25 / Math.SQRT2)))).toBeLessThan(1);
    const parts = await readWav(out);
    expect(parts).toHaveLength(3);
    expect(snrDb(parts[0], order48, edge, N - edge)).toBeGreaterThan(20);
    expect(snrDb(parts[1], family, edge, N - edge)).toBeGreaterThan(20);
    expect(snrDb(parts[2], order8, edge, N - edge)).toBeGreaterThan(20);
  }, 60_000);

  it('with --remove writes the input less the components: one channel, the rest', async () => {
    const out = path.join(dir, 'rest.wav');
    const r = await analyze('extract', file, '--channel', '0', '--tacho', '1', '--ppr', '60', '--order', '48', '--family', '1:-1', '--carrier', String(FC), '--pole-pairs', String(P), '--bandwidth', '6', '--remove', '--out', out);
    expect(r.code, r.stderr).toBe(0);
    const [rest] = await readWav(out);
    expect(snrDb(rest, order8, edge, N - edge)).toBeGreaterThan(20);
  }, 60_000);

  it('exits 2 with one sentence when no component is named, or a family is malformed', async () => {
    const none = await analyze('extract', file, '--channel', '0', '--tacho', '1', '--ppr', '60', '--out', path.join(dir, 'x.wav'));
    expect(none.code).toBe(2);
    expect(none.stderr.trim()).toMatch(/Name at least one component/);
    const bad = await analyze('extract', file, '--channel', '0', '--tacho', '1', '--ppr', '60', '--family', '1-1', '--out', path.join(dir, 'x.wav'));
    expect(bad.code).toBe(2);
    expect(bad.stderr.trim()).toMatch(/--family must be M:N/);
  }, 60_000);
});
