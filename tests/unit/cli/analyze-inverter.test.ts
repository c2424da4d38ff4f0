/** `npm run -s analyze -- inverter …` as a user runs it: the JSON contract on a generated run-up. */
import { execFile } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { promisify } from 'node:util';
import { describe, expect, it } from 'vitest';
import { synthesiseDrive, synthesiseTacho } from '../../../seeds/synthetic-drive';
import { PROJECT_ROOT } from '../../../server/config';
import { writeWav } from '../../../workers/io/wav-writer';
import { analyzeCli } from '../../support/run-analyze';

const run = promisify(execFile);
const FS = 51200;
const T = 8;
const rpm = (t: number) => 1000 + 1000 * t; // 1000 → 9000 rpm
const dir = mkdtempSync(path.join(tmpdir(), 'fanlight-cli-inverter-'));
const file = path.join(dir, 'runup.wav');
/** A 4-pole-pair run-up with a 60-pulse tacho on channel 1, written to `to`. */
function writeRunUp(to: string, drive: Pick<Parameters<typeof synthesiseDrive>[0], 'carrierHz' | 'orders' | 'families' | 'seed'>) {
  const x = synthesiseDrive({ fsHz: FS, durationS: T, rpm, polePairs: 4, noiseRms: 0.002, ...drive });
  writeFileSync(to, writeWav([x, synthesiseTacho(FS, T, rpm, 60)], { sampleRateHz: FS, bits: 32, float: true }));
}
// acceleration in g as the file's unit; --cal 9.80665 turns it into m/s²
writeRunUp(file, {
  carrierHz: (t) => (rpm(t) < 5000 ? 8000 : 10000),
  orders: [{ order: 8, amplitude: 0.05 }, { order: 48, amplitude: 0.02 }],
  families: [
    { m: 1, n: 1, amplitude: 0.02 },
    { m: 1, n: -1, amplitude: 0.02 },
    { m: 2, n: 0, amplitude: 0.01 },
    { m: 2, n: 2, amplitude: 0.006 },
    { m: 2, n: -2, amplitude: 0.006 },
  ],
  seed: 11,
});

// one sideband pair only: fc ± 4fr fits p = 4 (n = ±1, force pattern) and p = 2 (n = ±2, voltage pattern)
const onePairFile = path.join(dir, 'one-pair.wav');
writeRunUp(onePairFile, {
  carrierHz: () => 10000,
  orders: [],
  families: [
    { m: 1, n: 1, amplitude: 0.02 },
    { m: 1, n: -1, amplitude: 0.02 },
  ],
  seed: 13,
});

const analyze = async (...args: string[]) => (await analyzeCli(...args)).json;

describe('analyze inverter', () => {
  it('prints carrier, shifts, spread, pole pairs, orders and families in the fixed shape', async () => {
    const r = await analyze('inverter', file, '--channel', '0', '--tacho', '1', '--ppr', '60', '--orders', '8,48', '--cal', '9.80665');
    expect(Object.keys(r).sort()).toEqual(['carrier', 'carrierShifts', 'carrierSpreadHz', 'families', 'orders', 'overallDb', 'overallRms', 'polePairs', 'strongestFamilies', 'tonality']);
    expect(r.carrier.t.length).toBe(r.carrier.hz.length);
    expect(r.carrierShifts).toHaveLength(1);
    expect(Math.abs(r.carrierShifts[0].rpm - 5000) / 5000).toBeLessThan(0.02);
    expect(r.carrierSpreadHz).toBeNull();
    expect(r.polePairs).toMatchObject({ value: 4, source: 'inferred', pattern: 'm+n even' });
    expect(r.orders.map((o: { order: number }) => o.order)).toEqual([8, 48]);
    const o8 = r.orders[0];
    // ascending rpm for a run-up, RMS in channel units after --cal: 0.05 g peak → 0.3467 m/s² RMS
    expect(o8.rpm).toEqual([...o8.rpm].sort((a: number, b: number) => a - b));
    const median = [...o8.rms].sort((a: number, b: number) => a - b)[o8.rms.length >> 1];
    expect(median).toBeCloseTo((0.05 * 9.80665) / Math.SQRT2, 2);
    // without --families: m = 1 and 2 with every n, |n| ≤ 5, each marked by the detected pattern
    expect(r.families).toHaveLength(22);
    expect(r.families.find((f: { m: number; n: number }) => f.m === 1 && f.n === 1).explained).toBe(true);
    expect(r.families.find((f: { m: number; n: number }) => f.m === 1 && f.n === 2).explained).toBe(false);
  });

  it('tracks only the families asked for, with given pole pairs', async () => {
    const r = await analyze('inverter', file, '--channel', '0', '--tacho', '1', '--ppr', '60', '--pole-pairs', '4', '--families', '1:1,1:-1,2:0');
    expect(r.polePairs).toMatchObject({ value: 4, source: 'given' });
    expect(r.families.map((f: { m: number; n: number }) => `${f.m}:${f.n}`)).toEqual(['1:1', '1:-1', '2:0']);
    const f = r.families[0];
    expect(f.hz.length).toBe(f.rpm.length);
  });

  it('settles one sideband pair by the channel quantity, and says so', async () => {
    const base = ['inverter', onePairFile, '--channel', '0', '--tacho', '1', '--ppr', '60'];
    const alone = await analyze(...base);
    expect(alone.polePairs).toMatchObject({ ambiguous: true, settledByChannel: false });
    const vibration = await analyze(...base, '--quantity', 'acceleration');
    expect(vibration.polePairs).toEqual({ value: 4, source: 'inferred', pattern: 'm+n even', ambiguous: false, settledByChannel: true });
    await expect(run('npm', ['run', '-s', 'analyze', '--', ...base, '--quantity', 'torque'], { cwd: PROJECT_ROOT })).rejects.toMatchObject({
      code: 2,
      stderr: expect.stringContaining('--quantity must be one of acceleration, velocity, sound-pressure, voltage, other, not "torque"'),
    });
  }, 30_000); // three runs of the whole command
});
