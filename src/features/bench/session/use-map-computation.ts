import { useCallback, useEffect, useRef, useState } from 'react';
import type { StftLayout, StftSettings } from '../../../../workers/dsp/stft';
import type { Weighting } from '../../../../workers/dsp/weighting';
import { startMap, type MapJob, type SampleFill } from '../../../lib/workers/analysis-pool';
import { MapRaster, timeGrid } from '../map/map-raster';
import { errorMessage } from '../../../lib/error-message';

export interface MapRequest {
  samples: Float32Array | null;
  fsHz: number;
  settings: StftSettings;
  weighting: Weighting;
  /** Calibration, units per file unit */
  scale: number;
  refRms: number;
  /** The samples are still being read into `samples`: columns are computed as they allow. */
  filling?: SampleFill;
}

export type MapStatus =
  | { kind: 'idle' }
  | { kind: 'computing'; fraction: number }
  /** engine: the FFT routes that computed it, for the status line */
  | { kind: 'done'; engine: string }
  | { kind: 'cancelled'; fraction: number }
  | { kind: 'error'; message: string };

const PROGRESS_EVERY_MS = 150;

/**
 * The map's mean squares: in shared memory when the page is cross-origin isolated (the server sends the
 * headers), so the analysis workers read the one copy; else in the page's own memory (each task copies).
 */
function powerArray(length: number): Float32Array {
  return globalThis.crossOriginIsolated && typeof SharedArrayBuffer !== 'undefined' ? new Float32Array(new SharedArrayBuffer(length * 4)) : new Float32Array(length);
}

/** Beyond this the mean squares are not kept (only the painted levels): tracks and findings need them. */
const MAX_POWER_BYTES = 768 * 1024 * 1024;

/**
 * The mean squares of one map, frames × bins, calibrated and unweighted, filled as chunks arrive.
 * One object per computation, so a consumer can tell a new map from the old.
 */
export interface MapPower {
  layout: StftLayout;
  power: Float32Array;
  /** Frames filled so far, from the left */
  frames: number;
}

/**
 * Computes the map of a request in the analysis pool whenever the request changes (cancelling the one
 * running). The levels land in a MapRaster, which tells its subscribers (the canvas) about each chunk;
 * the mean squares are kept for tracks, slices and findings. React hears only the status, the progress
 * and the highest level (rounded up to 5 dB).
 */
export function useMapComputation(req: MapRequest) {
  const [raster, setRaster] = useState<MapRaster | null>(null);
  const [status, setStatus] = useState<MapStatus>({ kind: 'idle' });
  const [peakTopDb, setPeakTopDb] = useState<number | null>(null);
  const [layout, setLayout] = useState<StftLayout | null>(null);
  const [power, setPower] = useState<MapPower | null>(null);
  const [run, setRun] = useState(0);
  const job = useRef<MapJob | null>(null);
  const fraction = useRef(0);
  // read when a computation starts; the end of the filling (same samples) must not start another
  const filling = useRef(req.filling);
  filling.current = req.filling;

  const { samples, fsHz, weighting, scale, refRms } = req;
  const { blockSize, overlap, window } = req.settings;

  useEffect(() => {
    if (!samples) return;
    let current: MapJob;
    let r: MapRaster | null = null;
    let store: MapPower | null = null;
    fraction.current = 0;
    let shownAt = -Infinity;
    let first = true;
    performance.mark('fanlight:map-start');
    try {
      current = startMap(
        samples,
        fsHz,
        { blockSize, overlap, window },
        (from, to, chunk) => {
          if (first) performance.mark('fanlight:map-first-chunk');
          first = false;
          if (store) {
            store.power.set(chunk, from * store.layout.bins);
            store.frames = to;
          }
          if (!r) return;
          r.add(from, to, chunk);
          const top = Number.isFinite(r.maxDb) ? Math.ceil(r.maxDb / 5) * 5 : null;
          setPeakTopDb((t) => (t === top ? t : top));
        },
        (f) => {
          fraction.current = f;
          // The page re-renders for the bar a few times a second, not for every chunk.
          const now = performance.now();
          if (now - shownAt < PROGRESS_EVERY_MS && f < 1) return;
          shownAt = now;
          setStatus((s) => (s.kind === 'computing' ? { kind: 'computing', fraction: f } : s));
        },
        { scale, filling: filling.current },
      );
    } catch (e) {
      setRaster(null);
      setLayout(null);
      setPower(null);
      setStatus({ kind: 'error', message: errorMessage(e) });
      return;
    }
    job.current = current;
    const l = current.layout;
    r = l.frames > 0 ? new MapRaster(timeGrid(l), weighting, refRms) : null;
    store = l.frames > 0 && l.frames * l.bins * 4 <= MAX_POWER_BYTES ? { layout: l, power: powerArray(l.frames * l.bins), frames: 0 } : null;
    setRaster(r);
    setLayout(l);
    setPower(store);
    setPeakTopDb(null);
    setStatus({ kind: 'computing', fraction: 0 });
    current.done.then(
      () => {
        performance.mark('fanlight:map-computed');
        if (job.current === current) setStatus({ kind: 'done', engine: [...current.engines].join(' ') });
      },
      (e: unknown) => {
        if (job.current !== current) return;
        if (e instanceof Error && e.name === 'AbortError') setStatus({ kind: 'cancelled', fraction: fraction.current });
        else setStatus({ kind: 'error', message: errorMessage(e) });
      },
    );
    return () => {
      if (job.current === current) job.current = null;
      current.cancel();
    };
  }, [samples, fsHz, blockSize, overlap, window, weighting, scale, refRms, run]);

  const cancel = useCallback(() => job.current?.cancel(), []);
  const restart = useCallback(() => setRun((n) => n + 1), []);

  return { raster, layout, status, peakTopDb, power, cancel, restart };
}
