/**
 * What the Bench saves as a view: the view state (the same zod schema the server takes), the compact
 * snapshot of the visible map (the FLS1 file of server/services/snapshot-codec.ts) and the marks placed
 * on the map. Marks are kept in the map's own terms (x = time or speed, f = frequency) and turned into
 * the snapshot's axes (x across, y up) when saved, so swapping the axes after placing one keeps it right.
 * No DOM here.
 */
import type { z } from 'zod';
import type { InverterReport } from '../../../../workers/dsp/inverter-analysis';
import type { CreateMarkBody, GuideRef, viewStateV1 } from '../../../../server/schemas/views';
import type { SnapshotHeader } from '../../../../workers/io/snapshot-format';
import { quantiseDb } from '../../../../workers/io/snapshot-codec';
import type { GuideLine, GuidesState } from '../map/guides';
import type { MapRaster } from '../map/map-raster';
import type { Viewport } from '../map/viewport';
import { toneText } from '../../../lib/tone-text';
import type { SpeedSource } from '../../../../workers/io/speed-source';

export const SNAPSHOT_MAX_WIDTH = 1024;
export const SNAPSHOT_MAX_HEIGHT = 768;

/** A mark on the Bench's map: waiting for the view to be saved, or one of the saved view's. */
export type BenchMark = (
  | { id: number; kind: 'point'; x: number; f: number; text: string }
  | { id: number; kind: 'box'; x0: number; x1: number; f0: number; f1: number; text: string }
  /** A mark on a whole guide line (an order, or a carrier family m·fc + n·fe); `label` names it */
  | { id: number; kind: 'guide'; guide: GuideRef; label: string; text: string }
) & {
  /** A mark of the saved view the Bench was opened from (id is the server's); else one still to save */
  saved?: true;
  /** The number drawn beside it, when not its place in the list */
  number?: number;
};

export type AxisOnScreen = {
  kind: 'time' | 'speed' | 'frequency';
  from: number;
  to: number;
  unit: string;
  [extra: string]: unknown;
};

/** The two axes as the screen shows them: unswapped, time or speed across and frequency up. */
export function screenAxes(view: Viewport, swapped: boolean, against: 'time' | 'speed'): { x: AxisOnScreen; y: AxisOnScreen } {
  const along: AxisOnScreen = against === 'speed' ? { kind: 'speed', from: view.x[0], to: view.x[1], unit: 'rpm' } : { kind: 'time', from: view.x[0], to: view.x[1], unit: 's' };
  const freq: AxisOnScreen = { kind: 'frequency', from: view.f[0], to: view.f[1], unit: 'Hz' };
  return swapped ? { x: freq, y: along } : { x: along, y: freq };
}

/** A place given in the map's terms, in the snapshot's axes (x across, y up). */
export const toAxes = (x: number, f: number, swapped: boolean) => (swapped ? { x: f, y: x } : { x, y: f });

export function markBody(m: BenchMark, swapped: boolean): CreateMarkBody {
  if (m.kind === 'point') return { kind: 'point', geometry: toAxes(m.x, m.f, swapped), text: m.text };
  if (m.kind === 'guide') return { kind: 'guide', geometry: { guide: m.guide }, text: m.text };
  const a = toAxes(m.x0, m.f0, swapped);
  const b = toAxes(m.x1, m.f1, swapped);
  return {
    kind: 'box',
    geometry: { x0: Math.min(a.x, b.x), x1: Math.max(a.x, b.x), y0: Math.min(a.y, b.y), y1: Math.max(a.y, b.y) },
    text: m.text,
  };
}

/**
 * The visible part of the raster as bytes, row 0 at the y axis's `from` end, column 0 at the x axis's;
 * each byte the maximum over the cells its pixel covers, so a narrow line survives the shrinking.
 */
export function quantiseVisible(
  raster: MapRaster,
  view: Viewport,
  swapped: boolean,
  topDb: number,
  rangeDb: number,
): { width: number; height: number; map: Uint8Array } {
  const { columns, rows, levels } = raster;
  const [X0, X1] = raster.xSpan;
  const [F0, F1] = raster.frequencySpanHz;
  const cells = (lo: number, hi: number, e0: number, e1: number, n: number): [number, number] => {
    const a = Math.max(0, Math.min(n - 1, Math.floor(((lo - e0) / (e1 - e0)) * n)));
    const b = Math.max(a + 1, Math.min(n, Math.ceil(((hi - e0) / (e1 - e0)) * n)));
    return [a, b];
  };
  const [c0, c1] = cells(view.x[0], view.x[1], X0, X1, columns);
  const [r0, r1] = cells(view.f[0], view.f[1], F0, F1, rows);
  const nx = Math.max(1, Math.min(swapped ? SNAPSHOT_MAX_HEIGHT : SNAPSHOT_MAX_WIDTH, c1 - c0));
  const nf = Math.max(1, Math.min(swapped ? SNAPSHOT_MAX_WIDTH : SNAPSHOT_MAX_HEIGHT, r1 - r0));
  // For each output step along x (and f), the cells it covers within the visible window.
  const spans = (n: number, lo: number, hi: number, e0: number, e1: number, total: number) =>
    Array.from({ length: n }, (_, i) => cells(lo + ((hi - lo) * i) / n, lo + ((hi - lo) * (i + 1)) / n, e0, e1, total));
  const xs = spans(nx, view.x[0], view.x[1], X0, X1, columns);
  const fs = spans(nf, view.f[0], view.f[1], F0, F1, rows);
  const width = swapped ? nf : nx;
  const height = swapped ? nx : nf;
  const map = new Uint8Array(width * height);
  for (let i = 0; i < nx; i++) {
    const [ca, cb] = xs[i];
    for (let j = 0; j < nf; j++) {
      const [ra, rb] = fs[j];
      let m = -Infinity;
      for (let c = ca; c < cb; c++) {
        const at = c * rows;
        for (let r = ra; r < rb; r++) if (levels[at + r] > m) m = levels[at + r];
      }
      const v = quantiseDb(m, topDb, rangeDb);
      // unswapped: columns along x, rows along f; swapped: columns along f, rows along x
      if (swapped) map[i * width + j] = v;
      else map[j * width + i] = v;
    }
  }
  return { width, height, map };
}

