/**
 * The map's colour scales: 256-entry lookup tables, dark to light, built from a few control points in
 * CIELAB (CIE 1976 L*a*b*, D65 white) that are ours. Between points the scale runs linearly in L*a*b*,
 * with the points placed by their lightness, so L* rises evenly from the first entry to the last and a
 * level step reads as the same step of lightness anywhere on the scale. A colour outside the sRGB gamut
 * keeps its lightness and hue and loses chroma until it fits.
 * Conversions: CIELAB → XYZ (CIE 15:2004, §8.2.1) and XYZ → sRGB (IEC 61966-2-1:1999).
 */

export const colourScaleNames = ['ember', 'glacier', 'grey'] as const;
export type ColourScaleName = (typeof colourScaleNames)[number];

export const colourScaleLabel: Record<ColourScaleName, string> = {
  ember: 'Ember',
  glacier: 'Glacier',
  grey: 'Grey',
};

type Lab = [number, number, number];

// Control points [L*, a*, b*], lightness rising.
const CONTROL_POINTS: Record<ColourScaleName, Lab[]> = {
  // night indigo → plum → brick red → orange → amber → cream
  ember: [
    [7, 9, -20],
    [26, 36, -30],
    [45, 56, 14],
    [64, 40, 60],
    [83, 10, 76],
    [98, -3, 20],
  ],
  // deep navy → blue → steel blue → sea green-cyan → ice white
  glacier: [
    [7, 3, -16],
    [28, 12, -50],
    [50, -8, -40],
    [73, -30, -14],
    [98, -5, -3],
  ],
  grey: [
    [6, 0, 0],
    [98, 0, 0],
  ],
};

const WHITE = [0.95047, 1, 1.08883];

function labToLinearRgb([l, a, b]: Lab): [number, number, number] {
  const fy = (l + 16) / 116;
  const fx = fy + a / 500;
  const fz = fy - b / 200;
  const inv = (t: number) => (t > 6 / 29 ? t * t * t : 3 * (6 / 29) ** 2 * (t - 4 / 29));
  const x = WHITE[0] * inv(fx);
  const y = WHITE[1] * inv(fy);
  const z = WHITE[2] * inv(fz);
  return [3.2406 * x - 1.5372 * y - 0.4986 * z, -0.9689 * x + 1.8758 * y + 0.0415 * z, 0.0557 * x - 0.204 * y + 1.057 * z];
}

const inGamut = (rgb: number[]) => rgb.every((v) => v >= -1e-6 && v <= 1 + 1e-6);
const encode = (v: number) => {
  const c = Math.min(1, Math.max(0, v));
  return Math.round(255 * (c <= 0.0031308 ? 12.92 * c : 1.055 * c ** (1 / 2.4) - 0.055));
};

/** sRGB of a CIELAB colour, its chroma reduced (bisection) when it lies outside the gamut. */
export function labToSrgb(lab: Lab): [number, number, number] {
  let rgb = labToLinearRgb(lab);
  if (!inGamut(rgb)) {
    let lo = 0;
    let hi = 1;
    for (let i = 0; i < 24; i++) {
      const mid = (lo + hi) / 2;
      if (inGamut(labToLinearRgb([lab[0], lab[1] * mid, lab[2] * mid]))) lo = mid;
      else hi = mid;
    }
    rgb = labToLinearRgb([lab[0], lab[1] * lo, lab[2] * lo]);
  }
  return [encode(rgb[0]), encode(rgb[1]), encode(rgb[2])];
}

function buildLut(points: Lab[]): Uint8Array {
  const lut = new Uint8Array(256 * 3);
  const l0 = points[0][0];
  const l1 = points[points.length - 1][0];
  for (let i = 0; i < 256; i++) {
    const l = l0 + ((l1 - l0) * i) / 255;
    let s = 0;
    while (s < points.length - 2 && l > points[s + 1][0]) s++;
    const [p, q] = [points[s], points[s + 1]];
    const u = (l - p[0]) / (q[0] - p[0]);
    const rgb = labToSrgb([l, p[1] + u * (q[1] - p[1]), p[2] + u * (q[2] - p[2])]);
    lut.set(rgb, i * 3);
  }
  return lut;
}

const cache = new Map<ColourScaleName, Uint8Array>();

/** 256 × [r, g, b], entry 0 for the floor of the range, 255 for its top. */
export function colourLut(name: ColourScaleName): Uint8Array {
  let lut = cache.get(name);
  if (!lut) {
    lut = buildLut(CONTROL_POINTS[name]);
    cache.set(name, lut);
  }
  return lut;
}

export const lutCss = (lut: Uint8Array, i: number) => `rgb(${lut[i * 3]} ${lut[i * 3 + 1]} ${lut[i * 3 + 2]})`;

export const isColourScale = (name: string): name is ColourScaleName =>
  (colourScaleNames as readonly string[]).includes(name);

/** The view's scale, or the first one when the view names a scale this client does not have. */
export const scaleOrDefault = (name: string): ColourScaleName => (isColourScale(name) ? name : colourScaleNames[0]);

let diverging: Uint8Array | null = null;

/**
 * A diverging scale for level differences, centred on entry 128 (0 dB): a dark neutral there, rising in
 * lightness evenly to a cool blue at entry 0 (quieter) and a warm amber at 255 (louder), so the size of a
 * difference reads the same on either side (the same CIELAB construction as the other scales, ours).
 */
export function divergingLut(): Uint8Array {
  if (diverging) return diverging;
  const centre: Lab = [22, 0, 0];
  const cool: Lab = [86, -18, -42];
  const warm: Lab = [86, 22, 72];
  const lut = new Uint8Array(256 * 3);
  for (let i = 0; i < 256; i++) {
    const u = Math.abs(i - 127.5) / 127.5;
    const end = i < 128 ? cool : warm;
    lut.set(labToSrgb([centre[0] + u * (end[0] - centre[0]), u * end[1], u * end[2]]), i * 3);
  }
  diverging = lut;
  return lut;
}
