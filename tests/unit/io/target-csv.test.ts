/**
 * Targets (workers/io/target-csv.ts): the track grammar, the level between points (hand-computed), and the
 * CSV reader's answers, good and bad, with the line and the field of each fault.
 */
import { describe, expect, it } from 'vitest';
import { MAX_TARGET_POINTS, parseTargetCsv, parseTrackKey, targetAt, targetPointsProblem, trackKeyText, type TargetPoint } from '../../../workers/io/target-csv';

describe('track keys', () => {
  it('reads orders, carrier families and the overall level, in any case and with spaces around', () => {
    expect(parseTrackKey('order:48')).toEqual({ kind: 'order', order: 48 });
    expect(parseTrackKey(' ORDER:0.5 ')).toEqual({ kind: 'order', order: 0.5 });
    expect(parseTrackKey('family:1:+2')).toEqual({ kind: 'family', m: 1, n: 2 });
    expect(parseTrackKey('family:2:-1')).toEqual({ kind: 'family', m: 2, n: -1 });
    expect(parseTrackKey('Overall')).toEqual({ kind: 'overall' });
  });

  it('refuses what is out of range or not of the grammar', () => {
    for (const bad of ['order:0', 'order:1000.5', 'order:-2', 'order:', 'order:4e1', 'family:0:1', 'family:9:1', 'family:1:41', 'family:1.5:2', 'family:1', 'band:1000', '', 'overall level']) {
      expect(parseTrackKey(bad), bad).toBeNull();
    }
  });

  it('writes each track in one form', () => {
    expect(trackKeyText(parseTrackKey('order:48.50')!)).toBe('order:48.5');
    expect(trackKeyText(parseTrackKey('family:01:+2')!)).toBe('family:1:2');
    expect(trackKeyText({ kind: 'overall' })).toBe('overall');
  });
});

describe('targetAt', () => {
  const curve: TargetPoint[] = [
    [1000, 60],
    [2000, 70],
    [4000, 66],
  ];

  it('is linear between points', () => {
    // 60 + (1500 − 1000)/(2000 − 1000)·(70 − 60) = 65
    expect(targetAt(curve, 1500)).toBeCloseTo(65, 12);
    // 70 + (3000 − 2000)/(4000 − 2000)·(66 − 70) = 68
    expect(targetAt(curve, 3000)).toBeCloseTo(68, 12);
    // 70 + (2500 − 2000)/2000·(−4) = 69
    expect(targetAt(curve, 2500)).toBeCloseTo(69, 12);
  });

  it('takes the points themselves at their speeds, the ends included', () => {
    expect(targetAt(curve, 1000)).toBe(60);
    expect(targetAt(curve, 2000)).toBe(70);
    expect(targetAt(curve, 4000)).toBe(66);
  });

  it('is NaN outside the curve, for a speed that is no number, and for no points', () => {
    expect(targetAt(curve, 999.9)).toBeNaN();
    expect(targetAt(curve, 4000.1)).toBeNaN();
    expect(targetAt(curve, Number.NaN)).toBeNaN();
    expect(targetAt([], 1000)).toBeNaN();
  });
});

describe('targetPointsProblem', () => {
  it('needs two points, at most the maximum, and rising speeds', () => {
    expect(
      targetPointsProblem([
        [0, 1],
        [10, 2],
      ]),
    ).toBeNull();
    expect(targetPointsProblem([[1000, 60]])).toMatch(/at least two/);
    const many: TargetPoint[] = Array.from({ length: MAX_TARGET_POINTS + 1 }, (_, i) => [i * 10, 60]);
    expect(targetPointsProblem(many)).toMatch(/at most 500/);
    expect(targetPointsProblem(many.slice(0, MAX_TARGET_POINTS))).toBeNull();
    expect(
      targetPointsProblem([
        [1000, 60],
        [1000, 62],
      ]),
    ).toMatch(/1000 rpm comes after 1000 rpm/);
    expect(
      targetPointsProblem([
        [2000, 60],
        [1000, 62],
      ]),
    ).toMatch(/rise/);
  });
});

