/**
 * The campaign Trends: outliers by the Hampel identifier against scipy (median and
 * scipy.stats.median_abs_deviation(scale='normal'), made by tests/fixtures/campaigns/make_trend_fixtures.py),
 * a track's level at a speed against numpy.interp of the dB level, the peak against numpy's max, and a
 * tag's axis in natural sort order (plain ordering; common practice).
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import type { ResultRow } from '../../../src/features/campaigns/api/campaigns';
import { buildTrend } from '../../../src/features/campaigns/trend-points';
import { hampelOutliers, levelOf, tagAxis, tagPosition, trendKeyLabel, trendKeys } from '../../../src/features/campaigns/trends';

interface Fixtures {
  hampel: { name: string; values: number[]; median: number; scaledMad: number; outlier: boolean[] }[];
  track: { rpm: number[]; rms: number[]; peakDb: number; peakRpm: number; at: { rpm: number; db: number }[] };
}
const fixtures = JSON.parse(readFileSync(path.join(__dirname, '../../fixtures/campaigns/trend-fixtures.json'), 'utf8')) as Fixtures;

const result = (inverter: Record<string, unknown> | null, extra: Partial<ResultRow> = {}): ResultRow => ({
  id: 1,
  file: 'run.wav',
  ok: true,
  error: null,
  tags: {},
  summary: null,
  inverter,
  createdAt: '2026-12-05T10:00:00.000Z',
  ...extra,
});

const { track } = fixtures;
const family = { m: 2, n: -1, rpm: track.rpm, rms: track.rms, crossing: track.rpm.map(() => false), filtered: track.rpm.map(() => false) };

describe('hampelOutliers', () => {
  for (const set of fixtures.hampel) {
    it(`matches scipy's median and normal-scaled MAD and flags the same points (${set.name})`, () => {
      const fence = hampelOutliers(set.values);
      expect(fence).not.toBeNull();
      expect(fence!.median).toBeCloseTo(set.median, 10);
      expect(fence!.scaledMad).toBeCloseTo(set.scaledMad, 10);
      expect(fence!.outlier).toEqual(set.outlier);
    });
  }

  it('flags nothing when more than half the values are equal (MAD 0) or there are fewer than three', () => {
    expect(hampelOutliers([5, 5, 5, 9])!.outlier).toEqual([false, false, false, false]);
    expect(hampelOutliers([1, 100])).toBeNull();
  });
});

describe('levelOf', () => {
  it('reads the level at a speed by linear interpolation in dB, as numpy.interp does', () => {
    for (const { rpm, db } of track.at) expect(levelOf(result({ families: [family] }), 'family:2:-1', { kind: 'at-speed', rpm })!.db).toBeCloseTo(db, 2);
  });

  it('gives no level outside the track’s speeds, for a failed run, or for a track the run lacks', () => {
    expect(levelOf(result({ families: [family] }), 'family:2:-1', { kind: 'at-speed', rpm: 999 })).toBeNull();
    expect(levelOf(result({ families: [family] }, { ok: false }), 'family:2:-1', { kind: 'peak' })).toBeNull();
    expect(levelOf(result({ families: [family] }), 'order:8', { kind: 'peak' })).toBeNull();
  });

  it('takes the peak of the raw track, leaving out points spoilt by a crossing unless filtered', () => {
    expect(levelOf(result({ families: [family] }), 'family:2:-1', { kind: 'peak' })).toEqual({ db: Number(track.peakDb.toFixed(2)), rpm: track.peakRpm });
    const crossed = { ...family, crossing: track.rpm.map((r) => r === track.peakRpm) };
    expect(levelOf(result({ families: [crossed] }), 'family:2:-1', { kind: 'peak' })!.rpm).not.toBe(track.peakRpm);
    const filtered = { ...crossed, filtered: crossed.crossing };
    expect(levelOf(result({ families: [filtered] }), 'family:2:-1', { kind: 'peak' })!.rpm).toBe(track.peakRpm);
  });

  it('prefers the summary’s peak for a family among the strongest', () => {
    const summary = { carrierScheduleHz: [], shifts: [], spread: { spread: false, widthHz: null }, polePairs: 4, strongestFamilies: [{ m: 2, n: -1, peakDb: -7.5, peakRpm: 4100 }], overallDb: null };
    expect(levelOf(result({ families: [family] }, { summary }), 'family:2:-1', { kind: 'peak' })).toEqual({ db: -7.5, rpm: 4100 });
  });
});

describe('trend keys and tag axes', () => {
  it('lists families (by m, then n) before orders, from summaries and raw objects', () => {
    const keys = trendKeys([result({ families: [family, { m: 1, n: 2 }], orders: [{ order: 48 }, { order: 8 }] })]);
    expect(keys).toEqual(['family:1:2', 'family:2:-1', 'order:8', 'order:48']);
    expect(trendKeyLabel('family:2:-1')).toBe('2fc − fe');
    expect(trendKeyLabel('family:1:2')).toBe('fc + 2fe');
    expect(trendKeyLabel('family:2:0')).toBe('2fc');
  });

  it('plots a numeric tag at its value and any other in natural order (B2 before B10)', () => {
    expect(tagAxis(['25', '-10', '40.5'])).toEqual({ kind: 'numeric' });
    const axis = tagAxis(['B10', 'B2', 'B1', 'B2']);
    expect(axis).toEqual({ kind: 'categorical', values: ['B1', 'B2', 'B10'] });
    expect(tagPosition(axis, 'B10')).toBe(2);
    expect(tagPosition(axis, undefined)).toBeNull();
  });
});

describe('buildTrend', () => {
  // one run per value, its family peak at that level: a summary with that family alone
  const run = (id: number, db: number, tags: Record<string, string>): ResultRow =>
    result(null, {
      id,
      file: `run-${String(id).padStart(3, '0')}.wav`,
      tags,
      summary: { carrierScheduleHz: [], shifts: [], spread: { spread: false, widthHz: null }, polePairs: 4, strongestFamilies: [{ m: 1, n: -1, peakDb: db, peakRpm: 5000 }], overallDb: null },
    });
  const [a, b] = fixtures.hampel;
  const runs = [...a.values.map((db, i) => run(i + 1, db, { build: 'A' })), ...b.values.map((db, i) => run(100 + i, db, { build: 'B' }))];

  it('judges each run against its own category, flagging what scipy flags within each', () => {
    const trend = buildTrend(runs, 'family:1:-1', { kind: 'peak' }, 'build');
    const flagged = (build: string) => trend.points.filter((p) => p.result.tags.build === build).sort((p, q) => p.result.id - q.result.id).map((p) => p.outlier);
    expect(flagged('A')).toEqual(a.outlier);
    expect(flagged('B')).toEqual(b.outlier);
    expect(trend.fences.map((f) => [f.fromX, f.toX])).toEqual([
      [-0.5, 0.5],
      [0.5, 1.5],
    ]);
    // the points stay inside their category's band, in ascending x
    expect(trend.points.every((p, i) => i === 0 || p.x >= trend.points[i - 1].x)).toBe(true);
    expect(trend.points.filter((p) => p.result.tags.build === 'B').every((p) => p.x >= 0.8 && p.x <= 1.2)).toBe(true);
  });

  it('against the order received, judges every run against all of them', () => {
    const trend = buildTrend(runs.slice(0, a.values.length), 'family:1:-1', { kind: 'peak' }, null);
    expect(trend.fences).toHaveLength(1);
    expect(trend.fences[0].median).toBeCloseTo(a.median, 10);
    expect(trend.points.map((p) => p.outlier)).toEqual(a.outlier);
  });
});
