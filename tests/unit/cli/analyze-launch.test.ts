/**
 * `npm run analyze` starts from a JavaScript bundle (server/cli/analyze-launch.mjs) that is rebuilt when a
 * bundled source changed: the manifest records each bundled file's mtime; a recorded mtime that no longer
 * matches the file (as after an edit) makes the next start build a new bundle, which then runs.
 */
import { execFile } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { promisify } from 'node:util';
import { describe, expect, it } from 'vitest';
import { PROJECT_ROOT } from '../../../server/config';
import { wav } from '../io/wav-fixtures';

const run = promisify(execFile);
const cache = path.join(PROJECT_ROOT, 'node_modules/.cache/fanlight-cli');
const manifestFile = path.join(cache, 'manifest.json');
const dir = mkdtempSync(path.join(tmpdir(), 'fanlight-cli-launch-'));
const file = path.join(dir, 'tone.wav');
writeFileSync(file, wav([Float32Array.from({ length: 8000 }, (_, i) => Math.sin(i / 10))], { bits: 16, sampleRateHz: 8000 }));

const manifest = () => JSON.parse(readFileSync(manifestFile, 'utf8')) as { dir: string; inputs: Record<string, number> };
const info = async () => JSON.parse((await run(process.execPath, ['server/cli/analyze-launch.mjs', 'info', file], { cwd: PROJECT_ROOT })).stdout);

describe('analyze-launch: the CLI from a bundle rebuilt when stale', () => {
  it('runs a command from a bundle whose manifest lists the CLI and thread entries with their current mtimes', async () => {
    expect(await info()).toMatchObject({ format: 'wav', sampleRate: 8000, frames: 8000 });
    const m = manifest();
    for (const entry of ['server/cli/analyze.ts', 'server/cli/map-thread.ts', 'server/cli/campaign/campaign-thread.ts']) {
      expect(m.inputs[entry]).toBe(statSync(path.join(PROJECT_ROOT, entry)).mtimeMs);
    }
    for (const js of ['analyze.js', 'map-thread.js', 'campaign-thread.js']) expect(existsSync(path.join(cache, m.dir, js))).toBe(true);
  });

  it('builds a new bundle when a bundled file no longer has its recorded mtime', async () => {
    await info();
    const before = manifest();
    writeFileSync(manifestFile, JSON.stringify({ ...before, inputs: { ...before.inputs, 'server/cli/analyze.ts': 0 } }));
    expect(await info()).toMatchObject({ format: 'wav', channels: [{ index: 0 }] });
    const after = manifest();
    expect(after.dir).not.toBe(before.dir);
    expect(after.inputs['server/cli/analyze.ts']).toBe(statSync(path.join(PROJECT_ROOT, 'server/cli/analyze.ts')).mtimeMs);
  });
});
