/**
 * The Bench's guides and the map's geometry. Guide frequencies against the check values of the PWM
 * sideband spectrum, f = m·fc + n·fe with fe = p·rpm/60 (H. S. Black, Modulation Theory, 1953; D. G.
 * Holmes & T. A. Lipo, Pulse Width Modulation for Power Converters, 2003, ch. 3), and of order
 * tracking, f = k·rpm/60 (A. Brandt, Noise and Vibration Analysis, Wiley 2011, order-tracking chapter
 * [from memory]): fc = 10 kHz, p = 4, 3000 rpm → (1, ±2) at 10.4 / 9.6 kHz and (2, ±1) at 20.2 / 19.8 kHz;
 * 6000 rpm → order 48 at 4800 Hz. The viewport arithmetic is plain geometry (common practice).
 */
import { describe, expect, it } from 'vitest';
import { defaultFamilies, guidesReducer, initialGuides, linePoints, lineHz, nearestLine, resolveLines, uniqueLabels } from '../../../src/features/bench/map/guides';
import { boxed, clampViewport, dragged, geometry, panScreen, zoomAbout, type Extents } from '../../../src/features/bench/map/viewport';

const FRAMES = 3;
const rpm = Float64Array.from([3000, 6000, 1500]);

function guides() {
  let g = initialGuides;
  g = guidesReducer(g, { type: 'add-order', order: 48 });
  g = guidesReducer(g, { type: 'add-carrier', source: 'typed', centreHz: 10000, families: [{ m: 1, n: 2 }, { m: 1, n: -2 }, { m: 2, n: 1 }, { m: 2, n: -1 }, { m: 1, n: 0 }] });
  return g;
}

describe('guide lines', () => {
  const lines = resolveLines(guides(), { frames: FRAMES, frameRpm: rpm, polePairs: 4, detectedHz: null });
  const byLabel = (label: string) => lines.find((l) => l.label === label)!;

  it('puts the carrier sidebands where the double Fourier series does (fc 10 kHz, p 4, 3000 rpm)', () => {
    expect(lineHz(byLabel('fc+2fe'), 0)).toBeCloseTo(10400, 9);
    expect(lineHz(byLabel('fc\u22122fe'), 0)).toBeCloseTo(9600, 9);
    expect(lineHz(byLabel('2fc+fe'), 0)).toBeCloseTo(20200, 9);
    expect(lineHz(byLabel('2fc\u2212fe'), 0)).toBeCloseTo(19800, 9);
    expect(lineHz(byLabel('fc'), 0)).toBe(10000);
  });

  it('puts an order through 0 Hz at k·rpm/60 (order 48 at 6000 rpm is 4800 Hz)', () => {
    expect(lineHz(byLabel('48·fr'), 1)).toBeCloseTo(4800, 9);
    // against speed an order is the straight line through the origin
    const pts = linePoints(byLabel('48·fr'), 'speed', new Float64Array(FRAMES), rpm, [0, 9000]);
    expect(pts).toEqual([0, 0, 9000, 7200]);
  });

  it('a detected carrier follows the carrier found per frame; without pole pairs a sideband has no place', () => {
    let g = initialGuides;
    g = guidesReducer(g, { type: 'add-carrier', source: 'detected', centreHz: 0, families: [{ m: 1, n: 1 }, { m: 1, n: 0 }] });
    const detectedHz = Float64Array.from([8000, 8000, 10000]);
    const withPoles = resolveLines(g, { frames: FRAMES, frameRpm: rpm, polePairs: 4, detectedHz });
    expect([0, 1, 2].map((f) => lineHz(withPoles[0], f))).toEqual([8200, 8400, 10100]);
    const noPoles = resolveLines(g, { frames: FRAMES, frameRpm: rpm, polePairs: null, detectedHz });
    expect(Number.isNaN(lineHz(noPoles[0], 0))).toBe(true);
    expect(lineHz(noPoles[1], 2)).toBe(10000); // m·fc needs no pole pairs
  });

  it('breaks a line where the carrier jumps, so the path does not draw a false slope', () => {
    let g = initialGuides;
    g = guidesReducer(g, { type: 'add-carrier', source: 'detected', centreHz: 0, families: [{ m: 1, n: 0 }] });
    const [line] = resolveLines(g, { frames: 3, frameRpm: Float64Array.from([1000, 2000, 3000]), polePairs: 4, detectedHz: Float64Array.from([8000, 8000, 10000]) });
    const pts = linePoints(line, 'time', Float64Array.from([0.1, 0.2, 0.3]), null, [0, 1]);
    expect(pts).toEqual([0.1, 8000, 0.2, 8000, NaN, NaN, 0.3, 10000]);
  });

  it('names the guide nearest the pointer and how far it is', () => {
    const near = nearestLine(lines, 0, 10390, 3000)!;
    expect(near.line.label).toBe('fc+2fe');
    expect(near.deltaHz).toBeCloseTo(-10, 9);
  });

  it('tells the same family on two carriers apart by its carrier', () => {
    let g = initialGuides;
    g = guidesReducer(g, { type: 'add-carrier', source: 'typed', centreHz: 8000, families: [{ m: 1, n: 1 }] });
    g = guidesReducer(g, { type: 'add-carrier', source: 'detected', centreHz: 0, families: [{ m: 1, n: 1 }] });
    const two = resolveLines(g, { frames: 1, frameRpm: null, polePairs: 4, detectedHz: null });
    expect([...uniqueLabels(two).values()]).toEqual(['fc+fe (8000 Hz)', 'fc+fe (detected)']);
  });

  it('starts a carrier with the families its pattern allows (m + n odd for voltage and current)', () => {
    for (const f of defaultFamilies('m+n odd')) expect((f.m + f.n) % 2 !== 0 || f.n === 0).toBe(true);
    for (const f of defaultFamilies('m+n even')) expect((f.m + f.n) % 2 === 0 || f.n === 0).toBe(true);
  });
});