type ViewStateInput = z.input<typeof viewStateV1>;
type TrackInput = NonNullable<ViewStateInput['selectedTracks']>[number];

export interface BenchViewInputs {
  channelIndex: number;
  window: 'rect' | 'hann' | 'hamming' | 'blackman-harris' | 'flattop';
  blockSize: number;
  overlap: number;
  weighting: 'A' | 'C' | 'Z';
  refRms: number;
  against: 'time' | 'speed';
  swapped: boolean;
  view: Viewport;
  colourScale: string;
  topDb: number;
  rangeDb: number;
  guides: GuidesState;
  lines: GuideLine[];
  report: InverterReport | null;
  polePairs: number | null;
  speedSource: SpeedSource;
  /** Where polePairs came from: typed on the Bench, or inferred from the sideband spacing */
  polePairsSource: 'typed' | 'inferred' | null;
  durationS: number;
  /** The tracks of the selected lines as the dock shows them (guideTracks), each with its name */
  tracks: { series: TrackForSnapshot[]; unit: string } | null;
}

/** Points per track in a snapshot: plenty for a chart a page wide, and the file stays small. */
export const SNAPSHOT_TRACK_POINTS = 2000;

type SnapshotTrack = NonNullable<SnapshotHeader['tracks']>[number];

/** A track as the snapshot takes it: its name, and its levels (dB) along the map's x. */
export interface TrackForSnapshot {
  name: string;
  x: ArrayLike<number>;
  db: ArrayLike<number>;
}

/**
 * The tracks inside the visible x range (time or speed), each at most `limit` points: a longer track
 * is cut into equal runs, each run one point at its middle with the highest level in it (so a narrow
 * peak survives, as in quantiseVisible). Levels that are not finite become null (a gap).
 */
export function snapshotTracks(
  series: TrackForSnapshot[],
  unit: string,
  range: [number, number],
  limit = SNAPSHOT_TRACK_POINTS,
): SnapshotTrack[] {
  const round = (v: number) => Number(v.toPrecision(7));
  return series.slice(0, 64).map((s) => {
    const inside: number[] = [];
    for (let i = 0; i < s.x.length; i++) if (s.x[i] >= range[0] && s.x[i] <= range[1]) inside.push(i);
    const runs = Math.min(limit, inside.length);
    const points: [number, number | null][] = [];
    for (let r = 0; r < runs; r++) {
      const a = Math.floor((r * inside.length) / runs);
      const b = Math.floor(((r + 1) * inside.length) / runs);
      let top = -Infinity;
      for (let j = a; j < b; j++) {
        const v = s.db[inside[j]];
        if (Number.isFinite(v) && v > top) top = v;
      }
      const x = (s.x[inside[a]] + s.x[inside[b - 1]]) / 2;
      points.push([round(x), Number.isFinite(top) ? Math.round(top * 100) / 100 : null]);
    }
    return { name: s.name.slice(0, 120), unit: unit.slice(0, 20), points };
  });
}

const median = (xs: number[]) => {
  const s = xs.filter(Number.isFinite).sort((a, b) => a - b);
  return s.length ? s[s.length >> 1] : Number.NaN;
};

/** The carrier over the run: the detected one, split at its shifts, or else a typed carrier guide's centre. */
function carrierSchedule(report: InverterReport | null, guides: GuidesState, durationS: number) {
  const end = Math.max(durationS, 1e-3);
  const detected = report ? median(report.carrier.hz) : Number.NaN;
  if (report && Number.isFinite(detected) && detected > 0) {
    const shifts = report.carrierShifts.filter((s) => s.t > 0 && s.t < end && s.fromHz > 0 && s.toHz > 0);
    if (shifts.length === 0) return [{ fromS: 0, toS: end, carrierHz: Math.round(detected) }];
    const segments: { fromS: number; toS: number; carrierHz: number }[] = [];
    let from = 0;
    for (const s of shifts) {
      if (s.t > from) segments.push({ fromS: from, toS: s.t, carrierHz: Math.round(s.fromHz) });
      from = s.t;
    }
    segments.push({ fromS: from, toS: end, carrierHz: Math.round(shifts[shifts.length - 1].toHz) });
    return segments.slice(0, 200);
  }
  const typed = guides.carriers.find((c) => !c.hidden && c.source === 'typed' && c.centreHz > 0);
  return typed ? [{ fromS: 0, toS: end, carrierHz: typed.centreHz }] : [];
}

