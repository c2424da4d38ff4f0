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

/** The Hampel fence of the points between fromX and toX (all of them when both are null). */
export interface TrendFence extends Omit<OutlierFence, 'outlier'> {
  fromX: number | null;
  toX: number | null;
}

export interface Trend {
  axis: TagAxis;
  /** Ascending in x, as uPlot takes them */
  points: TrendPoint[];
  fences: TrendFence[];
  /** Results without a point: failed, without this track or speed, or without the tag */
  left: ResultRow[];
}

/** Points of one category are spread over this share of the gap between categories, so they do not hide each other. */
const CATEGORY_SPREAD = 0.4;

type Placed = Omit<TrendPoint, 'outlier'> & { outlier: boolean };

function fenceOver(points: Placed[], fromX: number | null, toX: number | null): TrendFence | null {
  const fence = hampelOutliers(points.map((p) => p.db));
  if (!fence) return null;
  points.forEach((p, i) => (p.outlier = fence.outlier[i]));
  const { outlier: _flags, ...rest } = fence;
  return { ...rest, fromX, toX };
}

/**
 * One point per recording: its level on `key` against tag `tag` (null: the order the results came in).
 * Against a categorical tag (a build, a firmware) a run is judged against the runs of its own category,
 * so a whole build being louder reads as the trend it is and a run unlike its build mates stands out;
 * against a numeric tag or the order received, against all the runs.
 */
export function buildTrend(results: ResultRow[], key: TrendKey, measure: LevelMeasure, tag: string | null): Trend {
  const axis: TagAxis = tag === null ? { kind: 'numeric' } : tagAxis(results.map((r) => r.tags[tag] ?? ''));
  const received = [...results].sort((a, b) => a.createdAt.localeCompare(b.createdAt) || a.id - b.id);
  const placed: Placed[] = [];
  const left: ResultRow[] = [];
  for (const [i, result] of received.entries()) {
    const level = levelOf(result, key, measure);
    const x = tag === null ? i + 1 : tagPosition(axis, result.tags[tag]);
    if (!level || x === null) left.push(result);
    else placed.push({ result, x, db: level.db, rpm: level.rpm, outlier: false });
  }
  const fences: TrendFence[] = [];
  if (axis.kind === 'categorical') {
    const byCategory = new Map<number, Placed[]>();
    for (const p of placed) byCategory.set(p.x, [...(byCategory.get(p.x) ?? []), p]);
    for (const [category, group] of byCategory) {
      const fence = fenceOver(group, category - 0.5, category + 0.5);
      if (fence) fences.push(fence);
      if (group.length < 2) continue;
      group.sort((a, b) => a.result.file.localeCompare(b.result.file));
      group.forEach((p, j) => (p.x += CATEGORY_SPREAD * (j / (group.length - 1) - 0.5)));
    }
  } else {
    const fence = fenceOver(placed, null, null);
    if (fence) fences.push(fence);
  }
  return { axis, points: placed.sort((a, b) => a.x - b.x), fences, left };
}
