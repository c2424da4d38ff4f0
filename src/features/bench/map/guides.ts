/**
 * Guides drawn over the map, as the engineer sets them up, and the lines they resolve to. Order
 * guides pass through 0 Hz, f = k·fr; a carrier guide is a centre fc (typed, picked, or the detected
 * carrier, which follows its shifts) with families m·fc + n·fe (n in electrical orders, fe = p·fr) or
 * m·fc + k·fr (k in shaft orders). The frequencies and names come from workers/dsp/guide-formula.ts. No DOM.
 */
import { familyDetail, familyLabel, orderDetail, orderLabel, type FamilyPer } from '../../../../workers/dsp/guide-formula';
import { guideHz, type Guide, type GuideContext } from '../../../../workers/dsp/tracks';

export type { FamilyPer };

export interface OrderGuideSpec {
  id: string;
  order: number;
  hidden: boolean;
}

export interface Family {
  m: number;
  n: number;
}

export interface CarrierGuideSpec {
  id: string;
  source: 'typed' | 'detected';
  /** The typed or picked centre, Hz (used when the source is 'typed') */
  centreHz: number;
  per: FamilyPer;
  families: Family[];
  hidden: boolean;
}

export interface GuidesState {
  orders: OrderGuideSpec[];
  carriers: CarrierGuideSpec[];
  /** Line ids whose tracks are shown; they are drawn in the accent colour */
  selected: string[];
  nextId: number;
}

export const initialGuides: GuidesState = { orders: [], carriers: [], selected: [], nextId: 1 };

export type GuidesAction =
  | { type: 'add-order'; order: number }
  | { type: 'add-next-order' }
  | { type: 'remove-order'; id: string }
  | { type: 'toggle-order'; id: string }
  | { type: 'add-carrier'; source: 'typed' | 'detected'; centreHz: number; families: Family[] }
  | { type: 'update-carrier'; id: string; patch: Partial<Pick<CarrierGuideSpec, 'source' | 'centreHz' | 'per' | 'hidden'>> }
  | { type: 'remove-carrier'; id: string }
  | { type: 'add-family'; id: string; family: Family }
  | { type: 'remove-family'; id: string; family: Family }
  | { type: 'toggle-selected'; lineId: string };

export const orderLineId = (g: OrderGuideSpec) => `o${g.id}`;
export const familyLineId = (c: CarrierGuideSpec, f: Family) => `${c.id}:${f.m}:${f.n}`;

const sameFamily = (a: Family, b: Family) => a.m === b.m && a.n === b.n;

/** The next whole order above the highest one there is. */
export function nextOrder(orders: OrderGuideSpec[]): number {
  const top = orders.reduce((m, o) => Math.max(m, Math.floor(o.order)), 0);
  return top + 1;
}

export function guidesReducer(s: GuidesState, a: GuidesAction): GuidesState {
  switch (a.type) {
    case 'add-next-order':
      return guidesReducer(s, { type: 'add-order', order: nextOrder(s.orders) });
    case 'add-order': {
      if (!(a.order > 0) || s.orders.some((o) => o.order === a.order)) return s;
      const g: OrderGuideSpec = { id: `k${s.nextId}`, order: a.order, hidden: false };
      const orders = [...s.orders, g].sort((x, y) => x.order - y.order);
      return { ...s, orders, selected: [...s.selected, orderLineId(g)], nextId: s.nextId + 1 };
    }
    case 'remove-order': {
      const g = s.orders.find((o) => o.id === a.id);
      if (!g) return s;
      return { ...s, orders: s.orders.filter((o) => o !== g), selected: s.selected.filter((id) => id !== orderLineId(g)) };
    }
    case 'toggle-order':
      return { ...s, orders: s.orders.map((o) => (o.id === a.id ? { ...o, hidden: !o.hidden } : o)) };
    case 'add-carrier': {
      const c: CarrierGuideSpec = {
        id: `c${s.nextId}`,
        source: a.source,
        centreHz: a.centreHz,
        per: 'electrical',
        families: a.families,
        hidden: false,
      };
      const first = a.families.find((f) => f.n !== 0) ?? a.families[0];
      return { ...s, carriers: [...s.carriers, c], selected: first ? [...s.selected, familyLineId(c, first)] : s.selected, nextId: s.nextId + 1 };
    }
    case 'update-carrier':
      return { ...s, carriers: s.carriers.map((c) => (c.id === a.id ? { ...c, ...a.patch } : c)) };
    case 'remove-carrier':
      return {
        ...s,
        carriers: s.carriers.filter((c) => c.id !== a.id),
        selected: s.selected.filter((id) => !id.startsWith(`${a.id}:`)),
      };
    case 'add-family':
      return {
        ...s,
        carriers: s.carriers.map((c) =>
          c.id === a.id && !c.families.some((f) => sameFamily(f, a.family))
            ? { ...c, families: [...c.families, a.family].sort((x, y) => x.m - y.m || x.n - y.n) }
            : c,
        ),
      };
    case 'remove-family': {
      const c = s.carriers.find((x) => x.id === a.id);
      if (!c) return s;
      const lineId = familyLineId(c, a.family);
      return {
        ...s,
        carriers: s.carriers.map((x) => (x === c ? { ...x, families: x.families.filter((f) => !sameFamily(f, a.family)) } : x)),
        selected: s.selected.filter((id) => id !== lineId),
      };
    }
    case 'toggle-selected':
      return {
        ...s,
        selected: s.selected.includes(a.lineId) ? s.selected.filter((id) => id !== a.lineId) : [...s.selected, a.lineId],
      };
  }
}

