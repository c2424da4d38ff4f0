/**
 * A saved view, back on the Bench: the view state (any version the server still reads) turned into the
 * Bench's own settings, guides, viewport and pole pairs, and the view's marks turned back from the
 * snapshot's axes (x across, y up) into the map's terms (x = time or speed, f = frequency). The reverse
 * of view-snapshot.ts. No DOM here.
 */
import type { GuideRef, Mark, ViewDetail, ViewState } from '../../../../server/schemas/views';
import { upgradeViewState } from '../../../../server/schemas/views';
import type { InitialMapSettings } from '../session/use-map-settings';
import type { PoleChoice } from '../session/use-inputs-model';
import type { SpeedSource } from '../../../../workers/io/speed-source';
import { scaleOrDefault } from '../../../lib/plot/colour-scales';
import { guideLabel } from '../../../../workers/dsp/guide-formula';
import { familyLineId, orderLineId, type CarrierGuideSpec, type Family, type GuidesState, type OrderGuideSpec } from '../map/guides';
import type { Viewport } from '../map/viewport';
import type { BenchMark } from './view-snapshot';

/** A saved view the Bench was opened from, and what it restores. */
export interface ViewOnBench {
  view: ViewDetail;
  restore: BenchRestore;
}

/** The map settings (channel, window, block, overlap, weighting, colours, level range) and the rest. */
export interface BenchRestore extends InitialMapSettings {
  against: 'time' | 'speed';
  swapped: boolean;
  /** The zoom, in the map's terms */
  viewport: Viewport;
  guides: GuidesState;
  poles: PoleChoice;
  /** null: the Bench picks one from the channel setup, as for a recording opened afresh */
  speedSource: SpeedSource | null;
}

/**
 * The carrier guides of a view saved before `carrierGuides` existed: its electrical families on one
 * guide, centred on the carrier schedule's one segment, or on the detected carrier when the schedule
 * shifts (the detected one follows the shifts).
 */
function carriersOfOldState(state: ReturnType<typeof upgradeViewState>): { source: 'typed' | 'detected'; centreHz: number; per: 'electrical'; families: Family[]; visible: boolean }[] {
  const families = state.guides.filter((g) => g.kind === 'family');
  if (families.length === 0) return [];
  const schedule = state.carrierSchedule;
  const single = schedule.length === 1 ? schedule[0].carrierHz : null;
  return [
    {
      source: single === null ? 'detected' : 'typed',
      centreHz: single ?? schedule[0]?.carrierHz ?? 0,
      per: 'electrical',
      families: families.map((f) => ({ m: f.m, n: f.n })),
      visible: families.some((f) => f.visible),
    },
  ];
}

export function benchRestoreOf(saved: ViewState): BenchRestore {
  const state = upgradeViewState(saved);
  const p = state.processing;
  const { x, y, swapped } = state.axes;
  const along = x.kind === 'frequency' ? y : x;
  const freq = x.kind === 'frequency' ? x : y;

  let nextId = 1;
  const orders: OrderGuideSpec[] = [];
  for (const g of state.guides) {
    if (g.kind !== 'order' || orders.some((o) => o.order === g.order)) continue;
    orders.push({ id: `k${nextId++}`, order: g.order, hidden: !g.visible });
  }
  orders.sort((a, b) => a.order - b.order);
  const carriers: CarrierGuideSpec[] = (state.carrierGuides ?? carriersOfOldState(state)).map((c) => ({
    id: `c${nextId++}`,
    source: c.source,
    centreHz: c.centreHz,
    per: c.per,
    families: c.families.map((f) => ({ m: f.m, n: f.n })).sort((a, b) => a.m - b.m || a.n - b.n),
    hidden: !c.visible,
  }));

  const selected: string[] = [];
  for (const t of state.selectedTracks) {
    if (t.kind === 'order') {
      const o = orders.find((g) => g.order === t.order);
      if (o) selected.push(orderLineId(o));
    } else if (t.kind === 'family') {
      const c = carriers.find((g) => g.per === 'electrical' && g.families.some((f) => f.m === t.m && f.n === t.n));
      if (c) selected.push(familyLineId(c, { m: t.m, n: t.n }));
    }
  }

  const typedPoles = state.polePairs !== null && state.polePairsSource !== 'inferred';
  return {
    channelIndex: p.channelIndex,
    window: p.window,
    blockSize: p.blockSize,
    overlap: p.overlap,
    weighting: p.weighting,
    colours: scaleOrDefault(state.colourRange.scale),
    topDb: state.colourRange.topDb,
    rangeDb: state.colourRange.rangeDb,
    against: p.against,
    swapped,
    viewport: { x: [along.from, along.to], f: [freq.from, freq.to] },
    guides: { orders, carriers, selected: [...new Set(selected)], nextId },
    poles: typedPoles ? { mode: 'typed', value: state.polePairs! } : { mode: 'inferred' },
    speedSource: state.speedSource ? speedSourceOf(state.speedSource) : null,
  };
}

function speedSourceOf(s: NonNullable<ReturnType<typeof upgradeViewState>['speedSource']>): SpeedSource {
  switch (s.kind) {
    case 'none':
      return { kind: 'none' };
    case 'tacho':
      return { kind: 'tacho', channel: s.channel, ppr: s.ppr, triggerLevel: s.triggerLevel };
    case 'channel':
      return { kind: 'channel', channel: s.channel, rpmPerUnit: s.rpmPerUnit };
    case 'ramp':
      return { kind: 'ramp', startRpm: s.startRpm, endRpm: s.endRpm };
  }
}

/** The name of a guide a mark is on: "8·fr", "fc−2fe". */
export const guideName = (g: GuideRef) => guideLabel(g);

/**
 * A saved mark in the map's terms: a point or box where it was placed, a guide mark with its guide. `id`
 * is the server's mark id, so the Bench can tell a saved mark from one waiting to be saved.
 */
export function markOnMap(mark: Mark, swapped: boolean): BenchMark | null {
  if (mark.kind === 'guide') {
    const guide = (mark.geometry as { guide: GuideRef }).guide;
    return { id: mark.id, kind: 'guide', guide, label: guideName(guide), text: mark.text, saved: true };
  }
  const g = mark.geometry as Record<string, number>;
  if (mark.kind === 'point') {
    return { id: mark.id, kind: 'point', x: swapped ? g.y : g.x, f: swapped ? g.x : g.y, text: mark.text, saved: true };
  }
  if (mark.kind === 'box') {
    return swapped
      ? { id: mark.id, kind: 'box', x0: g.y0, x1: g.y1, f0: g.x0, f1: g.x1, text: mark.text, saved: true }
      : { id: mark.id, kind: 'box', x0: g.x0, x1: g.x1, f0: g.y0, f1: g.y1, text: mark.text, saved: true };
  }
  return null;
}
