/** `analyze info` on files from acquisition systems (MAT, HDF5, UFF), through the same path as WAV/CSV. */
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { PROJECT_ROOT } from '../../../server/config';
import { analyzeCli } from '../../support/run-analyze';

const fixture = (name: string) => path.join(PROJECT_ROOT, 'tests/fixtures/acquisition', name);

const analyze = analyzeCli;

describe('npm run -s analyze -- info on MAT, HDF5 and UFF', () => {
  it('reads a level 5 MAT-file', async () => {
    const r = await analyze('info', fixture('drive_v5.mat'));
    expect(r.code, r.stderr).toBe(0);
    expect(JSON.parse(r.stdout)).toEqual({
      format: 'mat',
      sampleRate: 8192,
      frames: 4096,
      durationS: 0.5,
      channels: [
        { index: 0, name: 'acc 1', unit: null },
        { index: 1, name: 'acc 2', unit: null },
        { index: 2, name: 'ramp', unit: null },
      ],
    });
  });

  it('reads HDF5 (a skipped string dataset is one warning line) and UFF', async () => {
    const h5 = await analyze('info', fixture('drive.h5'));
    expect(h5.code, h5.stderr).toBe(0);
    expect(h5.stderr.trim()).toBe('warning: drive.h5: Not read as channels: comment (not numeric).');
    expect(JSON.parse(h5.stdout)).toMatchObject({ format: 'hdf5', sampleRate: 8192, frames: 4096, channels: [{ name: 'acc housing', unit: 'm/s^2' }, {}, { name: 'drive/ramp' }] });
    const uff = await analyze('info', fixture('drive.uff'));
    expect(uff.code, uff.stderr).toBe(0);
    expect(JSON.parse(uff.stdout)).toMatchObject({ format: 'uff', sampleRate: 51200, frames: 1024, channels: [{ name: 'acc housing', unit: 'm/s^2' }, { name: 'mic front', unit: 'Pa' }, { name: 'ramp', unit: null }] });
  });

  it('exits 2 with one sentence on stderr for a broken file', async () => {
    for (const [name, sentence] of [
      ['no_rate.mat', /^no_rate\.mat has no sample rate: add a scalar fs/],
      ['truncated.h5', /^truncated\.h5 is cut short: /],
      ['not_numeric.uff', /^not_numeric\.uff, line 14: "banana"/],
    ] as const) {
      const r = await analyze('info', fixture(name));
      expect(r.code).toBe(2);
      expect(r.stdout).toBe('');
      const lines = r.stderr.trim().split('\n');
      expect(lines).toHaveLength(1);
      expect(lines[0]).toMatch(sentence);
    }
  });
});
