/**
 * What the Trends plot shows of a campaign's results: the tracks one can pick (families and orders), a
 * level per recording (the peak, or the level at a chosen speed), the x position of a tag's value, and
 * which points stand out. Pure, so unit tests run it without a browser.
 */
import type { ResultRow } from './api/campaigns';

/** `family:m:n` (m·fc + n·fe) or `order:k`, the names the targets use too. */
export type TrendKey = string;

type Loose = Record<string, unknown>;
const isObject = (v: unknown): v is Loose => typeof v === 'object' && v !== null && !Array.isArray(v);
const numbers = (v: unknown): number[] => (Array.isArray(v) ? v.map((x) => (typeof x === 'number' ? x : NaN)) : []);
const flags = (v: unknown): boolean[] => (Array.isArray(v) ? v.map((x) => x === true) : []);

export const familyKey = (m: number, n: number): TrendKey => `family:${m}:${n}`;
export const orderKey = (k: number): TrendKey => `order:${k}`;

export function trendKeyLabel(key: TrendKey): string {
  const [kind, a, b] = key.split(':');
  if (kind === 'order') return `order ${a}`;
  const n = Number(b);
  const carrier = `${a === '1' ? '' : a}fc`;
  if (n === 0) return carrier;
  return `${carrier} ${n < 0 ? '−' : '+'} ${Math.abs(n) === 1 ? '' : Math.abs(n)}fe`;
}

/** One track of the raw inverter object: level against speed, the points a crossing spoils left out. */
interface Track {
  rpm: number[];
  rms: number[];
}

/**
 * The track `key` names in a result's raw inverter object (`families` / `orders`, as `analyze inverter`
 * prints them). A point where two guides cross counts only when the crossing was filtered out, the
 * rule the analysis itself ranks the families by (workers/dsp/inverter-analysis.ts).
 */
function trackOf(inverter: Loose | null, key: TrendKey): Track | null {
  if (!inverter) return null;
  const [kind, a, b] = key.split(':');
  const list = kind === 'order' ? inverter.orders : inverter.families;
  if (!Array.isArray(list)) return null;
  const found = list.find((t) => isObject(t) && (kind === 'order' ? t.order === Number(a) : t.m === Number(a) && t.n === Number(b)));
  if (!isObject(found)) return null;
  const rpm = numbers(found.rpm);
  const rms = numbers(found.rms);
  const crossing = flags(found.crossing);
  const filtered = flags(found.filtered);
  const out: Track = { rpm: [], rms: [] };
  for (let i = 0; i < Math.min(rpm.length, rms.length); i++) {
    if (!Number.isFinite(rpm[i]) || !(rms[i] > 0) || (crossing[i] && !filtered[i])) continue;
    out.rpm.push(rpm[i]);
    out.rms.push(rms[i]);
  }
  return out.rpm.length ? out : null;
}

/** Whether any result carries the track itself (its level against speed), not only the summary's peak: a level at a speed needs it. */
export const anyTrack = (results: ResultRow[], key: TrendKey) => results.some((r) => r.ok && trackOf(r.inverter, key) !== null);

/** The tracks a campaign's results name: the families of the summaries, and those and the orders of the raw objects. */
export function trendKeys(results: ResultRow[]): TrendKey[] {
  const keys = new Set<TrendKey>();
  for (const r of results) {
    for (const f of r.summary?.strongestFamilies ?? []) keys.add(familyKey(f.m, f.n));
    const inv = r.inverter;
    if (!inv) continue;
    for (const f of Array.isArray(inv.families) ? inv.families : []) if (isObject(f) && typeof f.m === 'number' && typeof f.n === 'number') keys.add(familyKey(f.m, f.n));
    for (const o of Array.isArray(inv.orders) ? inv.orders : []) if (isObject(o) && typeof o.order === 'number') keys.add(orderKey(o.order));
  }
  // families first, by m then n; orders after, by order
  const parts = (k: TrendKey) => k.split(':');
  return [...keys].sort((x, y) => {
    const [kx, ax, bx] = parts(x);
    const [ky, ay, by] = parts(y);
    if (kx !== ky) return kx === 'family' ? -1 : 1;
    return Number(ax) - Number(ay) || Number(bx ?? 0) - Number(by ?? 0);
  });
}

/** L = 20·log10(x_rms / 1 unit) dB, the level of a root-power quantity (ISO 80000-3), as the server's summary gives it. */
const dbOf = (rms: number) => 20 * Math.log10(rms);

export type LevelMeasure = { kind: 'peak' } | { kind: 'at-speed'; rpm: number };

export interface TrendLevel {
  db: number;
  /** Where the level was read: the peak's speed, or the chosen one */
  rpm: number;
}

