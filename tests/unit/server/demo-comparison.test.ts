/**
 * The demo's saved comparison, built from the demo recordings without a database. What it must show comes
 * from the demo's own synthesis (seeds/demo-recordings.ts): firmware B makes fc ± fe 5 dB lower
 * (amplitude × 10^(−5/20)) and moves the carrier from 8 kHz → 12 kHz at 6000 rpm to 10 kHz → 12 kHz at
 * 7000 rpm; the demo target on fc − fe (seeds/demo-content.ts, −25 dB re 1 g at 500 rpm to −21 dB at
 * 12 000 rpm) was set so that the first run-up goes above it from about 4200 rpm (the README's "Comparing
 * runs") and firmware B stays under it.
 */
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { loadConfig } from '../../../server/config';
import { comparisonState, viewState } from '../../../server/schemas/views';
import { describeFile } from '../../../seeds/demo-analysis';
import { DEMO_TARGETS } from '../../../seeds/demo-content';
import { COMPARED_FILES, FIRMWARE_B_FILE, demoComparison } from '../../../seeds/demo-comparison';
import { ensureDemoRecordings } from '../../../seeds/demo-recordings';
import { RUN_UP_FILE } from '../../../seeds/demo-view';

const demoDir = loadConfig().demoRecordingsDir;

describe('the demo comparison of the two firmware run-ups', async () => {
  ensureDemoRecordings(demoDir);
  const fingerprints = new Map<string, string>();
  for (const f of COMPARED_FILES) fingerprints.set(f, (await describeFile(path.join(demoDir, f))).fingerprint);
  const target = DEMO_TARGETS.find((t) => t.track === 'family:1:-1')!;
  const built = await demoComparison(demoDir, fingerprints, target.points);
  const c = built.comparison;

  it('is a comparison and a view state the server takes', () => {
    expect(comparisonState.safeParse(c).success).toBe(true);
    expect(viewState.parse(built.state).comparison).toEqual(c);
    expect(c.runs).toEqual([
      { name: RUN_UP_FILE, fingerprint: fingerprints.get(RUN_UP_FILE) },
      { name: FIRMWARE_B_FILE, fingerprint: fingerprints.get(FIRMWARE_B_FILE) },
    ]);
    expect(c.track).toEqual({ label: 'fc−fe', guide: { kind: 'family', m: 1, n: -1 } });
    expect(c.unit).toBe('dB re 1 g');
    expect(c.levels).toHaveLength(2);
    for (const l of [...c.levels, c.target!, ...c.carrierHz]) expect(l).toHaveLength(c.rpm.length);
  });

  it('finds the baseline above the target from 4000–4500 rpm, and firmware B under it everywhere', () => {
    const baseline = c.exceedances.filter((e) => e.run === RUN_UP_FILE);
    expect(baseline.length).toBeGreaterThan(0);
    expect(baseline[0].fromRpm).toBeGreaterThanOrEqual(4000);
    expect(baseline[0].fromRpm).toBeLessThanOrEqual(4500);
    expect(c.exceedances.filter((e) => e.run === FIRMWARE_B_FILE)).toEqual([]);
    expect(built.facts.firmwareBMarginDb).toBeGreaterThan(0);
  });

  it('has firmware B about 5 dB below the baseline on fc − fe, and each run with its own carrier schedule', () => {
    expect(built.facts.fcMinusFeDeltaDb).toBeCloseTo(-5, 0);
    const at = (rpm: number) => c.carrierRpm.findIndex((r) => Math.abs(r - rpm) <= 25);
    expect(c.carrierHz.map((hz) => hz[at(3000)])).toEqual([8000, 10000]);
    expect(c.carrierHz.map((hz) => hz[at(6500)])).toEqual([12000, 10000]);
    expect(c.carrierHz.map((hz) => hz[at(9000)])).toEqual([12000, 12000]);
    expect(c.findings.map((f) => f.poles)).toEqual(['4', '4']);
  });

  it('has marks and a thread that quote the numbers computed', () => {
    const first = c.exceedances[0];
    expect(built.marks[0].text).toContain(`from ${first.fromRpm.toLocaleString('en').replace(',', '\u202f')} rpm`);
    expect(built.marks[1].text).toMatch(/^Firmware B: fc − fe stays under the target over the whole run-up/);
    expect(built.thread.map((t) => t.who)).toEqual(['engineer', 'lead']);
    expect(built.thread[0].body).toContain('5.0 dB below firmware A');
  });
});
