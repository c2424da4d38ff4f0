import type { ResultRow } from './api/campaigns';
import { hampelOutliers, levelOf, tagAxis, tagPosition, type LevelMeasure, type OutlierFence, type TagAxis, type TrendKey } from './trends';

export interface TrendPoint {
  result: ResultRow;
  /** Position on the x axis: the tag's value, its category's place (spread a little), or the order received */
  x: number;
  db: number;
  /** Where the level was read, rpm */
  rpm: number;
  outlier: boolean;
}

export interface Trend {
  axis: TagAxis;
  /** Ascending in x, as uPlot takes them */
  points: TrendPoint[];
  fence: OutlierFence | null;
  /** Results without a point: failed, without this track or speed, or without the tag */
  left: ResultRow[];
}

/** Points of one category are spread over this share of the gap between categories, so they do not hide each other. */
const CATEGORY_SPREAD = 0.4;

/** One point per recording: its level on `key` against tag `tag` (null: the order the results came in). */
export function buildTrend(results: ResultRow[], key: TrendKey, measure: LevelMeasure, tag: string | null): Trend {
  const axis: TagAxis = tag === null ? { kind: 'numeric' } : tagAxis(results.map((r) => r.tags[tag] ?? ''));
  const received = [...results].sort((a, b) => a.createdAt.localeCompare(b.createdAt) || a.id - b.id);
  const placed: Omit<TrendPoint, 'outlier'>[] = [];
  const left: ResultRow[] = [];
  for (const [i, result] of received.entries()) {
    const level = levelOf(result, key, measure);
    const x = tag === null ? i + 1 : tagPosition(axis, result.tags[tag]);
    if (!level || x === null) left.push(result);
    else placed.push({ result, x, db: level.db, rpm: level.rpm });
  }
  if (axis.kind === 'categorical') {
    const byCategory = new Map<number, typeof placed>();
    for (const p of placed) byCategory.set(p.x, [...(byCategory.get(p.x) ?? []), p]);
    for (const group of byCategory.values()) {
      if (group.length < 2) continue;
      group.sort((a, b) => a.result.file.localeCompare(b.result.file));
      group.forEach((p, j) => (p.x += CATEGORY_SPREAD * (j / (group.length - 1) - 0.5)));
    }
  }
  const fence = hampelOutliers(placed.map((p) => p.db));
  const points = placed.map((p, i) => ({ ...p, outlier: fence?.outlier[i] ?? false })).sort((a, b) => a.x - b.x);
  return { axis, points, fence, left };
}