/** The view state, not yet parsed: the caller checks it with createViewBody, as the server will. */
export function benchViewState(p: BenchViewInputs): ViewStateInput {
  const guides: NonNullable<ViewStateInput['guides']> = p.guides.orders.map((o) => ({ kind: 'order' as const, order: o.order, visible: !o.hidden }));
  const families = new Set<string>();
  for (const c of p.guides.carriers) {
    if (c.per !== 'electrical') continue; // a view's families are m·fc ± n·fe
    for (const f of c.families) {
      const key = `${f.m}:${f.n}`;
      if (families.has(key)) continue;
      families.add(key);
      guides.push({ kind: 'family', m: f.m, n: f.n, visible: !c.hidden });
    }
  }
  const selectedTracks: TrackInput[] = [];
  for (const l of p.lines) {
    if (!l.selected) continue;
    if (l.guide.kind === 'order') selectedTracks.push({ kind: 'order', order: l.guide.order });
    else if (l.guide.per === 'electrical') selectedTracks.push({ kind: 'family', m: l.guide.m, n: l.guide.n });
  }
  const axes = screenAxes(p.view, p.swapped, p.against);
  const carrierGuides = p.guides.carriers.slice(0, 20).map((c) => ({
    source: c.source,
    centreHz: c.centreHz,
    per: c.per,
    families: c.families.slice(0, 50).map((f) => ({ m: f.m, n: f.n })),
    visible: !c.hidden,
  }));
  return {
    stateVersion: 1,
    processing: {
      channelIndex: p.channelIndex,
      window: p.window,
      blockSize: p.blockSize,
      overlap: p.overlap,
      scaling: 'rms',
      weighting: p.weighting,
      levelScale: 'db',
      dbReference: p.refRms,
      against: p.against,
    },
    axes: { swapped: p.swapped, x: axes.x, y: axes.y },
    colourRange: { scale: p.colourScale, topDb: p.topDb, rangeDb: p.rangeDb },
    guides: guides.slice(0, 200),
    carrierSchedule: carrierSchedule(p.report, p.guides, p.durationS),
    polePairs: p.polePairs,
    ...(p.polePairs !== null && p.polePairsSource ? { polePairsSource: p.polePairsSource } : {}),
    selectedTracks: selectedTracks.slice(0, 50),
    carrierGuides,
    speedSource: p.speedSource,
  };
}

/** The snapshot's header: the map's size and level range, the axes on screen, the tracks shown, the findings summary. */
export function snapshotHeaderOf(
  p: BenchViewInputs,
  size: { width: number; height: number },
): SnapshotHeader {
  const axes = screenAxes(p.view, p.swapped, p.against);
  const findings: NonNullable<SnapshotHeader['findings']> = [];
  for (const s of p.report?.carrierShifts ?? []) {
    const x = p.against === 'speed' ? s.rpm : s.t;
    const at = Number.isFinite(x) && Number.isFinite(s.toHz) ? toAxes(x, s.toHz, p.swapped) : undefined;
    findings.push({
      kind: 'carrier-shift',
      summary: `Carrier ${Math.round(s.fromHz)} → ${Math.round(s.toHz)} Hz at ${s.t.toFixed(2)} s${Number.isFinite(s.rpm) ? ` (${Math.round(s.rpm)} rpm)` : ''}`,
      ...(at ? { at } : {}),
    });
  }
  if (p.polePairs !== null) {
    const source = p.report?.polePairs.source === 'inferred' && p.report.polePairs.value === p.polePairs ? 'inferred from the sideband spacing' : 'given';
    findings.push({ kind: 'pole-pairs', summary: `${p.polePairs} pole pairs (${source})` });
  }
  for (const t of p.report?.tonality.tones ?? []) {
    const at = p.against === 'time' && Number.isFinite(t.hz) ? toAxes(p.report!.tonality.atS, t.hz, p.swapped) : undefined;
    findings.push({ kind: 'carrier-tone', summary: toneText(t, p.report!.tonality.atS).slice(0, 300), ...(at ? { at } : {}) });
  }
  const selected = p.lines.filter((l) => l.selected);
  if (selected.length > 0) {
    findings.push({ kind: 'selected-tracks', summary: `Tracks shown: ${selected.map((l) => l.label).join(', ')}`.slice(0, 300) });
  }
  return {
    width: size.width,
    height: size.height,
    encoding: 'u8-db',
    dbTop: p.topDb,
    dbRange: p.rangeDb,
    axes: { x: axes.x, y: axes.y },
    ...(p.tracks && p.tracks.series.length > 0 ? { tracks: snapshotTracks(p.tracks.series, p.tracks.unit, p.view.x) } : {}),
    findings: findings.slice(0, 200),
  };
}
