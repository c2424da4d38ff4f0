/** Turns the snapshot's level bytes into pixels through a colour scale's lookup table. No DOM. */

/**
 * RGBA pixels, top row first. The snapshot stores row 0 at the y axis's `from` end (the bottom of the
 * picture), so its rows are written bottom up.
 */
export function mapPixels(map: Uint8Array, width: number, height: number, lut: Uint8Array): Uint8ClampedArray<ArrayBuffer> {
  const out = new Uint8ClampedArray(width * height * 4);
  for (let row = 0; row < height; row++) {
    const src = row * width;
    const dst = (height - 1 - row) * width * 4;
    for (let col = 0; col < width; col++) {
      const v = map[src + col] * 3;
      const o = dst + col * 4;
      out[o] = lut[v];
      out[o + 1] = lut[v + 1];
      out[o + 2] = lut[v + 2];
      out[o + 3] = 255;
    }
  }
  return out;
}

/** The byte under a point given as fractions of the x and y axes, or null outside the map. */
export function byteAt(map: Uint8Array, width: number, height: number, fx: number, fy: number): number | null {
  if (!(fx >= 0 && fx <= 1 && fy >= 0 && fy <= 1)) return null;
  const col = Math.min(width - 1, Math.floor(fx * width));
  const row = Math.min(height - 1, Math.floor(fy * height));
  return map[row * width + col];
}
