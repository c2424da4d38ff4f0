/**
 * `analyze campaign` embedded (worker threads on this machine) on generated PWM run-ups whose carriers
 * are known by construction (tests/support/campaign-run-ups.ts): every file once with its own carrier,
 * a corrupt file one ok:false line, a rerun skipping what is written, Ctrl-C leaving whole lines only,
 * and a preset with an unknown key refused (exit 2).
 */
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { readResults, runAnalyze, startAnalyze } from '../../support/campaign-cli';
import { medianCarrier, RUN_UP_PRESET, writeRunUp } from '../../support/campaign-run-ups';

const dir = mkdtempSync(path.join(tmpdir(), 'fanlight-campaign-'));
const data = path.join(dir, 'runs');
const preset = path.join(dir, 'preset.json');
/** file (relative to the folder) → carrier, Hz */
const CARRIERS: Record<string, number> = { 'a.wav': 3000, 'b.wav': 5000, 'day2/c.wav': 7000, 'day2/d.wav': 4000 };
const CORRUPT = 'day2/broken.wav';

beforeAll(() => {
  for (const [name, fc] of Object.entries(CARRIERS)) writeRunUp(path.join(data, name), fc);
  // a RIFF header with no fmt chunk: the reader refuses it (workers/io/wav-header.ts)
  writeFileSync(path.join(data, CORRUPT), 'RIFF\x20\x00\x00\x00WAVEjunk\x04\x00\x00\x00abcd');
  writeFileSync(path.join(data, 'notes.md'), 'not a recording');
  writeFileSync(preset, JSON.stringify(RUN_UP_PRESET));
});

/** Each file's carrier within 1 % of the one it was made with (the carrier criterion of the findings sweep). */
function expectRightCarriers(lines: ReturnType<typeof readResults>) {
  for (const line of lines.filter((l) => l.ok)) {
    const fc = CARRIERS[path.relative(data, line.file)];
    expect(Math.abs(medianCarrier(line.inverter!.carrier.hz) - fc) / fc, line.file).toBeLessThan(0.01);
  }
}

describe('analyze campaign (embedded)', () => {
  it('analyses every recording once on 2 workers, with its own carrier, and a corrupt file as one ok:false line', async () => {
    const out = path.join(dir, 'results.jsonl');
    const r = await runAnalyze(['campaign', data, '--preset', preset, '--workers', '2', '--out', out]);
    expect(r.code, r.stderr).toBe(0);
    expect(JSON.parse(r.stdout)).toMatchObject({ files: 5, ok: 4, failed: 1, skipped: 0, out });
    const lines = readResults(out);
    expect(lines.map((l) => path.relative(data, l.file)).sort()).toEqual([...Object.keys(CARRIERS), CORRUPT].sort());
    expectRightCarriers(lines);
    const broken = lines.find((l) => l.file.endsWith(CORRUPT))!;
    expect(broken).toEqual({ file: path.join(data, CORRUPT), ok: false, error: expect.stringMatching(/^broken\.wav .*\.$/) });
    expect(r.stderr).toMatch(/campaign: 5\/5 done \(1 failed\), [\d.]+ files\/min, ETA/);

    const before = readFileSync(out, 'utf8');
    const again = await runAnalyze(['campaign', data, '--preset', preset, '--workers', '2', '--out', out]);
    expect(JSON.parse(again.stdout)).toMatchObject({ files: 5, ok: 0, failed: 0, skipped: 5 });
    expect(readFileSync(out, 'utf8')).toBe(before);
  }, 60_000);

  it('stops cleanly on Ctrl-C (whole lines only), and the rerun does the rest, each file once', async () => {
    const out = path.join(dir, 'interrupted.jsonl');
    const run = startAnalyze(['campaign', data, '--preset', preset, '--workers', '1', '--out', out]);
    run.stderrLines((line) => {
      if (line.startsWith('campaign: 1/')) run.child.kill('SIGINT');
    });
    const r = await run.done;
    expect(r.code, r.stderr).toBe(130);
    const summary = JSON.parse(r.stdout);
    expect(summary.interrupted).toBe(true);
    expect(summary.ok + summary.failed).toBeLessThan(5);
    const partial = readResults(out); // throws on a line cut short
    expect(partial.length).toBe(summary.ok + summary.failed);

    const rest = await runAnalyze(['campaign', data, '--preset', preset, '--workers', '2', '--out', out]);
    expect(JSON.parse(rest.stdout)).toMatchObject({ files: 5, skipped: partial.length });
    const lines = readResults(out);
    expect(lines.map((l) => l.file).sort()).toEqual([...new Set(lines.map((l) => l.file))].sort());
    expect(lines).toHaveLength(5);
    expectRightCarriers(lines);
  }, 60_000);

  it('refuses a preset with an unknown key, naming it (exit 2)', async () => {
    const bad = path.join(dir, 'bad-preset.json');
    writeFileSync(bad, JSON.stringify({ ...RUN_UP_PRESET, carrierHz: 4000 }));
    const r = await runAnalyze(['campaign', data, '--preset', bad, '--out', path.join(dir, 'never.jsonl')]);
    expect(r.code).toBe(2);
    expect(r.stderr.trim()).toBe(`${bad}: unknown key "carrierHz" (known: channel, tacho, ppr, trigger, speedChannel, speedCal, polePairs, orders, families, cal, quantity, soundPressure, block, at).`);
  });
});
