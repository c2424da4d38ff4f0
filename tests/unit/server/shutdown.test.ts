import { spawn } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';

const child = fileURLToPath(new URL('../../support/shutdown-child.ts', import.meta.url));

describe('launcher process rules (server/ops/shutdown.ts)', () => {
  it('before it serves, a stray error is a failed set-up: it stops what it started and exits 1', async () => {
    const proc = spawn(process.execPath, ['--import', 'tsx', child, 'setting-up'], { stdio: ['ignore', 'pipe', 'pipe'] });
    let out = '';
    let err = '';
    proc.stdout.on('data', (d) => (out += d));
    proc.stderr.on('data', (d) => (err += d));
    const code = await new Promise<number | null>((resolve) => proc.on('exit', (c) => resolve(c)));
    expect(code).toBe(1);
    expect(err).toMatch(/set-up failed[\s\S]*the database did not start/);
    expect(out).toContain('stopper ran');
  }, 30_000);

  it('once serving, logs an unhandled rejection and an uncaught exception, keeps running, and stops only on SIGTERM', async () => {
    const proc = spawn(process.execPath, ['--import', 'tsx', child], { stdio: ['ignore', 'pipe', 'pipe'] });
    let out = '';
    let err = '';
    proc.stdout.on('data', (d) => (out += d));
    proc.stderr.on('data', (d) => (err += d));
    const deadline = Date.now() + 20_000;
    while (!out.includes('alive after') && proc.exitCode === null && Date.now() < deadline) await new Promise((r) => setTimeout(r, 50));
    expect(proc.exitCode).toBeNull();
    expect(out).toContain('alive after 2 bugs');
    expect(err).toMatch(/BUG #1 \(unhandled rejection[\s\S]*a forgotten promise/);
    expect(err).toMatch(/BUG #2 \(uncaught exception[\s\S]*a throwing timer/);
    const exited = new Promise<number | null>((resolve) => proc.on('exit', (code) => resolve(code)));
    proc.kill('SIGHUP');
    await new Promise((r) => setTimeout(r, 300));
    expect(proc.exitCode).toBeNull();
    proc.kill('SIGTERM');
    expect(await exited).toBe(0);
    expect(out).toContain('stopper ran');
  }, 30_000);
});
