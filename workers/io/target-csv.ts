/**
 * Targets: limit curves of a track's level against speed, piecewise linear between their points, in dB
 * re the channel's reference. A track is an order (`order:48`), a carrier family m·fc + n·fe
 * (`family:1:2`) or the overall level (`overall`). Read from CSV with the header `track,rpm,db`, one
 * point per row (papaparse reads the text). Pure: the server (import), the page and the batch CLI
 * (`--target`) share it.
 */
import Papa from 'papaparse';

export type TrackKey = { kind: 'order'; order: number } | { kind: 'family'; m: number; n: number } | { kind: 'overall' };

/** [rpm, dB] */
export type TargetPoint = [number, number];

export interface TargetCurve {
  track: TrackKey;
  /** Ascending in rpm, at least two */
  points: TargetPoint[];
}

export interface TargetCsvError {
  /** 1-based line of the file (the header is line 1); 0 for the file as a whole */
  row: number;
  field: 'track' | 'rpm' | 'db' | 'file';
  message: string;
}

export const MAX_TARGET_POINTS = 500;

/** "order:48", "family:1:-2", "overall"; null when it is none of them. */
export function parseTrackKey(text: string): TrackKey | null {
  const t = text.trim().toLowerCase();
  if (t === 'overall') return { kind: 'overall' };
  let m = /^order:(\d+(?:\.\d+)?)$/.exec(t);
  if (m) {
    const order = Number(m[1]);
    return order > 0 && order <= 1000 ? { kind: 'order', order } : null;
  }
  m = /^family:(\d+):([+-]?\d+)$/.exec(t);
  if (m) {
    const fm = Number(m[1]);
    const fn = Number(m[2]);
    return fm >= 1 && fm <= 8 && Math.abs(fn) <= 40 ? { kind: 'family', m: fm, n: fn } : null;
  }
  return null;
}

export const trackKeyText = (k: TrackKey): string => (k.kind === 'order' ? `order:${k.order}` : k.kind === 'family' ? `family:${k.m}:${k.n}` : 'overall');

/** The target's level at a speed, linear between its points; NaN outside its speed range. */
export function targetAt(points: TargetPoint[], rpm: number): number {
  if (points.length === 0 || !(rpm >= points[0][0] && rpm <= points[points.length - 1][0])) return NaN;
  for (let i = 1; i < points.length; i++) {
    const [r0, d0] = points[i - 1];
    const [r1, d1] = points[i];
    if (rpm <= r1) return r1 === r0 ? Math.max(d0, d1) : d0 + ((rpm - r0) / (r1 - r0)) * (d1 - d0);
  }
  return points[points.length - 1][1];
}

/** Why a curve's points cannot be a target (null when they can): rows in `rows`, for the message. */
export function targetPointsProblem(points: TargetPoint[]): string | null {
  if (points.length < 2) return 'A target needs at least two points (rpm, dB).';
  if (points.length > MAX_TARGET_POINTS) return `A target has at most ${MAX_TARGET_POINTS} points.`;
  for (let i = 1; i < points.length; i++) if (!(points[i][0] > points[i - 1][0])) return `The speeds must rise from point to point; ${points[i][0]} rpm comes after ${points[i - 1][0]} rpm.`;
  return null;
}

const number = (s: string) => {
  const t = s.trim();
  return t === '' ? Number.NaN : Number(t);
};

/**
 * Targets from CSV text (`track,rpm,db`; comma or semicolon; rows of one track need not be together).
 * Every bad row is reported (by line and field); nothing is returned then.
 */
export function parseTargetCsv(text: string): { ok: true; targets: TargetCurve[] } | { ok: false; errors: TargetCsvError[] } {
  const parsed = Papa.parse<string[]>(text.replace(/^\uFEFF/, ''), { skipEmptyLines: 'greedy', delimitersToGuess: [',', ';', '\t'] });
  const rows = parsed.data;
  const errors: TargetCsvError[] = [];
  if (rows.length === 0) return { ok: false, errors: [{ row: 0, field: 'file', message: 'The file is empty: it needs the header track,rpm,db and a row per point.' }] };
  const header = rows[0].map((c) => c.trim().toLowerCase());
  const at = { track: header.indexOf('track'), rpm: header.indexOf('rpm'), db: header.indexOf('db') };
  if (at.track < 0 || at.rpm < 0 || at.db < 0) {
    return { ok: false, errors: [{ row: 1, field: 'file', message: `The first line must be the header track,rpm,db; it is "${rows[0].join(',')}".` }] };
  }
  const byTrack = new Map<string, { key: TrackKey; points: { rpm: number; db: number; row: number }[] }>();
  for (let i = 1; i < rows.length; i++) {
    const cells = rows[i];
    const line = i + 1;
    const key = parseTrackKey(cells[at.track] ?? '');
    const rpm = number(cells[at.rpm] ?? '');
    const db = number(cells[at.db] ?? '');
    if (!key) errors.push({ row: line, field: 'track', message: `"${cells[at.track] ?? ''}" is not a track: write order:K, family:M:N or overall.` });
    if (!(Number.isFinite(rpm) && rpm >= 0 && rpm <= 1e6)) errors.push({ row: line, field: 'rpm', message: `"${cells[at.rpm] ?? ''}" is not a speed in rpm (0 or more).` });
    if (!(Number.isFinite(db) && Math.abs(db) <= 1000)) errors.push({ row: line, field: 'db', message: `"${cells[at.db] ?? ''}" is not a level in dB.` });
    if (!key || !Number.isFinite(rpm) || !Number.isFinite(db)) continue;
    const name = trackKeyText(key);
    const entry = byTrack.get(name) ?? { key, points: [] };
    entry.points.push({ rpm, db, row: line });
    byTrack.set(name, entry);
  }
  const targets: TargetCurve[] = [];
  for (const [name, { key, points }] of byTrack) {
    points.sort((a, b) => a.rpm - b.rpm);
    for (let i = 1; i < points.length; i++) {
      if (points[i].rpm === points[i - 1].rpm) errors.push({ row: points[i].row, field: 'rpm', message: `${name} has two points at ${points[i].rpm} rpm (lines ${points[i - 1].row} and ${points[i].row}).` });
    }
    const curve: TargetPoint[] = points.map((p) => [p.rpm, p.db]);
    const problem = points.length < 2 ? `${name} has one point; a target needs at least two.` : curve.length > MAX_TARGET_POINTS ? `${name} has more than ${MAX_TARGET_POINTS} points.` : null;
    if (problem) errors.push({ row: points[0].row, field: 'track', message: problem });
    targets.push({ track: key, points: curve });
  }
  if (errors.length) return { ok: false, errors: errors.slice(0, 50) };
  if (targets.length === 0) return { ok: false, errors: [{ row: 0, field: 'file', message: 'The file has a header but no points.' }] };
  return { ok: true, targets };
}
