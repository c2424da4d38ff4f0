import type { Viewport } from '../map/viewport';
import { createStore, type Store } from './store';

/** What lies under the pointer (on the map, or at the x of a plot in the dock). */
export interface BenchPointer {
  /** Along the map's x: time (s) or speed (rpm) */
  x: number;
  /** Frequency, Hz (NaN when the pointer is on a plot that has none) */
  f: number;
  timeS: number;
  rpm: number;
  levelDb: number;
  /** The time frame under the pointer (the nearest at that speed against speed) */
  frame: number;
  /** The map's column (frame, or rpm bin) */
  column: number;
  from: 'map' | 'plot';
}

export interface BenchStores {
  viewport: Store<Viewport | null>;
  pointer: Store<BenchPointer | null>;
}

export const createBenchStores = (): BenchStores => ({ viewport: createStore<Viewport | null>(null), pointer: createStore<BenchPointer | null>(null) });
