/**
 * A view saved on the Bench and opened there again: what benchViewState writes, parsed by the server's
 * own schema, comes back through benchRestoreOf as the same settings, zoom, guides and selected tracks;
 * marks and tracks keep their places. These are round trips of our own formats (no outside reference
 * applies); the schema they pass through is the one the API enforces.
 */
import { describe, expect, it } from 'vitest';
import { viewState, type Mark } from '../../../server/schemas/views';
import { snapshotHeader } from '../../../workers/io/snapshot-format';
import { familyLineId, guidesReducer, initialGuides, orderLineId, resolveLines, type GuidesState } from '../../../src/features/bench/map/guides';
import { benchRestoreOf, markOnMap } from '../../../src/features/bench/view-state/view-restore';
import { benchViewState, markBody, snapshotTracks, type BenchMark, type BenchViewInputs, type TrackForSnapshot } from '../../../src/features/bench/view-state/view-snapshot';

const FRAMES = 40;

function guidesOnBench(): GuidesState {
  let g = initialGuides;
  g = guidesReducer(g, { type: 'add-order', order: 8 });
  g = guidesReducer(g, { type: 'add-order', order: 48 });
  g = guidesReducer(g, { type: 'toggle-order', id: g.orders[1].id }); // 48 hidden
  g = guidesReducer(g, { type: 'add-carrier', source: 'detected', centreHz: 8000, families: [{ m: 1, n: -1 }, { m: 1, n: 0 }, { m: 2, n: 1 }] });
  g = guidesReducer(g, { type: 'add-carrier', source: 'typed', centreHz: 10000, families: [{ m: 1, n: 2 }] });
  g = guidesReducer(g, { type: 'update-carrier', id: g.carriers[1].id, patch: { per: 'shaft', hidden: true } });
  return g;
}

function inputs(swapped: boolean, against: 'time' | 'speed'): BenchViewInputs {
  const guides = guidesOnBench();
  const frameRpm = Float64Array.from({ length: FRAMES }, (_, f) => 1000 + 200 * f);
  const lines = resolveLines(guides, { frames: FRAMES, frameRpm, polePairs: 4, detectedHz: new Float64Array(FRAMES).fill(8000) });
  return {
    channelIndex: 1,
    window: 'blackman-harris',
    blockSize: 4096,
    overlap: 0.5,
    weighting: 'A',
    refRms: 1e-6,
    against,
    swapped,
    view: against === 'time' ? { x: [1.25, 4.5], f: [500, 12000] } : { x: [2000, 6000], f: [500, 12000] },
    colourScale: 'glacier',
    topDb: 112.5,
    rangeDb: 60,
    guides,
    lines,
    report: null,
    polePairs: 4,
    speedSource: { kind: 'tacho', channel: 2, ppr: 60, triggerLevel: 0.5 },
    polePairsSource: 'typed',
    durationS: 6,
    tracks: null,
  };
}

