import { useCallback, useEffect, useRef, useState } from 'react';
import type { StftLayout, StftSettings } from '../../../../workers/dsp/stft';
import type { Weighting } from '../../../../workers/dsp/weighting';
import { startMap, type MapJob } from '../../../lib/workers/analysis-pool';
import { MapRaster } from '../map/map-raster';

export interface MapRequest {
  samples: Float32Array | null;
  fsHz: number;
  settings: StftSettings;
  weighting: Weighting;
  /** Calibration, units per file unit */
  scale: number;
  refRms: number;
}

export type MapStatus =
  | { kind: 'idle' }
  | { kind: 'computing'; fraction: number }
  | { kind: 'done' }
  | { kind: 'cancelled'; fraction: number }
  | { kind: 'error'; message: string };

/**
 * Computes the map of a request in the analysis pool whenever the request changes (cancelling the one
 * running). The levels land in a MapRaster, which tells its subscribers (the canvas) about each chunk;
 * React hears only the status, the progress and the highest level (rounded up to 5 dB).
 */
export function useMapComputation(req: MapRequest) {
  const [raster, setRaster] = useState<MapRaster | null>(null);
  const [status, setStatus] = useState<MapStatus>({ kind: 'idle' });
  const [peakTopDb, setPeakTopDb] = useState<number | null>(null);
  const [layout, setLayout] = useState<StftLayout | null>(null);
  const [run, setRun] = useState(0);
  const job = useRef<MapJob | null>(null);
  const fraction = useRef(0);

  const { samples, fsHz, weighting, scale, refRms } = req;
  const { blockSize, overlap, window } = req.settings;

  useEffect(() => {
    if (!samples) return;
    let current: MapJob;
    let r: MapRaster | null = null;
    fraction.current = 0;
    try {
      current = startMap(
        samples,
        fsHz,
        { blockSize, overlap, window },
        (from, to, power) => {
          if (!r) return;
          r.add(from, to, power);
          const top = Number.isFinite(r.maxDb) ? Math.ceil(r.maxDb / 5) * 5 : null;
          setPeakTopDb((t) => (t === top ? t : top));
        },
        (f) => {
          fraction.current = f;
          setStatus((s) => (s.kind === 'computing' ? { kind: 'computing', fraction: f } : s));
        },
        { scale },
      );
    } catch (e) {
      setRaster(null);
      setLayout(null);
      setStatus({ kind: 'error', message: e instanceof Error ? e.message : String(e) });
      return;
    }
    job.current = current;
    r = current.layout.frames > 0 ? new MapRaster(current.layout, weighting, refRms) : null;
    setRaster(r);
    setLayout(current.layout);
    setPeakTopDb(null);
    setStatus({ kind: 'computing', fraction: 0 });
    current.done.then(
      () => job.current === current && setStatus({ kind: 'done' }),
      (e: unknown) => {
        if (job.current !== current) return;
        if (e instanceof Error && e.name === 'AbortError') setStatus({ kind: 'cancelled', fraction: fraction.current });
        else setStatus({ kind: 'error', message: e instanceof Error ? e.message : String(e) });
      },
    );
    return () => {
      if (job.current === current) job.current = null;
      current.cancel();
    };
  }, [samples, fsHz, blockSize, overlap, window, weighting, scale, refRms, run]);

  const cancel = useCallback(() => job.current?.cancel(), []);
  const restart = useCallback(() => setRun((n) => n + 1), []);

  return { raster, layout, status, peakTopDb, cancel, restart };
}