/** Families a new carrier guide starts with: the ones the detected pattern allows, else the force pattern (m + n even). */
export function defaultFamilies(pattern: 'm+n odd' | 'm+n even' | null): Family[] {
  if (pattern === 'm+n odd') return [{ m: 1, n: 0 }, { m: 1, n: -2 }, { m: 1, n: 2 }, { m: 2, n: -1 }, { m: 2, n: 1 }];
  return [{ m: 1, n: 0 }, { m: 1, n: -1 }, { m: 1, n: 1 }, { m: 1, n: -3 }, { m: 1, n: 3 }, { m: 2, n: 0 }, { m: 2, n: -2 }, { m: 2, n: 2 }];
}

export interface GuideLine {
  id: string;
  kind: 'order' | 'family';
  /** "8·fr", "fc+fe" */
  label: string;
  /** "k 8", "m 1, n +1" */
  detail: string;
  guide: Guide;
  ctx: GuideContext;
  selected: boolean;
  carrierId?: string;
  /** "8000 Hz", "detected": tells the families of two carrier guides apart */
  carrierName?: string;
}

/** Labels that stay unique when two carrier guides have the same families: "fc−fe (8000 Hz)". */
export function uniqueLabels(lines: GuideLine[]): Map<string, string> {
  const count = new Map<string, number>();
  for (const l of lines) count.set(l.label, (count.get(l.label) ?? 0) + 1);
  return new Map(lines.map((l) => [l.id, (count.get(l.label) ?? 0) > 1 && l.carrierName ? `${l.label} (${l.carrierName})` : l.label]));
}

export interface GuideEnvironment {
  frames: number;
  /** Speed per frame, rpm (null without a speed source) */
  frameRpm: Float64Array | null;
  polePairs: number | null;
  /** The detected carrier per frame, Hz */
  detectedHz: Float64Array | null;
}

/** The visible lines of the guides, each with the context its frequency is taken in. */
export function resolveLines(s: GuidesState, env: GuideEnvironment): GuideLine[] {
  const rpm = env.frameRpm ?? new Float64Array(env.frames).fill(NaN);
  const lines: GuideLine[] = [];
  const orderCtx: GuideContext = { rpm };
  for (const o of s.orders) {
    if (o.hidden) continue;
    const id = orderLineId(o);
    lines.push({ id, kind: 'order', label: orderLabel(o.order), detail: orderDetail(o.order), guide: { kind: 'order', order: o.order }, ctx: orderCtx, selected: s.selected.includes(id) });
  }
  for (const c of s.carriers) {
    if (c.hidden) continue;
    const carrierHz = c.source === 'detected' ? (env.detectedHz ?? new Float64Array(env.frames).fill(NaN)) : new Float64Array(env.frames).fill(c.centreHz);
    const ctx: GuideContext = { rpm, carrierHz, polePairs: env.polePairs ?? NaN };
    for (const f of c.families) {
      const id = familyLineId(c, f);
      lines.push({
        id,
        kind: 'family',
        label: familyLabel(f.m, f.n, c.per),
        detail: familyDetail(f.m, f.n, c.per),
        guide: { kind: 'family', m: f.m, n: f.n, per: c.per },
        ctx,
        selected: s.selected.includes(id),
        carrierId: c.id,
        carrierName: c.source === 'detected' ? 'detected' : `${c.centreHz} Hz`,
      });
    }
  }
  return lines;
}

export const lineHz = (line: GuideLine, frame: number) => guideHz(line.guide, line.ctx, frame);

/** Whether a line's frequency jumps between two frames (a carrier shift): the path is broken there. */
const jumps = (a: number, b: number) => Math.abs(b - a) > Math.max(150, 0.015 * Math.abs(a));

/**
 * Points [x, f] of a line, NaN pairs where it breaks. Against time, one point per frame; against
 * speed, orders are straight lines through 0 and families one point per frame at its speed.
 */
export function linePoints(line: GuideLine, against: 'time' | 'speed', frameTimes: Float64Array, frameRpm: Float64Array | null, xRange: [number, number]): number[] {
  const out: number[] = [];
  if (against === 'speed' && line.kind === 'order' && line.guide.kind === 'order') {
    const k = line.guide.order;
    const [a, b] = [Math.max(0, xRange[0]), Math.max(0, xRange[1])];
    out.push(a, (k * a) / 60, b, (k * b) / 60);
    return out;
  }
  const frames = frameTimes.length;
  let prev = NaN;
  for (let f = 0; f < frames; f++) {
    const x = against === 'time' ? frameTimes[f] : (frameRpm?.[f] ?? NaN);
    const hz = lineHz(line, f);
    if (!Number.isFinite(x) || !Number.isFinite(hz) || (Number.isFinite(prev) && jumps(prev, hz))) out.push(NaN, NaN);
    if (Number.isFinite(x) && Number.isFinite(hz)) out.push(x, hz);
    prev = hz;
  }
  return out;
}

export interface NearestGuide {
  line: GuideLine;
  hz: number;
  /** Pointer frequency minus the guide's, Hz */
  deltaHz: number;
}

/** The visible line nearest in frequency to a point of the map at a frame. */
export function nearestLine(lines: GuideLine[], frame: number, fHz: number, rpm: number | null): NearestGuide | null {
  let best: NearestGuide | null = null;
  for (const line of lines) {
    const hz = line.kind === 'order' && line.guide.kind === 'order' && rpm !== null && Number.isFinite(rpm) ? (line.guide.order * rpm) / 60 : lineHz(line, frame);
    if (!Number.isFinite(hz)) continue;
    const d = fHz - hz;
    if (!best || Math.abs(d) < Math.abs(best.deltaHz)) best = { line, hz, deltaHz: d };
  }
  return best;
}