describe('a saved view back on the Bench', () => {
  for (const swapped of [false, true]) {
    for (const against of ['time', 'speed'] as const) {
      it(`restores the settings, the zoom and the guides (against ${against}, ${swapped ? 'swapped' : 'unswapped'})`, () => {
        const p = inputs(swapped, against);
        const state = viewState.parse(JSON.parse(JSON.stringify(benchViewState(p))));
        const r = benchRestoreOf(state);
        expect(r).toMatchObject({
          channelIndex: 1,
          window: 'blackman-harris',
          blockSize: 4096,
          overlap: 0.5,
          weighting: 'A',
          colours: 'glacier',
          topDb: 112.5,
          rangeDb: 60,
          against,
          swapped,
          poles: { mode: 'typed', value: 4 },
          speedSource: { kind: 'tacho', channel: 2, ppr: 60, triggerLevel: 0.5 },
        });
        expect(r.viewport).toEqual(p.view);
        expect(r.guides.orders.map((o) => [o.order, o.hidden])).toEqual([
          [8, false],
          [48, true],
        ]);
        expect(r.guides.carriers.map((c) => ({ source: c.source, centreHz: c.centreHz, per: c.per, hidden: c.hidden, families: c.families }))).toEqual(
          p.guides.carriers.map((c) => ({ source: c.source, centreHz: c.centreHz, per: c.per, hidden: c.hidden, families: c.families })),
        );
        // the tracks shown: order 8 and the first sideband of the detected carrier (guidesReducer selects them)
        const restoredLines = resolveLines(r.guides, { frames: FRAMES, frameRpm: null, polePairs: 4, detectedHz: null });
        expect(restoredLines.filter((l) => l.selected).map((l) => l.label)).toEqual(p.lines.filter((l) => l.selected).map((l) => l.label));
        // ids the reducer goes on from do not clash with the restored ones
        const more = guidesReducer(r.guides, { type: 'add-order', order: 2 });
        expect(new Set([...more.orders.map((o) => o.id), ...more.carriers.map((c) => c.id)]).size).toBe(5);
      });
    }
  }

  it('takes inferred pole pairs as inferred, so the Bench infers them again', () => {
    const p = { ...inputs(false, 'time'), polePairsSource: 'inferred' as const };
    expect(benchRestoreOf(viewState.parse(benchViewState(p))).poles).toEqual({ mode: 'inferred' });
  });

  it('keeps a typed ramp or a speed channel as the speed source', () => {
    for (const speedSource of [
      { kind: 'ramp', startRpm: 800, endRpm: 12000 },
      { kind: 'channel', channel: 3, rpmPerUnit: 1000 },
      { kind: 'none' },
    ] as const) {
      const p = { ...inputs(false, 'time'), speedSource };
      expect(benchRestoreOf(viewState.parse(benchViewState(p))).speedSource).toEqual(speedSource);
    }
    const bad = { ...benchViewState(inputs(false, 'time')), speedSource: { kind: 'channel', channel: 1, rpmPerUnit: 0 } };
    expect(viewState.safeParse(bad).success).toBe(false);
  });

  it('opens a view saved before carrier guides were kept: its families on one carrier', () => {
    const base = {
      stateVersion: 1,
      processing: { channelIndex: 0, window: 'hann', blockSize: 8192, overlap: 0.75, scaling: 'rms', weighting: 'Z', against: 'time' },
      axes: { swapped: false, x: { kind: 'time', from: 0, to: 6, unit: 's' }, y: { kind: 'frequency', from: 0, to: 20000, unit: 'Hz' } },
      colourRange: { scale: 'a scale this client does not know', topDb: 90, rangeDb: 70 },
      guides: [
        { kind: 'order', order: 8 },
        { kind: 'family', m: 1, n: 1 },
        { kind: 'family', m: 1, n: -1 },
      ],
      selectedTracks: [{ kind: 'family', m: 1, n: -1 }],
    };
    const steady = benchRestoreOf(viewState.parse({ ...base, carrierSchedule: [{ fromS: 0, toS: 6, carrierHz: 8000 }] }));
    expect(steady.colours).toBe('ember');
    expect(steady.speedSource).toBeNull(); // the Bench picks one from the channel setup
    expect(steady.guides.carriers).toHaveLength(1);
    expect(steady.guides.carriers[0]).toMatchObject({ source: 'typed', centreHz: 8000, per: 'electrical', families: [{ m: 1, n: -1 }, { m: 1, n: 1 }] });
    expect(steady.guides.selected).toEqual([familyLineId(steady.guides.carriers[0], { m: 1, n: -1 })]);
    expect(steady.guides.orders.map((o) => orderLineId(o))).toHaveLength(1);
    const shifting = benchRestoreOf(
      viewState.parse({
        ...base,
        carrierSchedule: [
          { fromS: 0, toS: 3, carrierHz: 8000 },
          { fromS: 3, toS: 6, carrierHz: 10000 },
        ],
      }),
    );
    expect(shifting.guides.carriers[0].source).toBe('detected');
    expect(benchRestoreOf(viewState.parse(base)).guides.carriers[0].source).toBe('detected');
  });

  it('puts saved marks back where they were placed, swapped or not, and guide marks on their guide', () => {
    const placed: BenchMark[] = [
      { id: 1, kind: 'point', x: 3.2, f: 8100, text: 'carrier step' },
      { id: 2, kind: 'box', x0: 2, x1: 2.5, f0: 7000, f1: 9000, text: 'sidebands' },
    ];
    for (const swapped of [false, true]) {
      for (const m of placed) {
        const body = markBody(m, swapped);
        const mark: Mark = {
          id: 50 + m.id,
          viewId: 9,
          kind: body.kind,
          geometry: body.geometry,
          text: body.text,
          version: 1,
          author: null,
          createdAt: '',
          updatedAt: '',
          commentCount: 0,
        };
        expect(markOnMap(mark, swapped)).toEqual({ ...m, id: 50 + m.id, saved: true });
      }
    }
    const onOrder = { id: 7, viewId: 9, kind: 'guide', geometry: { guide: { kind: 'order', order: 8 } }, text: 'order 8', version: 1, author: null, createdAt: '', updatedAt: '', commentCount: 0 } as Mark;
    expect(markOnMap(onOrder, false)).toEqual({ id: 7, kind: 'guide', guide: { kind: 'order', order: 8 }, label: '8·fr', text: 'order 8', saved: true });
    const onFamily = { ...onOrder, geometry: { guide: { kind: 'family', m: 1, n: -2 } } } as Mark;
    expect(markOnMap(onFamily, true)).toMatchObject({ kind: 'guide', label: 'fc\u22122fe' });
    const placedOnGuide: BenchMark = { id: 3, kind: 'guide', guide: { kind: 'family', m: 2, n: 1 }, label: '2fc+fe', text: 't' };
    expect(markBody(placedOnGuide, true)).toEqual({ kind: 'guide', geometry: { guide: { kind: 'family', m: 2, n: 1 } }, text: 't' });
  });
});

