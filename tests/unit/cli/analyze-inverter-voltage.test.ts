/**
 * `analyze inverter` on an inverter's line-to-line voltage, through the whole CLI path. In v_ab the line at
 * m·fc is absent (m + n odd, and the carrier itself cancels between the legs), the strongest lines are
 * fc ± 2fe and 2fc ± fe; the carrier must still come out as fc, never a multiple, and the families at the
 * levels of the double Fourier series (H. S. Black 1953; D. G. Holmes, T. A. Lipo, Pulse Width Modulation
 * for Power Converters, 2003, ch. 3, eq. for A_mn of naturally sampled sine-triangle PWM, times √3 for
 * line-to-line). The case is the one users reported: 4 kHz carrier, 60 Hz fundamental, M = 0.9, sampled at
 * 102.4 kHz, a speed channel at 1800 rpm, 2 pole pairs.
 */
import { execFile } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { promisify } from 'node:util';
import { createRequire } from 'node:module';
import { describe, expect, it } from 'vitest';
import { PROJECT_ROOT } from '../../../server/config';
import { doubleFourierAmplitude, simulateTwoLevelPwm } from '../../../workers/dsp/pwm-simulation';
import { writeWav } from '../../../workers/io/wav-writer';

const run = promisify(execFile);
const FS = 102_400;
const FC = 4000;
const F0 = 60;
const M = 0.9;
const VDC = 400;
const RPM = 1800;
// J_n from the bessel package (checked against tabulated values in tests/unit/dsp/pwm-spectrum.test.ts)
const bessel = createRequire(import.meta.url)('bessel') as { besselj(x: number, n: number): number };
const besselJ = (n: number, x: number) => bessel.besselj(x, n);
const db = (x: number) => 20 * Math.log10(x);

describe('analyze inverter on a line-to-line voltage (naturally sampled sine-triangle PWM)', async () => {
  const dir = mkdtempSync(path.join(tmpdir(), 'fanlight-cli-voltage-'));
  const file = path.join(dir, 'vab.wav');
  const { vab } = simulateTwoLevelPwm({ fsHz: FS, durationS: 3, carrierHz: FC, fundamentalHz: F0, modulationIndex: M, vdc: VDC, oversample: 8 });
  // a speed channel of 1 V per 1000 rpm
  const speed = new Float32Array(vab.length).fill(RPM / 1000);
  writeFileSync(file, writeWav([vab, speed], { sampleRateHz: FS, bits: 32, float: true }));
  const families = [
    [1, 2],
    [1, -2],
    [2, 1],
    [2, -1],
    [1, 4],
    [1, -4],
  ];
  const { stdout } = await run(
    'npm',
    ['run', '-s', 'analyze', '--', 'inverter', file, '--channel', '0', '--speed-channel', '1', '--speed-cal', '1000', '--pole-pairs', '2', '--quantity', 'voltage', '--families', families.map(([m, n]) => `${m}:${n}`).join(',')],
    { cwd: PROJECT_ROOT, maxBuffer: 64 * 1024 * 1024 },
  );
  const report = JSON.parse(stdout) as {
    carrier: { hz: (number | null)[] };
    carrierShifts: unknown[];
    carrierSpreadHz: number | null;
    families: { m: number; n: number; rms: (number | null)[]; crossing: boolean[] }[];
  };

  it('finds the carrier at fc (not 2fc or 5fc), no shift and no spread', () => {
    const hz = report.carrier.hz.filter((h): h is number => h !== null && Number.isFinite(h)).sort((a, b) => a - b);
    expect(hz[hz.length >> 1]).toBeGreaterThan(FC - 13);
    expect(hz[hz.length >> 1]).toBeLessThan(FC + 13);
    expect(report.carrierShifts).toEqual([]);
    expect(report.carrierSpreadHz).toBeNull();
  });

  it.each(families)('tracks the family (%i, %i) within 0.5 dB of the double Fourier series', (m, n) => {
    const want = doubleFourierAmplitude(m, n, M, VDC, besselJ, true) / Math.SQRT2;
    const f = report.families.find((x) => x.m === m && x.n === n)!;
    const levels = f.rms.filter((v, i): v is number => v !== null && !f.crossing[i]);
    expect(levels.length).toBeGreaterThan(0);
    for (const v of levels) expect(Math.abs(db(v) - db(want))).toBeLessThan(0.5);
  });
}, 120_000);
