/**
 * The painted map kept at full resolution, with shrunk copies: the base has one pixel per raster cell
 * (up to MAX_WIDTH columns); a copy (kx, ky) is the maximum over blocks of 2^kx × 2^ky base pixels,
 * made the first time a view needs it. A view is drawn from the copy nearest the screen's resolution
 * along each axis, so a narrow tone never falls between sampled rows however far the map is shrunk.
 * Pixels hold colour indices (0 = not computed yet, 1…256 = lookup entry + 1), so another colour scale
 * recolours without reading the levels again. Pan and zoom only draw a source rectangle (drawImage).
 */
import type { LevelColumns } from './map-raster';

/** Image columns at most: a longer map pools columns by their maximum (a zoomed-in view draws its part). */
export const MAX_WIDTH = 4096;

interface Level {
  kx: number;
  ky: number;
  width: number;
  height: number;
  index: Uint16Array;
  image: ImageData;
  canvas: HTMLCanvasElement;
  dirty: [number, number] | null;
}

/** Colour indices of base pixel columns [x0, x1): each pixel the maximum of the cells it covers. */
function paintIndices(raster: LevelColumns, out: Uint16Array, width: number, height: number, topDb: number, rangeDb: number, x0: number, x1: number) {
  const { columns, rows, levels, columnsDone } = raster;
  const floorDb = topDb - rangeDb;
  const scale = 255 / rangeDb;
  const column = new Float32Array(rows);
  for (let x = x0; x < x1; x++) {
    const c0 = Math.floor((x * columns) / width);
    const c1 = Math.max(c0 + 1, Math.floor(((x + 1) * columns) / width));
    if (c0 >= columnsDone) {
      for (let y = 0; y < height; y++) out[y * width + x] = 0;
      continue;
    }
    column.fill(-Infinity);
    for (let c = c0; c < c1; c++) {
      const at = c * rows;
      for (let r = 0; r < rows; r++) if (levels[at + r] > column[r]) column[r] = levels[at + r];
    }
    for (let y = 0; y < height; y++) {
      // row 0 of the image is the top (highest frequency)
      const r1 = rows - Math.floor((y * rows) / height);
      const r0 = Math.min(r1 - 1, rows - Math.floor(((y + 1) * rows) / height));
      let m = -Infinity;
      for (let r = r0; r < r1; r++) if (column[r] > m) m = column[r];
      const i = m === -Infinity ? 0 : Math.min(255, Math.max(0, Math.round((m - floorDb) * scale)));
      out[y * width + x] = i + 1;
    }
  }
}

export class MapImage {
  private readonly base: Uint16Array;
  readonly width: number;
  readonly height: number;
  private readonly levels = new Map<string, Level>();

  constructor(
    readonly raster: LevelColumns,
    private lut: Uint8Array,
    private topDb: number,
    private rangeDb: number,
  ) {
    this.width = Math.min(raster.columns, MAX_WIDTH);
    this.height = raster.rows;
    this.base = new Uint16Array(this.width * this.height);
    paintIndices(raster, this.base, this.width, this.height, topDb, rangeDb, 0, this.width);
  }

  /** Raster columns [c0, c1) changed (a chunk arrived). */
  paintColumns(c0: number, c1: number) {
    const x0 = Math.floor((c0 * this.width) / this.raster.columns);
    const x1 = Math.min(this.width, Math.ceil((c1 * this.width) / this.raster.columns));
    if (x1 <= x0) return;
    paintIndices(this.raster, this.base, this.width, this.height, this.topDb, this.rangeDb, x0, x1);
    for (const level of this.levels.values()) this.update(level, x0, x1);
  }

  /** Another colour scale: the indices stay, the colours change. */
  setLut(lut: Uint8Array) {
    if (lut === this.lut) return;
    this.lut = lut;
    for (const level of this.levels.values()) {
      this.colourise(level, 0, level.width);
      this.markDirty(level, 0, level.width);
    }
  }

  /** Another level range: the indices are taken again from the levels. */
  setRange(topDb: number, rangeDb: number) {
    if (topDb === this.topDb && rangeDb === this.rangeDb) return;
    this.topDb = topDb;
    this.rangeDb = rangeDb;
    paintIndices(this.raster, this.base, this.width, this.height, topDb, rangeDb, 0, this.width);
    for (const level of this.levels.values()) this.update(level, 0, this.width);
  }

  /**
   * The copy to draw a source of (sw × sh) base pixels onto (dw × dh) screen pixels from, with its
   * shrink factors; its changed columns are copied to its canvas first.
   */
  levelFor(sw: number, sh: number, dw: number, dh: number): { canvas: HTMLCanvasElement; sx: number; sy: number } {
    const k = (s: number, d: number, n: number) => Math.max(0, Math.min(Math.floor(Math.log2(n)), Math.floor(Math.log2(Math.max(1, s / Math.max(1, d))))));
    const level = this.level(k(sw, dw, this.width), k(sh, dh, this.height));
    if (level.dirty) {
      const [x0, x1] = level.dirty;
      level.dirty = null;
      level.canvas.getContext('2d')!.putImageData(level.image, 0, 0, x0, 0, x1 - x0, level.height);
    }
    return { canvas: level.canvas, sx: 2 ** level.kx, sy: 2 ** level.ky };
  }

  private level(kx: number, ky: number): Level {
    const key = `${kx}:${ky}`;
    let level = this.levels.get(key);
    if (!level) {
      const width = Math.ceil(this.width / 2 ** kx);
      const height = Math.ceil(this.height / 2 ** ky);
      const canvas = document.createElement('canvas');
      canvas.width = width;
      canvas.height = height;
      level = { kx, ky, width, height, index: new Uint16Array(width * height), image: new ImageData(width, height), canvas, dirty: null };
      this.levels.set(key, level);
      this.update(level, 0, this.width);
    }
    return level;
  }

  /** Base columns [x0, x1) changed: the level's columns over them, pooled and coloured again. */
  private update(level: Level, x0: number, x1: number) {
    const bx = 2 ** level.kx;
    const by = 2 ** level.ky;
    const lx0 = Math.floor(x0 / bx);
    const lx1 = Math.min(level.width, Math.ceil(x1 / bx));
    const { base, width: W, height: H } = this;
    for (let y = 0; y < level.height; y++) {
      const ya = y * by;
      const yb = Math.min(H, ya + by);
      for (let x = lx0; x < lx1; x++) {
        const xa = x * bx;
        const xb = Math.min(W, xa + bx);
        let m = 0;
        for (let yy = ya; yy < yb; yy++) {
          const row = yy * W;
          for (let xx = xa; xx < xb; xx++) if (base[row + xx] > m) m = base[row + xx];
        }
        level.index[y * level.width + x] = m;
      }
    }
    this.colourise(level, lx0, lx1);
    this.markDirty(level, lx0, lx1);
  }

  private colourise(level: Level, x0: number, x1: number) {
    const { width, height, index } = level;
    const d = level.image.data;
    const lut = this.lut;
    for (let y = 0; y < height; y++) {
      for (let x = x0; x < x1; x++) {
        const p = y * width + x;
        const v = index[p];
        const q = p * 4;
        if (v === 0) {
          d[q + 3] = 0;
          continue;
        }
        const l = (v - 1) * 3;
        d[q] = lut[l];
        d[q + 1] = lut[l + 1];
        d[q + 2] = lut[l + 2];
        d[q + 3] = 255;
      }
    }
  }

  private markDirty(level: Level, x0: number, x1: number) {
    level.dirty = level.dirty ? [Math.min(level.dirty[0], x0), Math.max(level.dirty[1], x1)] : [x0, x1];
  }
}