/**
 * A result's level on track `key`: its peak (the summary's when the family is among the strongest, else
 * the raw track's), or the level at `rpm` read by linear interpolation in dB between the two nearest
 * speeds of the track. Null when the result has no such track or the speed lies outside it.
 */
export function levelOf(result: ResultRow, key: TrendKey, measure: LevelMeasure): TrendLevel | null {
  if (!result.ok) return null;
  if (measure.kind === 'peak') {
    const fromSummary = result.summary?.strongestFamilies.find((f) => familyKey(f.m, f.n) === key);
    if (fromSummary) return { db: fromSummary.peakDb, rpm: fromSummary.peakRpm };
  }
  const track = trackOf(result.inverter, key);
  if (!track) return null;
  if (measure.kind === 'peak') {
    let best = 0;
    for (let i = 1; i < track.rms.length; i++) if (track.rms[i] > track.rms[best]) best = i;
    return { db: Number(dbOf(track.rms[best]).toFixed(2)), rpm: track.rpm[best] };
  }
  const order = track.rpm.map((_, i) => i).sort((i, j) => track.rpm[i] - track.rpm[j]);
  const rpm = order.map((i) => track.rpm[i]);
  const db = order.map((i) => dbOf(track.rms[i]));
  const target = measure.rpm;
  if (target < rpm[0] || target > rpm[rpm.length - 1]) return null;
  for (let i = 0; i < rpm.length - 1; i++) {
    if (target > rpm[i + 1]) continue;
    const span = rpm[i + 1] - rpm[i];
    const w = span > 0 ? (target - rpm[i]) / span : 0;
    return { db: Number((db[i] + w * (db[i + 1] - db[i])).toFixed(2)), rpm: target };
  }
  return { db: Number(db[db.length - 1].toFixed(2)), rpm: target };
}

/** Every tag name among the results, A→Z. */
export const tagNames = (results: ResultRow[]) => [...new Set(results.flatMap((r) => Object.keys(r.tags)))].sort((a, b) => a.localeCompare(b));

const naturalOrder = new Intl.Collator('en', { numeric: true, sensitivity: 'base' });

export type TagAxis = { kind: 'numeric' } | { kind: 'categorical'; values: string[] };

/** A tag whose every value is a number (temperature, load in %) is plotted at its value; any other at the place of its value in natural sort order (B2 before B10). */
export function tagAxis(values: string[]): TagAxis {
  const present = values.filter((v) => v.trim() !== '');
  if (present.length > 0 && present.every((v) => Number.isFinite(Number(v)))) return { kind: 'numeric' };
  return { kind: 'categorical', values: [...new Set(present)].sort(naturalOrder.compare) };
}

export const tagPosition = (axis: TagAxis, value: string | undefined): number | null => {
  if (value === undefined || value.trim() === '') return null;
  if (axis.kind === 'numeric') return Number(value);
  const i = axis.values.indexOf(value);
  return i < 0 ? null : i;
};

/** Normal-consistency factor of the MAD: 1/Φ⁻¹(3/4) ≈ 1.4826, so 1.4826·MAD estimates σ for normal data (Rousseeuw & Croux, JASA 88 (1993) 1273–1283). */
export const MAD_NORMAL_SCALE = 1 / 0.6744897501960817;
/** Points beyond median ± 3 scaled MADs are flagged. */
export const OUTLIER_SCALED_MADS = 3;

const median = (sorted: number[]) => {
  const n = sorted.length;
  return n % 2 ? sorted[n >> 1] : (sorted[n / 2 - 1] + sorted[n / 2]) / 2;
};

export interface OutlierFence {
  median: number;
  /** 1.4826·MAD: the MAD scaled to estimate the standard deviation */
  scaledMad: number;
  low: number;
  high: number;
  outlier: boolean[];
}

/**
 * Outliers by the Hampel identifier (F. R. Hampel, JASA 69 (1974) 383–393; common practice in robust
 * statistics): a value further than 3·(1.4826·MAD) from the median, MAD = median |x − median|. The
 * median and MAD are not pulled by the outliers themselves, as a mean and standard deviation would be.
 * With fewer than 3 values, or a MAD of 0 (more than half the values equal), nothing is flagged: there is
 * no spread to judge against.
 */
export function hampelOutliers(values: number[]): OutlierFence | null {
  if (values.length < 3) return null;
  const sorted = [...values].sort((a, b) => a - b);
  const mid = median(sorted);
  const mad = median(values.map((v) => Math.abs(v - mid)).sort((a, b) => a - b));
  const scaledMad = MAD_NORMAL_SCALE * mad;
  const reach = OUTLIER_SCALED_MADS * scaledMad;
  return {
    median: mid,
    scaledMad,
    low: mid - reach,
    high: mid + reach,
    outlier: values.map((v) => scaledMad > 0 && Math.abs(v - mid) > reach),
  };
}
