/** The batch command as a user runs it: `npm run -s analyze -- info FILE`, in a child process. */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { testChannels, wav } from '../io/wav-fixtures';
import { analyzeCli } from '../../support/run-analyze';

const dir = mkdtempSync(path.join(tmpdir(), 'fanlight-cli-'));

const analyze = analyzeCli;

describe('npm run -s analyze -- info', () => {
  it('prints the contract JSON for a 4-channel 24-bit WAV', async () => {
    const file = path.join(dir, 'four.wav');
    writeFileSync(file, wav(testChannels(4, 51200), { bits: 24, sampleRateHz: 51200 }));
    const r = await analyze('info', file);
    expect(r.code).toBe(0);
    expect(JSON.parse(r.stdout)).toEqual({
      format: 'wav',
      sampleRate: 51200,
      frames: 51200,
      durationS: 1,
      channels: [0, 1, 2, 3].map((i) => ({ index: i, name: `ch${i + 1}`, unit: null })),
    });
  });

  it('prints channel names and units from a CSV header', async () => {
    const file = path.join(dir, 'table.csv');
    writeFileSync(file, 'time [s];mic [Pa];speed [rpm]\n0,00;0,1;1000\n0,01;0,2;1010\n');
    const r = await analyze('info', file);
    expect(JSON.parse(r.stdout)).toMatchObject({
      format: 'csv',
      frames: 2,
      channels: [
        { index: 0, name: 'mic', unit: 'Pa' },
        { index: 1, name: 'speed', unit: 'rpm' },
      ],
    });
    expect(JSON.parse(r.stdout).sampleRate).toBeCloseTo(100, 6);
  });

  it('reads a truncated WAV (its data chunk claims more than the file holds), exit 0, with one warning line on stderr', async () => {
    const whole = wav(testChannels(2, 4800), { bits: 16, sampleRateHz: 48000 });
    const file = path.join(dir, 'truncated.wav');
    // cut in the middle of the data: 1000 whole frames of 4 bytes after the 44-byte header, and 2 bytes more
    writeFileSync(file, whole.subarray(0, 44 + 4000 + 2));
    for (const args of [['info', file], ['spectrum', file, '--channel', '0', '--block', '256']]) {
      const r = await analyze(...args);
      expect(r.code, r.stderr).toBe(0);
      const lines = r.stderr.trim().split('\n');
      expect(lines).toHaveLength(1);
      expect(lines[0]).toMatch(/^warning: truncated\.wav: The data chunk says 19200 bytes but the file holds 4002 .*cut short.*1000 whole frames/);
      JSON.parse(r.stdout); // stdout stays the JSON alone
    }
    expect(JSON.parse((await analyze('info', file)).stdout).frames).toBe(1000);
  });

  it('exits 2 with one sentence on stderr, no stack, for bad input', async () => {
    const file = path.join(dir, 'broken.wav');
    writeFileSync(file, 'RIFF\x10\x00\x00\x00WAVEjunkjunk');
    const r = await analyze('info', file);
    expect(r.code).toBe(2);
    expect(r.stdout).toBe('');
    const lines = r.stderr.trim().split('\n');
    expect(lines).toHaveLength(1);
    expect(lines[0]).toMatch(/^broken\.wav has no fmt chunk/);
    const missing = await analyze('info', path.join(dir, 'nope.wav'));
    expect(missing.code).toBe(2);
    expect(missing.stderr.trim()).toMatch(/nope\.wav does not exist\.$/);
  });
});