describe('map geometry', () => {
  const e: Extents = { x: [0, 10], f: [0, 20000], minX: 0.1, minF: 50 };

  it('maps domain to screen and back, frequency up or across', () => {
    for (const swapped of [false, true]) {
      const g = geometry({ x: [2, 6], f: [1000, 9000] }, swapped, 800, 400);
      const [px, py] = g.toScreen(3, 5000);
      const back = g.fromScreen(px, py);
      expect(back.x).toBeCloseTo(3, 9);
      expect(back.f).toBeCloseTo(5000, 9);
    }
    // unswapped: time across from the left, frequency up from the bottom
    expect(geometry({ x: [2, 6], f: [1000, 9000] }, false, 800, 400).toScreen(2, 1000)).toEqual([0, 400]);
    // swapped: frequency across, time up
    expect(geometry({ x: [2, 6], f: [1000, 9000] }, true, 800, 400).toScreen(2, 1000)).toEqual([0, 400]);
  });

  it('zooms about a point, which stays where it was on the map', () => {
    const v = zoomAbout({ x: [0, 10], f: [0, 20000] }, e, 0.5, { x: 2, f: 4000 });
    expect(v.x).toEqual([1, 6]);
    expect(v.f).toEqual([2000, 12000]);
  });

  it('keeps the view inside the map and no smaller than the least span', () => {
    expect(clampViewport({ x: [-3, 2], f: [18000, 25000] }, e)).toEqual({ x: [0, 5], f: [13000, 20000] });
    const tiny = clampViewport({ x: [5, 5.01], f: [100, 110] }, e);
    expect(tiny.x[1] - tiny.x[0]).toBeCloseTo(0.1, 9);
    expect(tiny.f[1] - tiny.f[0]).toBeCloseTo(50, 9);
  });

  it('drags the map with the pointer, and pans by screen directions in either orientation', () => {
    const v = { x: [2, 6] as [number, number], f: [1000, 9000] as [number, number] };
    const d = dragged(v, e, false, 800, 400, [400, 200], [300, 200]); // pointer moved left by 1/8 of the width
    expect(d.x[0]).toBeCloseTo(2.5, 9);
    expect(d.f).toEqual(v.f);
    expect(panScreen(v, e, false, 1, 0).x).toEqual([6, 10]);
    expect(panScreen(v, e, true, 1, 0).f).toEqual([9000, 17000]);
  });

  it('zooms to a box drawn on the screen', () => {
    const v = boxed({ x: [0, 10], f: [0, 20000] }, e, false, 1000, 500, [100, 400], [300, 250]);
    expect(v.x[0]).toBeCloseTo(1, 9);
    expect(v.x[1]).toBeCloseTo(3, 9);
    expect(v.f[0]).toBeCloseTo(4000, 9);
    expect(v.f[1]).toBeCloseTo(10000, 9);
  });
});