describe('parseTargetCsv', () => {
  it('groups the rows by track and sorts each curve by speed', () => {
    const csv = ['track,rpm,db', 'order:48,2000,70', 'family:1:2,1000,55', 'order:48,1000,60', 'family:1:+2,3000,58', 'order:48,4000,66', ''].join('\n');
    const parsed = parseTargetCsv(csv);
    expect(parsed).toEqual({
      ok: true,
      targets: [
        {
          track: { kind: 'order', order: 48 },
          points: [
            [1000, 60],
            [2000, 70],
            [4000, 66],
          ],
        },
        {
          track: { kind: 'family', m: 1, n: 2 },
          points: [
            [1000, 55],
            [3000, 58],
          ],
        },
      ],
    });
  });

  it('takes semicolons, a byte order mark, upper-case headers, other column orders and blank lines', () => {
    const parsed = parseTargetCsv('\uFEFFdB;Track;RPM\r\n72.5;overall;800\r\n\r\n74;OVERALL;1600\r\n');
    expect(parsed).toEqual({
      ok: true,
      targets: [
        {
          track: { kind: 'overall' },
          points: [
            [800, 72.5],
            [1600, 74],
          ],
        },
      ],
    });
  });

  it('reports every bad row by its line and field, and returns no targets', () => {
    const csv = ['track,rpm,db', 'order:48,1000,60', 'order:48,abc,70', 'order:0,1000,60', 'order:48,3000,', 'order:48,-5,61', 'order:48,4000,72'].join('\n');
    const parsed = parseTargetCsv(csv);
    expect(parsed.ok).toBe(false);
    if (parsed.ok) return;
    expect(parsed.errors.map(({ row, field }) => ({ row, field }))).toEqual([
      { row: 3, field: 'rpm' },
      { row: 4, field: 'track' },
      { row: 5, field: 'db' },
      { row: 6, field: 'rpm' },
    ]);
    expect(parsed.errors[0].message).toBe('"abc" is not a speed in rpm (0 or more).');
    expect(parsed.errors[1].message).toMatch(/"order:0" is not a track/);
  });

  it('names both lines of two points of one track at the same speed', () => {
    const parsed = parseTargetCsv(['track,rpm,db', 'order:48,1000,60', 'order:48,2000,70', 'order:48,1000,62'].join('\n'));
    expect(parsed).toEqual({
      ok: false,
      errors: [{ row: 4, field: 'rpm', message: 'order:48 has two points at 1000 rpm (lines 2 and 4).' }],
    });
  });

  it('refuses a track with a single point, at the line of that point', () => {
    const parsed = parseTargetCsv(['track,rpm,db', 'order:48,1000,60', 'overall,1500,80', 'order:48,2000,70'].join('\n'));
    expect(parsed).toEqual({ ok: false, errors: [{ row: 3, field: 'track', message: 'overall has one point; a target needs at least two.' }] });
  });

  it('refuses a file without the header, an empty file, and a header alone', () => {
    const noHeader = parseTargetCsv('order:48,1000,60\norder:48,2000,70');
    expect(noHeader.ok).toBe(false);
    if (!noHeader.ok) expect(noHeader.errors).toEqual([{ row: 1, field: 'file', message: 'The first line must be the header track,rpm,db; it is "order:48,1000,60".' }]);
    const otherHeader = parseTargetCsv('speed,level\n1000,60');
    expect(!otherHeader.ok && otherHeader.errors[0]).toMatchObject({ row: 1, field: 'file' });
    expect(parseTargetCsv('')).toMatchObject({ ok: false, errors: [{ row: 0, field: 'file' }] });
    expect(parseTargetCsv('track,rpm,db\n')).toEqual({ ok: false, errors: [{ row: 0, field: 'file', message: 'The file has a header but no points.' }] });
  });

  it('refuses a track of more than the maximum number of points', () => {
    const rows = Array.from({ length: MAX_TARGET_POINTS + 1 }, (_, i) => `order:2,${i * 10},60`);
    const parsed = parseTargetCsv(['track,rpm,db', ...rows].join('\n'));
    expect(parsed).toEqual({ ok: false, errors: [{ row: 2, field: 'track', message: `order:2 has more than ${MAX_TARGET_POINTS} points.` }] });
  });
});