describe('tracks in the snapshot', () => {
  const line = resolveLines(guidesReducer(initialGuides, { type: 'add-order', order: 8 }), { frames: 1, frameRpm: null, polePairs: null, detectedHz: null })[0];
  const series = (n: number, peakAt: number, name = line.label): TrackForSnapshot => ({
    name,
    x: Array.from({ length: n }, (_, i) => i * 0.01),
    db: Array.from({ length: n }, (_, i) => (i === peakAt ? 95 : i % 50 === 7 ? Number.NaN : 60)),
  });

  it('keeps the visible range only, at most the point limit, and a one-frame peak', () => {
    const [t] = snapshotTracks([series(10000, 4321, 'order 8')], 'dB re 1 µm/s²', [10, 80], 500);
    expect(t.name).toBe('order 8');
    expect(t.points).toHaveLength(500);
    expect(Math.min(...t.points.map((p) => p[0]))).toBeGreaterThanOrEqual(10);
    expect(Math.max(...t.points.map((p) => p[0]))).toBeLessThanOrEqual(80);
    expect(Math.max(...t.points.map((p) => p[1] ?? -Infinity))).toBe(95);
  });

  it('turns levels outside the spectrum into gaps, and the header passes the server schema', () => {
    const [t] = snapshotTracks([series(100, -1)], 'dB(A) re 20 µPa', [0, 1]);
    expect(t.name).toBe(line.label);
    expect(t.points).toHaveLength(100);
    expect(t.points.filter((p) => p[1] === null).length).toBe(2); // i = 7 and 57
    const header = snapshotHeader.parse({
      width: 10,
      height: 10,
      encoding: 'u8-db',
      dbTop: 100,
      dbRange: 60,
      axes: { x: { kind: 'time', from: 0, to: 1, unit: 's' }, y: { kind: 'frequency', from: 0, to: 1000, unit: 'Hz' } },
      tracks: [t],
    });
    expect(header.tracks?.[0].points).toHaveLength(100);
  });
});
