/**
 * The levels of one map, kept at the map's own resolution: one column per STFT frame (frames are
 * grouped by their maximum beyond MAX_COLUMNS, which no screen shows one by one), one row per bin up
 * to MAX_ROWS and the maximum over groups of neighbouring bins beyond, so a narrow tone never drops
 * out. Levels are L = 10·lg(P·G(f)/ref²) in dB, P the mean square per bin, G the weighting's power
 * gain (IEC 61672-1 via weightingGainsPower), ref the level reference (ISO 1683). No DOM here.
 */
import type { StftLayout } from '../../../../workers/dsp/stft';
import { weightingGainsPower, type Weighting } from '../../../../workers/dsp/weighting';

/**
 * The grid a map's levels come on: one input column per step along x (a frame of the STFT against time,
 * an rpm bin against speed), one row per frequency bin.
 */
export interface RasterGrid {
  /** Input columns */
  columns: number;
  /** x of column 0's centre, and the step between columns (s against time, rpm against speed) */
  x0: number;
  xStep: number;
  bins: number;
  binHz: number;
}

/** The grid of an STFT's frames against time. */
export const timeGrid = (l: StftLayout): RasterGrid => ({ columns: l.frames, x0: l.t0S, xStep: l.hopS, bins: l.bins, binHz: l.binHz });

export const MAX_ROWS = 2048;
export const MAX_COLUMNS = 16384;

export type RasterListener = (fromColumn: number, toColumn: number) => void;

/** What a painted map image is made from: columns of levels along x (a MapRaster, or part of one). */
export interface LevelColumns {
  readonly columns: number;
  readonly rows: number;
  /** Column-major: levels[c·rows + r] */
  readonly levels: Float32Array;
  readonly columnsDone: number;
  readonly xSpan: [number, number];
  readonly frequencySpanHz: [number, number];
}

/**
 * Columns [c0, c1) of a raster, sharing its levels: the part of a long map a zoomed-in view shows, to be
 * drawn one image pixel per column where the whole map's image pools several.
 */
export function rasterPart(r: MapRaster, c0: number, c1: number): LevelColumns {
  const [x0, x1] = r.xSpan;
  const width = (x1 - x0) / r.columns;
  return {
    columns: c1 - c0,
    rows: r.rows,
    levels: r.levels.subarray(c0 * r.rows, c1 * r.rows),
    columnsDone: Math.max(0, Math.min(c1, r.columnsDone) - c0),
    xSpan: [x0 + c0 * width, x0 + c1 * width],
    frequencySpanHz: r.frequencySpanHz,
  };
}

export class MapRaster {
  readonly columns: number;
  readonly rows: number;
  /** Frames per column, bins per row */
  readonly framesPerColumn: number;
  readonly binsPerRow: number;
  /** Column-major: levels[c·rows + r], −Infinity where nothing is known yet */
  readonly levels: Float32Array;
  /** Columns computed so far (from the left) */
  columnsDone = 0;
  /** The highest level above DC so far, dB */
  maxDb = -Infinity;
  private readonly factor: Float64Array;
  private readonly listeners = new Set<RasterListener>();

  constructor(
    readonly grid: RasterGrid,
    weighting: Weighting,
    readonly refRms: number,
  ) {
    this.framesPerColumn = Math.max(1, Math.ceil(grid.columns / MAX_COLUMNS));
    this.binsPerRow = Math.max(1, Math.ceil(grid.bins / MAX_ROWS));
    this.columns = Math.ceil(grid.columns / this.framesPerColumn);
    this.rows = Math.ceil(grid.bins / this.binsPerRow);
    this.levels = new Float32Array(this.columns * this.rows).fill(-Infinity);
    const freqHz = new Float64Array(grid.bins);
    for (let k = 0; k < grid.bins; k++) freqHz[k] = k * grid.binHz;
    const gains = weightingGainsPower(weighting, freqHz);
    this.factor = new Float64Array(grid.bins);
    const invRef2 = 1 / (refRms * refRms);
    for (let k = 0; k < grid.bins; k++) this.factor[k] = gains[k] * invRef2;
  }

  /** Takes frames [from, to) of mean-square powers ((to − from) × bins) and tells the listeners. */
  add(from: number, to: number, power: Float32Array) {
    const { bins } = this.grid;
    const { rows, binsPerRow, framesPerColumn, factor, levels } = this;
    let peak = 0;
    for (let f = from; f < to; f++) {
      const at = (f - from) * bins;
      const col = Math.floor(f / framesPerColumn) * rows;
      for (let r = 0; r < rows; r++) {
        const k1 = Math.min(bins, (r + 1) * binsPerRow);
        let m = 0;
        for (let k = r * binsPerRow; k < k1; k++) {
          const v = power[at + k] * factor[k];
          if (v > m) m = v;
          if (k > 0 && v > peak) peak = v;
        }
        const db = m > 0 ? 10 * Math.log10(m) : -Infinity;
        if (db > levels[col + r]) levels[col + r] = db;
      }
    }
    if (peak > 0) this.maxDb = Math.max(this.maxDb, 10 * Math.log10(peak));
    const c0 = Math.floor(from / framesPerColumn);
    const c1 = Math.ceil(to / framesPerColumn);
    this.columnsDone = Math.max(this.columnsDone, to === this.grid.columns ? this.columns : Math.floor(to / framesPerColumn));
    for (const l of this.listeners) l(c0, c1);
  }

  subscribe(listener: RasterListener): () => void {
    this.listeners.add(listener);
    return () => this.listeners.delete(listener);
  }

  /** x of the left edge of column 0 and the right edge of the last column (s, or rpm) */
  get xSpan(): [number, number] {
    const { x0, xStep } = this.grid;
    return [x0 - xStep / 2, x0 + (this.columns * this.framesPerColumn - 0.5) * xStep];
  }

  /** Frequency of the bottom edge of row 0 and the top edge of the last row, Hz */
  get frequencySpanHz(): [number, number] {
    const { binHz } = this.grid;
    return [-binHz / 2, (this.rows * this.binsPerRow - 0.5) * binHz];
  }

  /**
   * What lies under a point given as fractions of the map's width and height (y up): the x of the
   * input column (time or speed), the frequency of the bin and the level of its cell, or null off the
   * map or where nothing is computed yet.
   */
  probe(fx: number, fy: number): { x: number; frequencyHz: number; levelDb: number } | null {
    if (!(fx >= 0 && fx < 1 && fy >= 0 && fy < 1)) return null;
    const u = fx * this.columns;
    const c = Math.min(this.columns - 1, Math.floor(u));
    const [f0, f1] = this.frequencySpanHz;
    const bin = Math.min(this.grid.bins - 1, Math.max(0, Math.round((f0 + fy * (f1 - f0)) / this.grid.binHz)));
    const r = Math.floor(bin / this.binsPerRow);
    const levelDb = this.levels[c * this.rows + r];
    if (levelDb === -Infinity && c >= this.columnsDone) return null;
    const column = Math.min(this.grid.columns - 1, Math.floor(u * this.framesPerColumn));
    return { x: this.grid.x0 + column * this.grid.xStep, frequencyHz: bin * this.grid.binHz, levelDb };
  }
}
