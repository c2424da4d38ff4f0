import { useEffect, useRef } from 'react';
import type uPlot from 'uplot';
import { frameAtRpm } from '../analysis/spectra';
import type { BenchPointer, BenchStores } from '../session/live-stores';

/**
 * The plot's cursor follows the map's pointer; the plot's own cursor shows on the map as a line.
 * Returns the callback to hand the chart to.
 */
export function useCursorSync(stores: BenchStores, against: 'time' | 'speed', frameTimes: Float64Array | null, frameRpm: Float64Array | null) {
  const chart = useRef<uPlot | null>(null);
  const ctx = useRef({ against, frameTimes, frameRpm });
  ctx.current = { against, frameTimes, frameRpm };

  useEffect(() => {
    const follow = () => {
      const u = chart.current;
      const ptr = stores.pointer.get();
      if (!u || (ptr && ptr.from !== 'map')) return;
      const x = ptr ? (ctx.current.against === 'time' ? ptr.timeS : ptr.rpm) : NaN;
      if (!Number.isFinite(x)) u.setCursor({ left: -10, top: -10 }, false);
      else u.setCursor({ left: u.valToPos(x, 'x'), top: u.over.clientHeight / 2 }, false);
    };
    return stores.pointer.subscribe(follow);
  }, [stores]);

  return (u: uPlot | null) => {
    chart.current = u;
    if (!u) return;
    let raf = 0;
    const onMove = () => {
      const { against: a, frameTimes: times, frameRpm: rpm } = ctx.current;
      const left = u.cursor.left ?? -1;
      if (!times || times.length === 0 || left < 0) return;
      const x = u.posToVal(left, 'x');
      const frame =
        a === 'time'
          ? Math.max(0, Math.min(times.length - 1, Math.round(((x - times[0]) / ((times[times.length - 1] - times[0]) / Math.max(1, times.length - 1) || 1)))))
          : rpm
            ? frameAtRpm(rpm, x)
            : 0;
      const ptr: BenchPointer = { x, f: NaN, timeS: times[frame], rpm: rpm?.[frame] ?? NaN, levelDb: NaN, frame, column: frame, from: 'plot' };
      stores.pointer.set(ptr);
    };
    u.over.addEventListener('mousemove', () => {
      cancelAnimationFrame(raf);
      raf = requestAnimationFrame(onMove);
    });
    u.over.addEventListener('mouseleave', () => {
      cancelAnimationFrame(raf);
      if (stores.pointer.get()?.from === 'plot') stores.pointer.set(null);
    });
  };
}

