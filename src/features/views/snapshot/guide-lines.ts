/**
 * Where the view's guides lie on the snapshot. An order is f = k·fr with fr = rpm/60; a carrier family
 * is f = m·fc + n·fe with fe = p·fr (p pole pairs). A line can be drawn only when the view carries what
 * its formula needs: against speed, orders always, families when the carrier is one frequency over the
 * run (and, for n ≠ 0, the pole pairs are known); against time, the carrier harmonics (n = 0) from the
 * carrier schedule. Every other guide is listed with the reason it is not drawn. No DOM.
 */
import type { GuideRef, ViewState } from '../../../../server/schemas/views';
import { guideFrequencyHz, guideLabel as nameOf, type Guide } from '../../../../workers/dsp/guide-formula';
import type { AxisSpec } from './axes';

/** A polyline in axis units, [x, y] per point. */
export type Polyline = [number, number][];

export interface GuideLine {
  key: string;
  guide: GuideRef;
  /** "24·fr", "fc+2fe" */
  label: string;
  /** The name the engineer gave it, if any */
  name: string | null;
  visible: boolean;
  /** Empty when the guide cannot be drawn; `reason` then says why. */
  polylines: Polyline[];
  reason: string | null;
}

/** A view's guide (families in electrical orders) as the shared formula takes it. */
const asGuide = (g: GuideRef): Guide => (g.kind === 'order' ? g : { kind: 'family', m: g.m, n: g.n, per: 'electrical' });

export const guideLabel = (g: GuideRef) => nameOf(asGuide(g));

export const guideKey = (g: GuideRef) => (g.kind === 'order' ? `order:${g.order}` : `family:${g.m}:${g.n}`);

export const sameGuide = (a: GuideRef, b: GuideRef) => guideKey(a) === guideKey(b);

interface Frame {
  /** Which axis carries frequency; the other carries speed or time. */
  freqOn: 'x' | 'y';
  freq: AxisSpec;
  other: AxisSpec;
}

function frameOf(axes: { x: AxisSpec; y: AxisSpec }): Frame | null {
  if (axes.y.kind === 'frequency' && axes.x.kind !== 'frequency') return { freqOn: 'y', freq: axes.y, other: axes.x };
  if (axes.x.kind === 'frequency' && axes.y.kind !== 'frequency') return { freqOn: 'x', freq: axes.x, other: axes.y };
  return null;
}

const hzToAxis = (a: AxisSpec, hz: number) => (a.unit.toLowerCase() === 'khz' ? hz / 1000 : hz);
const toRpm = (a: AxisSpec, v: number) => (['rps', 'hz', '1/s'].includes(a.unit.toLowerCase()) ? v * 60 : v);
const toSeconds = (a: AxisSpec, v: number) => (a.unit.toLowerCase() === 'ms' ? v / 1000 : v);
const fromSeconds = (a: AxisSpec, s: number) => (a.unit.toLowerCase() === 'ms' ? s * 1000 : s);

/** The carrier, if it is one frequency over the whole run. */
function steadyCarrierHz(state: ViewState): number | null {
  const hz = new Set(state.carrierSchedule.map((s) => s.carrierHz));
  return hz.size === 1 ? [...hz][0] : null;
}

function resolve(g: GuideRef, state: ViewState, frame: Frame | null): { polylines: Polyline[]; reason: string | null } {
  if (!frame) return { polylines: [], reason: 'The snapshot has no frequency axis.' };
  const { freq, other, freqOn } = frame;
  const point = (o: number, hz: number): [number, number] => {
    const f = hzToAxis(freq, hz);
    return freqOn === 'y' ? [o, f] : [f, o];
  };
  // Straight lines are exact with their two ends; the plot clips what falls outside.
  const acrossSpeed = (hzAt: (rpm: number) => number): Polyline[] => [
    [point(other.from, hzAt(toRpm(other, other.from))), point(other.to, hzAt(toRpm(other, other.to)))],
  ];

  const guide = asGuide(g);
  if (g.kind === 'order') {
    if (other.kind === 'speed') return { polylines: acrossSpeed((rpm) => guideFrequencyHz(guide, { rpm, carrierHz: NaN, polePairs: NaN })), reason: null };
    return { polylines: [], reason: 'Needs the speed over time, which the view does not carry.' };
  }

  const fc = steadyCarrierHz(state);
  if (other.kind === 'speed') {
    if (state.carrierSchedule.length === 0) return { polylines: [], reason: 'Needs the carrier frequency.' };
    if (fc === null) return { polylines: [], reason: 'The carrier changes during the run; the view does not say at which speed.' };
    const p = state.polePairs;
    if (g.n !== 0 && p === null) return { polylines: [], reason: 'Needs the pole pairs.' };
    return { polylines: acrossSpeed((rpm) => guideFrequencyHz(guide, { rpm, carrierHz: fc, polePairs: p ?? NaN })), reason: null };
  }

  if (g.n !== 0) return { polylines: [], reason: 'Needs the speed over time, which the view does not carry.' };
  if (state.carrierSchedule.length === 0) return { polylines: [], reason: 'Needs the carrier frequency.' };
  const t0 = toSeconds(other, other.from);
  const t1 = toSeconds(other, other.to);
  const polylines: Polyline[] = [];
  for (const s of state.carrierSchedule) {
    const a = Math.max(s.fromS, t0);
    const b = Math.min(s.toS, t1);
    const hz = guideFrequencyHz(guide, { rpm: NaN, carrierHz: s.carrierHz, polePairs: NaN });
    if (b > a) polylines.push([point(fromSeconds(other, a), hz), point(fromSeconds(other, b), hz)]);
  }
  return polylines.length > 0 ? { polylines, reason: null } : { polylines: [], reason: 'The carrier schedule lies outside the snapshot.' };
}

/** The view's guides, in their order, with the lines each resolves to on these axes. */
export function guideLines(state: ViewState, axes: { x: AxisSpec; y: AxisSpec } | null): GuideLine[] {
  const frame = axes ? frameOf(axes) : null;
  return state.guides.map((entry) => {
    const guide: GuideRef = entry.kind === 'order' ? { kind: 'order', order: entry.order } : { kind: 'family', m: entry.m, n: entry.n };
    const { polylines, reason } = axes ? resolve(guide, state, frame) : { polylines: [], reason: 'The view has no snapshot yet.' };
    return { key: guideKey(guide), guide, label: guideLabel(guide), name: entry.label ?? null, visible: entry.visible, polylines, reason };
  });
}

/** A guide mark's line, whether or not the view lists that guide. */
export function lineForGuide(g: GuideRef, state: ViewState, axes: { x: AxisSpec; y: AxisSpec } | null): GuideLine {
  const { polylines, reason } = axes ? resolve(g, state, frameOf(axes)) : { polylines: [], reason: 'The view has no snapshot yet.' };
  return { key: guideKey(g), guide: g, label: guideLabel(g), name: null, visible: true, polylines, reason };
}
