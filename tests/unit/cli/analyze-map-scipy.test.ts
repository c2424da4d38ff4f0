/**
 * `analyze map` against scipy: the .npy our CLI writes equals, within a small dB tolerance, the one the
 * benchmark's scipy script (tests/bench/scipy_map_script.py: numpy memmap, scipy.fft.rfft, 10·lg of the
 * mean square) wrote for the same WAV — fixtures made by tests/fixtures/batch-map/make_scipy_map_fixtures.py
 * with Debian's python3-scipy, both files stored in tests/fixtures/batch-map/scipy-maps.json.
 */
import { execFile } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { promisify } from 'node:util';
import { describe, expect, it } from 'vitest';
import { PROJECT_ROOT } from '../../../server/config';

const run = promisify(execFile);
const dir = mkdtempSync(path.join(tmpdir(), 'fanlight-cli-map-scipy-'));

interface Case {
  name: string;
  channel: number;
  blockSize: number;
  overlap: number;
  shape: [number, number];
  wav: string;
  levelsDb: string;
}
const fixture = JSON.parse(readFileSync(path.join(PROJECT_ROOT, 'tests/fixtures/batch-map/scipy-maps.json'), 'utf8')) as { cases: Case[] };

/** The float32 data of a version 1.0 .npy (NumPy NEP 1): header length at byte 8, data after it. */
function readNpy(file: string): { shape: number[]; data: Float32Array } {
  const bytes = readFileSync(file);
  const headerLength = bytes.readUInt16LE(8);
  const header = bytes.subarray(10, 10 + headerLength).toString('latin1');
  const shape = /'shape': \(([^)]*)\)/.exec(header)![1].split(',').filter((s) => s.trim()).map(Number);
  const body = bytes.subarray(10 + headerLength);
  return { shape, data: new Float32Array(body.buffer.slice(body.byteOffset, body.byteOffset + body.byteLength)) };
}

const fromBase64 = (s: string) => {
  const b = Buffer.from(s, 'base64');
  return new Float32Array(b.buffer.slice(b.byteOffset, b.byteOffset + b.byteLength));
};

describe('analyze map against the scipy script', () => {
  for (const c of fixture.cases) {
    it(`${c.name}: same shape, every bin within 0.01 dB of scipy's where the level is within 90 dB of the map's peak`, async () => {
      const wav = path.join(dir, `${c.name}.wav`);
      const npy = path.join(dir, `${c.name}.npy`);
      writeFileSync(wav, Buffer.from(c.wav, 'base64'));
      const { stdout } = await run(
        'npm',
        ['run', '-s', 'analyze', '--', 'map', wav, '--channel', String(c.channel), '--block', String(c.blockSize), '--overlap', String(c.overlap), '--window', 'hann', '--out', npy],
        { cwd: PROJECT_ROOT },
      );
      expect(JSON.parse(stdout)).toMatchObject({ frames: c.shape[0], bins: c.shape[1] });
      const ours = readNpy(npy);
      const theirs = fromBase64(c.levelsDb);
      expect(ours.shape).toEqual(c.shape);
      expect(ours.data.length).toBe(theirs.length);
      const peak = theirs.reduce((m, v) => Math.max(m, v), -Infinity);
      let worst = 0;
      let compared = 0;
      for (let i = 0; i < theirs.length; i++) {
        // below that, float32 rounding in either FFT decides the last digits
        if (theirs[i] < peak - 90) continue;
        worst = Math.max(worst, Math.abs(ours.data[i] - theirs[i]));
        compared++;
      }
      expect(compared).toBeGreaterThan(theirs.length / 2);
      expect(worst).toBeLessThan(0.01);
    });
  }
});
